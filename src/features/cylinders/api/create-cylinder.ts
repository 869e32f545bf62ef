import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type CylinderInput, CylinderSchema } from '#shared/schemas/cylinder.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { cylinderQueries } from './cylinder-queries.ts'

export function useCreateCylinder() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: CylinderInput) => apiClient.post('/api/cylinders', CylinderSchema, input),
    onSuccess: (c) => {
      qc.setQueryData(cylinderQueries.detail(c.id).queryKey, c)
      void qc.invalidateQueries({ queryKey: cylinderQueries.lists() })
    },
  })
}
