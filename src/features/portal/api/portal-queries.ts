import { infiniteQueryOptions, queryOptions } from '@tanstack/react-query'
import { OrderDetailSchema, OrderListSchema } from '#shared/schemas/order.ts'
import { apiClient } from '#src/lib/api-client.ts'

/** The customer's own orders (the server filters by the signed-in customer; other ids answer 404). */
export const portalQueries = {
  all: () => ['portal'] as const,
  orders: () =>
    infiniteQueryOptions({
      queryKey: [...portalQueries.all(), 'orders'],
      queryFn: ({ pageParam, signal }) => apiClient.get('/api/orders', OrderListSchema, { query: { limit: 20, cursor: pageParam }, signal }),
      initialPageParam: undefined as string | undefined,
      getNextPageParam: (last) => last.nextCursor ?? undefined,
    }),
  order: (id: number) =>
    queryOptions({
      queryKey: [...portalQueries.all(), 'order', id],
      queryFn: ({ signal }) => apiClient.get(`/api/orders/${id}`, OrderDetailSchema, { signal }),
    }),
}
