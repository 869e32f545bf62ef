import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type PlanCreateInput, PlanDetailSchema } from '#shared/schemas/plan.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { planQueries } from './plan-queries.ts'

export function useCreatePlan() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: PlanCreateInput) => apiClient.post('/api/plans', PlanDetailSchema, input),
    onSuccess: (plan) => {
      qc.setQueryData(planQueries.detail(plan.id).queryKey, plan)
      void qc.invalidateQueries({ queryKey: planQueries.lists() })
      void qc.invalidateQueries({ queryKey: planQueries.queue().queryKey })
    },
  })
}
