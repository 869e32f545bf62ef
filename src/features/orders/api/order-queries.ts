import { queryOptions } from '@tanstack/react-query'
import { CustomerListSchema } from '#shared/schemas/customer.ts'
import { OrderDetailSchema, OrderListSchema, OrderQueueCountsSchema, type OrderSort } from '#shared/schemas/order.ts'
import { PriceBookSchema } from '#shared/schemas/pricing.ts'
import { apiClient } from '#src/lib/api-client.ts'

/** The query of GET /api/orders as the client sends it (status: comma-separated). */
export interface OrderFilters {
  status?: string
  customerId?: number
  q?: string
  sort?: OrderSort
  cursor?: string
  limit?: number
}

export const orderQueries = {
  all: () => ['orders'] as const,
  lists: () => [...orderQueries.all(), 'list'] as const,
  list: (filters: OrderFilters) =>
    queryOptions({
      queryKey: [...orderQueries.lists(), filters],
      queryFn: ({ signal }) => apiClient.get('/api/orders', OrderListSchema, { query: { ...filters }, signal }),
    }),
  counts: () =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'counts'],
      queryFn: ({ signal }) => apiClient.get('/api/orders/counts', OrderQueueCountsSchema, { signal }),
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'detail', id],
      queryFn: ({ signal }) => apiClient.get(`/api/orders/${id}`, OrderDetailSchema, { signal }),
    }),
  /** the price book, for pricing the quote in the browser as it is typed (the server re-prices on save) */
  priceBook: () =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'price-book'],
      queryFn: ({ signal }) => apiClient.get('/api/prices', PriceBookSchema, { signal }),
      staleTime: 0,
    }),
  /** customers to choose from on the quote screen */
  customers: () =>
    queryOptions({
      queryKey: [...orderQueries.all(), 'customers'],
      queryFn: ({ signal }) => apiClient.get('/api/customers', CustomerListSchema, { signal }),
    }),
}
