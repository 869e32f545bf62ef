import { queryOptions } from '@tanstack/react-query'
import { SessionUserSchema } from '#shared/schemas/auth.ts'
import { ApiError, apiClient } from '#src/lib/api-client.ts'

export const authQueries = {
  all: () => ['auth'] as const,
  /** the signed-in user, or null when signed out */
  me: () =>
    queryOptions({
      queryKey: [...authQueries.all(), 'me'],
      queryFn: async ({ signal }) => {
        try {
          return await apiClient.get('/api/auth/me', SessionUserSchema, { signal })
        } catch (err) {
          if (err instanceof ApiError && err.status === 401) return null
          throw err
        }
      },
      staleTime: 60_000,
    }),
}
