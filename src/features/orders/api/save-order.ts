import { useMutation, useQueryClient } from '@tanstack/react-query'
import { OrderDetailSchema, type OrderInput } from '#shared/schemas/order.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { orderQueries } from './order-queries.ts'

/** Saves a specification: creates a draft (no id) or replaces a draft's header and lines (with its version). */
export function useSaveOrder() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, version, input }: { id: number | null; version?: number; input: OrderInput }) =>
      id === null ? apiClient.post('/api/orders', OrderDetailSchema, input) : apiClient.put(`/api/orders/${id}`, OrderDetailSchema, { ...input, version }),
    onSuccess: (order) => {
      qc.setQueryData(orderQueries.detail(order.id).queryKey, order)
      void qc.invalidateQueries({ queryKey: orderQueries.lists() })
      void qc.invalidateQueries({ queryKey: orderQueries.counts().queryKey })
    },
  })
}
