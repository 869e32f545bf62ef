import { queryOptions } from '@tanstack/react-query'
import { CustomerListSchema, CustomerSchema } from '#shared/schemas/customer.ts'
import { apiClient } from '#src/lib/api-client.ts'

export const customerQueries = {
  all: () => ['customers'] as const,
  lists: () => [...customerQueries.all(), 'list'] as const,
  list: (q = '') =>
    queryOptions({
      queryKey: [...customerQueries.lists(), { q }],
      queryFn: ({ signal }) => apiClient.get('/api/customers', CustomerListSchema, { query: { q }, signal }),
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: [...customerQueries.all(), 'detail', id],
      queryFn: ({ signal }) => apiClient.get(`/api/customers/${id}`, CustomerSchema, { signal }),
    }),
}
