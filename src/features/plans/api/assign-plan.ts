import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type PlanAssignInput, PlanAssignResultSchema } from '#shared/schemas/plan.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { planQueries } from './plan-queries.ts'

export function useAssignPlan(id: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: PlanAssignInput) => apiClient.post(`/api/plans/${id}/assign`, PlanAssignResultSchema, input),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: planQueries.detail(id).queryKey })
      void qc.invalidateQueries({ queryKey: [...planQueries.all(), 'free-cylinders'] })
    },
  })
}
