import { useMutation } from '@tanstack/react-query'
import { PlanEmailResultSchema } from '#shared/schemas/plan.ts'
import { apiClient } from '#src/lib/api-client.ts'

export function useEmailSheet(id: number) {
  return useMutation({
    mutationFn: (technicianId: number) => apiClient.post(`/api/plans/${id}/email-sheet`, PlanEmailResultSchema, { technicianId }),
  })
}
