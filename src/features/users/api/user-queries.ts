import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { OkSchema } from '#shared/schemas/auth.ts'
import { AuditListSchema, type UserCreateInput, UserListSchema, UserSchema, type UserUpdateInput } from '#shared/schemas/user.ts'
import { apiClient } from '#src/lib/api-client.ts'

export const userQueries = {
  all: () => ['users'] as const,
  list: () => queryOptions({ queryKey: [...userQueries.all(), 'list'], queryFn: ({ signal }) => apiClient.get('/api/users', UserListSchema, { signal }) }),
  auditAll: () => ['audit'] as const,
  audit: (entityType?: string) =>
    queryOptions({
      queryKey: [...userQueries.auditAll(), { entityType: entityType ?? '' }],
      queryFn: ({ signal }) => apiClient.get('/api/audit', AuditListSchema, { query: { entityType, limit: 100 }, signal }),
    }),
}

export function useCreateUser() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: UserCreateInput) => apiClient.post('/api/users', UserSchema, input),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: userQueries.all() }), qc.invalidateQueries({ queryKey: userQueries.auditAll() })]),
  })
}

export function useUpdateUser(id: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: UserUpdateInput) => apiClient.put(`/api/users/${id}`, UserSchema, input),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: userQueries.all() }), qc.invalidateQueries({ queryKey: userQueries.auditAll() })]),
  })
}

export function useResetPassword(id: number) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (password: string) => apiClient.post(`/api/users/${id}/password`, OkSchema, { password }),
    onSuccess: () => qc.invalidateQueries({ queryKey: userQueries.auditAll() }),
  })
}
