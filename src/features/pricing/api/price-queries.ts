import { queryOptions } from '@tanstack/react-query'
import { PriceBookSchema } from '#shared/schemas/pricing.ts'
import { apiClient } from '#src/lib/api-client.ts'

export const priceQueries = {
  all: () => ['prices'] as const,
  book: () =>
    queryOptions({
      queryKey: [...priceQueries.all(), 'book'],
      queryFn: ({ signal }) => apiClient.get('/api/prices', PriceBookSchema, { signal }),
    }),
}
