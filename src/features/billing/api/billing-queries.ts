import { queryOptions } from '@tanstack/react-query'
import { type InvoiceListQuery, InvoiceListSchema, InvoiceSchema, ReadyToInvoiceListSchema } from '#shared/schemas/billing.ts'
import { apiClient } from '#src/lib/api-client.ts'

export const billingQueries = {
  all: () => ['billing'] as const,
  lists: () => [...billingQueries.all(), 'list'] as const,
  list: (query: InvoiceListQuery = {}) =>
    queryOptions({
      queryKey: [...billingQueries.lists(), query],
      queryFn: ({ signal }) => apiClient.get('/api/invoices', InvoiceListSchema, { query: { ...query }, signal }),
    }),
  ready: () =>
    queryOptions({
      queryKey: [...billingQueries.all(), 'ready'],
      queryFn: ({ signal }) => apiClient.get('/api/invoices/ready', ReadyToInvoiceListSchema, { signal }),
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: [...billingQueries.all(), 'detail', id],
      queryFn: ({ signal }) => apiClient.get(`/api/invoices/${id}`, InvoiceSchema, { signal }),
    }),
}
