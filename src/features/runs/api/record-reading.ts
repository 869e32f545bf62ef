import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type RecordReadingInput, RecordReadingResultSchema } from '#shared/schemas/run.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { runQueries } from './run-queries.ts'
import { takeCurrentState } from './stale-state.ts'

/** Saves a reading at once; a 409 puts the server's current run in the cache so the screen shows it. */
export function useRecordReading(runId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: RecordReadingInput) => apiClient.post(`/api/runs/${runId}/readings`, RecordReadingResultSchema, input),
    onSuccess: (result) => {
      qc.setQueryData(runQueries.detail(runId).queryKey, result.run)
      void qc.invalidateQueries({ queryKey: [...runQueries.all(), 'mine'] })
    },
    onError: (err) => takeCurrentState(qc, runId, err),
  })
}
