import { queryOptions } from '@tanstack/react-query'
import {
  type CYLINDER_SORTS,
  type CylinderMaterial,
  type CylinderStatus,
  CylinderHistorySchema,
  CylinderListSchema,
  CylinderOwnerOptionsSchema,
  CylinderSchema,
} from '#shared/schemas/cylinder.ts'
import { apiClient } from '#src/lib/api-client.ts'

/** The query of GET /api/cylinders as the client sends it. */
export interface CylinderFilters {
  q?: string
  status?: CylinderStatus
  material?: CylinderMaterial
  oxygenClean?: 'true' | 'false'
  test?: 'overdue' | 'due-soon'
  sort?: (typeof CYLINDER_SORTS)[number]
  dir?: 'asc' | 'desc'
  limit?: number
  offset?: number
}

export const cylinderQueries = {
  all: () => ['cylinders'] as const,
  lists: () => [...cylinderQueries.all(), 'list'] as const,
  list: (filters: CylinderFilters) =>
    queryOptions({
      queryKey: [...cylinderQueries.lists(), filters],
      queryFn: ({ signal }) => apiClient.get('/api/cylinders', CylinderListSchema, { query: { ...filters }, signal }),
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: [...cylinderQueries.all(), 'detail', id],
      queryFn: ({ signal }) => apiClient.get(`/api/cylinders/${id}`, CylinderSchema, { signal }),
    }),
  history: (id: number) =>
    queryOptions({
      queryKey: [...cylinderQueries.all(), 'history', id],
      queryFn: ({ signal }) => apiClient.get(`/api/cylinders/${id}/history`, CylinderHistorySchema, { signal }),
    }),
  owners: () =>
    queryOptions({
      queryKey: [...cylinderQueries.all(), 'owners'],
      queryFn: ({ signal }) => apiClient.get('/api/cylinders/owners', CylinderOwnerOptionsSchema, { signal }),
      staleTime: 5 * 60_000,
    }),
}

export const cylinderLabelHref = (id: number, size: 'A4' | 'LETTER' = 'A4') => `/api/cylinders/${id}/label.pdf?size=${size}`
export const cylinderTemplateHref = () => '/api/cylinders/import/template'
