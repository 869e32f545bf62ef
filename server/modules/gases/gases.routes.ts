import { defineRoute } from '../../lib/route.ts'
import { GasListSchema } from '#shared/schemas/gas.ts'
import { listGases } from './gases.service.ts'

defineRoute({
  method: 'get',
  path: '/api/gases',
  summary: 'The gas library: identity, molar mass, critical constants, hazards, ISO 10156 and toxicity data, model coverage and sources',
  tags: ['gases'],
  access: 'signed-in',
  response: GasListSchema,
  handler: () => listGases(),
})
