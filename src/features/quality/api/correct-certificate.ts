import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type CorrectionInput, ReleaseResultSchema } from '#shared/schemas/quality.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { qualityQueries } from './quality-queries.ts'

/** Issues the next revision of a certificate (the released one never changes). */
export function useCorrectCertificate(certificateId: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: CorrectionInput) => apiClient.post(`/api/certificates/${certificateId}/corrections`, ReleaseResultSchema, input),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: qualityQueries.all() })
    },
  })
}
