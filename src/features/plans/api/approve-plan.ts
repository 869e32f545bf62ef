import { useMutation, useQueryClient } from '@tanstack/react-query'
import { PlanDetailSchema } from '#shared/schemas/plan.ts'
import { apiClient } from '#src/lib/api-client.ts'
import { planQueries } from './plan-queries.ts'

export function useApprovePlan(id: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (version: number) => apiClient.post(`/api/plans/${id}/approve`, PlanDetailSchema, { version }),
    onSuccess: (plan) => {
      qc.setQueryData(planQueries.detail(plan.id).queryKey, plan)
      void qc.invalidateQueries({ queryKey: planQueries.lists() })
      void qc.invalidateQueries({ queryKey: planQueries.queue().queryKey })
      // the order may have moved to "planned": let other screens refetch it
      void qc.invalidateQueries({ queryKey: ['orders'] })
    },
  })
}
