import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type CylinderUpdate, CylinderSchema } from '#shared/schemas/cylinder.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { cylinderQueries } from './cylinder-queries.ts'

export function useUpdateCylinder(id: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: CylinderUpdate) => apiClient.put(`/api/cylinders/${id}`, CylinderSchema, input),
    onSuccess: (c) => {
      qc.setQueryData(cylinderQueries.detail(c.id).queryKey, c)
      void qc.invalidateQueries({ queryKey: cylinderQueries.lists() })
    },
  })
}
