import { useMutation, useQueryClient } from '@tanstack/react-query'
import { OrderDetailSchema } from '#shared/schemas/order.ts'
import type { OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { orderQueries } from './order-queries.ts'

/** Moves an order to its next state ("quoted" also e-mails the quote). */
export function useTransitionOrder() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, to, version }: { id: number; to: OrderStatus; version?: number }) =>
      apiClient.post(`/api/orders/${id}/transition`, OrderDetailSchema, { to, version }),
    onSuccess: (order) => {
      qc.setQueryData(orderQueries.detail(order.id).queryKey, order)
      void qc.invalidateQueries({ queryKey: orderQueries.lists() })
      void qc.invalidateQueries({ queryKey: orderQueries.counts().queryKey })
    },
  })
}
