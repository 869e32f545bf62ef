import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type ReleaseInput, ReleaseResultSchema } from '#shared/schemas/quality.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { qualityQueries } from './quality-queries.ts'

/** Signs and releases the certificate of one cylinder. */
export function useReleaseCertificate(runId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: ReleaseInput) => apiClient.post(`/api/quality/runs/${runId}/release`, ReleaseResultSchema, input),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: qualityQueries.all() })
    },
  })
}
