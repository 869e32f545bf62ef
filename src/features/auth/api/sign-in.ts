import { useMutation, useQueryClient } from '@tanstack/react-query'
import { type LoginInput, LoginResultSchema, OkSchema } from '#shared/schemas/auth.ts'
import { apiClient, setCsrfToken } from '#src/lib/api-client.ts'
import { authQueries } from './auth-queries.ts'

export function useSignIn() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: LoginInput) => apiClient.post('/api/auth/login', LoginResultSchema, input),
    onSuccess: (result) => {
      setCsrfToken(result.csrfToken)
      qc.clear()
      qc.setQueryData(authQueries.me().queryKey, result.user)
    },
  })
}

export function useSignOut() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: () => apiClient.post('/api/auth/logout', OkSchema),
    onSettled: () => {
      setCsrfToken(null)
      qc.clear()
      qc.setQueryData(authQueries.me().queryKey, null)
    },
  })
}
