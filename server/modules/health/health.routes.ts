import { z } from 'zod'
import { defineRoute } from '../../lib/route.ts'

export const HealthSchema = z.object({ status: z.literal('ok'), database: z.literal('ok'), time: z.string() })

defineRoute({
  method: 'get',
  path: '/api/health',
  summary: 'Liveness and database check',
  tags: ['system'],
  access: 'public',
  response: HealthSchema,
  handler: async ({ em }) => {
    await em.getConnection().execute('select 1')
    return { status: 'ok' as const, database: 'ok' as const, time: new Date().toISOString() }
  },
})
