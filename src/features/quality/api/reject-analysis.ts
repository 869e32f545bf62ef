import { useMutation, useQueryClient } from '@tanstack/react-query'
import { QaRunDetailSchema, type RejectInput } from '#shared/schemas/quality.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { qualityQueries } from './quality-queries.ts'

/** Sends a cylinder back for rework with the reason. */
export function useRejectAnalysis(runId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: RejectInput) => apiClient.post(`/api/quality/runs/${runId}/reject`, QaRunDetailSchema, input),
    onSuccess: (detail) => {
      qc.setQueryData(qualityQueries.run(runId).queryKey, detail)
      void qc.invalidateQueries({ queryKey: qualityQueries.queue().queryKey })
    },
  })
}
