import { queryOptions } from '@tanstack/react-query'
import { type CertificateListQuery, CertificateDetailSchema, CertificateListSchema, QaQueueSchema, QaRunDetailSchema } from '#shared/schemas/quality.ts'
import { apiClient } from '#src/lib/api-client.ts'

export const qualityQueries = {
  all: () => ['quality'] as const,
  queue: () =>
    queryOptions({
      queryKey: [...qualityQueries.all(), 'queue'],
      queryFn: ({ signal }) => apiClient.get('/api/quality/queue', QaQueueSchema, { signal }),
      refetchInterval: 60_000,
    }),
  runs: () => [...qualityQueries.all(), 'run'] as const,
  run: (runId: number) =>
    queryOptions({
      queryKey: [...qualityQueries.runs(), runId],
      queryFn: ({ signal }) => apiClient.get(`/api/quality/runs/${runId}`, QaRunDetailSchema, { signal }),
    }),
  certificates: () => [...qualityQueries.all(), 'certificates'] as const,
  certificateList: (query: CertificateListQuery = {}) =>
    queryOptions({
      queryKey: [...qualityQueries.certificates(), 'list', query],
      queryFn: ({ signal }) => apiClient.get('/api/certificates', CertificateListSchema, { query: { ...query }, signal }),
    }),
  certificate: (id: number) =>
    queryOptions({
      queryKey: [...qualityQueries.certificates(), 'detail', id],
      queryFn: ({ signal }) => apiClient.get(`/api/certificates/${id}`, CertificateDetailSchema, { signal }),
    }),
}

/** where the browser downloads a certificate PDF */
export const certificatePdfHref = (id: number, paper: 'a4' | 'letter' = 'a4') => `/api/certificates/${id}/pdf${paper === 'letter' ? '?paper=letter' : ''}`
export const reportHref = (runId: number) => `/api/quality/runs/${runId}/report`
export function previewHref(runId: number, conditions: Record<string, number | undefined>): string {
  const q = new URLSearchParams()
  for (const [k, v] of Object.entries(conditions)) if (v !== undefined && Number.isFinite(v)) q.set(k, String(v))
  return `/api/quality/runs/${runId}/certificate-preview${q.size ? `?${q}` : ''}`
}
