import { useMutation, useQueryClient } from '@tanstack/react-query'
import { RunDetailSchema, type RunVersionInput } from '#shared/schemas/run.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { runQueries } from './run-queries.ts'
import { takeCurrentState } from './stale-state.ts'

export function useResumeRun(runId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: RunVersionInput) => apiClient.post(`/api/runs/${runId}/resume`, RunDetailSchema, input),
    onSuccess: (run) => {
      qc.setQueryData(runQueries.detail(runId).queryKey, run)
      void qc.invalidateQueries({ queryKey: [...runQueries.all(), 'mine'] })
    },
    onError: (err) => takeCurrentState(qc, runId, err),
  })
}
