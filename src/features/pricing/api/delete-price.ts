import { useMutation, useQueryClient } from '@tanstack/react-query'
import { apiClient } from '#src/lib/api-client.ts'
import { priceQueries } from './price-queries.ts'

export function useDeletePrice() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (id: number) => apiClient.delete(`/api/prices/${id}`, null),
    onSuccess: () => qc.invalidateQueries({ queryKey: priceQueries.all() }),
  })
}
