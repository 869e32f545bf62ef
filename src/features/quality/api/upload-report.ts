import { useMutation, useQueryClient } from '@tanstack/react-query'
import { QaRunDetailSchema } from '#shared/schemas/quality.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { qualityQueries } from './quality-queries.ts'

/** Uploads the analysis report (PDF or CSV); the server checks the type and the content. */
export function useUploadReport(runId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (file: File) => {
      const form = new FormData()
      form.append('report', file, file.name)
      return apiClient.post(`/api/quality/runs/${runId}/report`, QaRunDetailSchema, form)
    },
    onSuccess: (detail) => {
      qc.setQueryData(qualityQueries.run(runId).queryKey, detail)
      void qc.invalidateQueries({ queryKey: qualityQueries.queue().queryKey })
    },
  })
}
