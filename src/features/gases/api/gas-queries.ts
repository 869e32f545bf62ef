import { queryOptions } from '@tanstack/react-query'
import { GasListSchema } from '#shared/schemas/gas.ts'
import { apiClient } from '#src/lib/api-client.ts'

export const gasQueries = {
  all: () => ['gases'] as const,
  list: () =>
    queryOptions({
      queryKey: [...gasQueries.all(), 'list'],
      queryFn: ({ signal }) => apiClient.get('/api/gases', GasListSchema, { signal }),
      // the library is constant for a running server
      staleTime: 60 * 60_000,
    }),
}
