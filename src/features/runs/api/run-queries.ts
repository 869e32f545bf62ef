import { queryOptions } from '@tanstack/react-query'
import { RunDetailSchema, RunSummaryListSchema, RunSummarySchema } from '#shared/schemas/run.ts'
import { apiClient } from '#src/lib/api-client.ts'

export const runQueries = {
  all: () => ['runs'] as const,
  mine: (date?: string) =>
    queryOptions({
      queryKey: [...runQueries.all(), 'mine', date ?? 'today'],
      queryFn: ({ signal }) => apiClient.get('/api/runs/mine', RunSummaryListSchema, { query: { date }, signal }),
      // a live list: another screen (the blender's, a second tablet) may change it
      refetchInterval: 15_000,
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: [...runQueries.all(), 'detail', id],
      queryFn: ({ signal }) => apiClient.get(`/api/runs/${id}`, RunDetailSchema, { signal }),
      refetchInterval: 10_000,
      staleTime: 0,
    }),
}

/** The open fill of a scanned cylinder barcode (not cached: every scan asks the server). */
export function lookupRunByBarcode(barcode: string) {
  return apiClient.get('/api/runs/lookup', RunSummarySchema, { query: { barcode } })
}
