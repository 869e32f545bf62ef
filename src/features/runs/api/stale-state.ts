import type { QueryClient } from '@tanstack/react-query'
import { RunDetailSchema } from '#shared/schemas/run.ts'
import { ApiError } from '#src/lib/api-client.ts'
import { runQueries } from './run-queries.ts'

/** After a 409 the server sends the run as it is now: show that instead of the stale copy. */
export function takeCurrentState(qc: QueryClient, runId: number, err: unknown): void {
  if (!(err instanceof ApiError) || err.status !== 409) return
  const current = RunDetailSchema.safeParse((err.body as unknown as { current?: unknown }).current)
  if (current.success) qc.setQueryData(runQueries.detail(runId).queryKey, current.data)
  else void qc.invalidateQueries({ queryKey: runQueries.detail(runId).queryKey })
}
