import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type PriceEntryInput, PriceEntrySchema } from '#shared/schemas/pricing.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { priceQueries } from './price-queries.ts'

/** Adds a price-book line (no id) or changes one. */
export function useSavePrice() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, input }: { id: number | null; input: PriceEntryInput }) =>
      id === null ? apiClient.post('/api/prices', PriceEntrySchema, input) : apiClient.put(`/api/prices/${id}`, PriceEntrySchema, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: priceQueries.all() }),
  })
}
