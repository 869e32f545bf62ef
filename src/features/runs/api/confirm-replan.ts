import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type ConfirmReplanInput, RunDetailSchema } from '#shared/schemas/run.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { runQueries } from './run-queries.ts'
import { takeCurrentState } from './stale-state.ts'

export function useConfirmReplan(runId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: ConfirmReplanInput) => apiClient.post(`/api/runs/${runId}/replan/confirm`, RunDetailSchema, input),
    onSuccess: (run) => {
      qc.setQueryData(runQueries.detail(runId).queryKey, run)
      void qc.invalidateQueries({ queryKey: [...runQueries.all(), 'mine'] })
    },
    onError: (err) => takeCurrentState(qc, runId, err),
  })
}
