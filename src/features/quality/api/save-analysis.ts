import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type AnalysisInput, QaRunDetailSchema } from '#shared/schemas/quality.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { qualityQueries } from './quality-queries.ts'

/** Enters or replaces the analysis of one cylinder; the server answers with the recomputed comparison. */
export function useSaveAnalysis(runId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: AnalysisInput) => apiClient.put(`/api/quality/runs/${runId}/analysis`, QaRunDetailSchema, input),
    onSuccess: (detail) => {
      qc.setQueryData(qualityQueries.run(runId).queryKey, detail)
      void qc.invalidateQueries({ queryKey: qualityQueries.queue().queryKey })
    },
  })
}
