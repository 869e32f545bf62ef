import { queryOptions } from '@tanstack/react-query'
import { CylinderListSchema } from '#shared/schemas/cylinder.ts'
import { PlanDetailSchema, PlanLineSpecSchema, PlanListSchema, PlanQueueSchema, type PlanStatus, TechnicianOptionsSchema } from '#shared/schemas/plan.ts'
import { apiClient } from '#src/lib/api-client.ts'

export interface PlanFilters {
  orderLineId?: number
  status?: PlanStatus
  limit?: number
}

export const planQueries = {
  all: () => ['plans'] as const,
  lists: () => [...planQueries.all(), 'list'] as const,
  list: (filters: PlanFilters) =>
    queryOptions({
      queryKey: [...planQueries.lists(), filters],
      queryFn: ({ signal }) => apiClient.get('/api/plans', PlanListSchema, { query: { ...filters }, signal }),
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: [...planQueries.all(), 'detail', id],
      queryFn: ({ signal }) => apiClient.get(`/api/plans/${id}`, PlanDetailSchema, { signal }),
    }),
  queue: () =>
    queryOptions({
      queryKey: [...planQueries.all(), 'queue'],
      queryFn: ({ signal }) => apiClient.get('/api/plans/queue', PlanQueueSchema, { signal }),
    }),
  lineSpec: (orderLineId: number) =>
    queryOptions({
      queryKey: [...planQueries.all(), 'line', orderLineId],
      queryFn: ({ signal }) => apiClient.get(`/api/plans/order-lines/${orderLineId}`, PlanLineSpecSchema, { signal }),
    }),
  technicians: () =>
    queryOptions({
      queryKey: [...planQueries.all(), 'technicians'],
      queryFn: ({ signal }) => apiClient.get('/api/plans/technicians', TechnicianOptionsSchema, { signal }),
      staleTime: 5 * 60_000,
    }),
  /** cylinders free for a plan of this water volume (the inventory's own list, filtered here) */
  freeCylinders: (waterVolumeL: number) =>
    queryOptions({
      queryKey: [...planQueries.all(), 'free-cylinders', waterVolumeL],
      queryFn: async ({ signal }) => {
        const list = await apiClient.get('/api/cylinders', CylinderListSchema, { query: { status: 'available', limit: 500, sort: 'serial' }, signal })
        return list.items.filter((c) => Math.abs(c.waterVolumeL - waterVolumeL) <= 0.01 * waterVolumeL && !c.blocked)
      },
    }),
}
