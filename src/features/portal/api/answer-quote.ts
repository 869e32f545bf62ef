import { useMutation, useQueryClient } from '@tanstack/react-query'
import { OrderDetailSchema } from '#shared/schemas/order.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { portalQueries } from './portal-queries.ts'

/** The customer accepts a quote (or cancels it). */
export function useAnswerQuote() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, to, version }: { id: number; to: 'accepted' | 'cancelled'; version: number }) =>
      apiClient.post(`/api/orders/${id}/transition`, OrderDetailSchema, { to, version }),
    onSuccess: (order) => {
      qc.setQueryData(portalQueries.order(order.id).queryKey, order)
      void qc.invalidateQueries({ queryKey: portalQueries.orders().queryKey })
    },
  })
}
