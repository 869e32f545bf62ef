import { useMutation, useQueryClient } from '@tanstack/react-query'
import { CylinderImportPreviewSchema, CylinderImportResultSchema } from '#shared/schemas/cylinder.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { cylinderQueries } from './cylinder-queries.ts'

function form(file: File): FormData {
  const data = new FormData()
  data.append('file', file)
  return data
}

/** Checks a CSV file row by row; the server saves nothing. */
export function usePreviewImport() {
  return useMutation({ mutationFn: (file: File) => apiClient.post('/api/cylinders/import/preview', CylinderImportPreviewSchema, form(file)) })
}

/** Imports every valid row of the same file in one transaction. */
export function useConfirmImport() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (file: File) => apiClient.post('/api/cylinders/import/confirm', CylinderImportResultSchema, form(file)),
    onSuccess: () => void qc.invalidateQueries({ queryKey: cylinderQueries.lists() }),
  })
}
