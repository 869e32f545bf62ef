import { PriceBookSchema, PriceEntryInputSchema, PriceEntrySchema, PriceIdParamsSchema } from '#shared/schemas/pricing.ts'
import { defineRoute } from '../../lib/route.ts'
import { createPriceEntry, deletePriceEntry, getPriceBook, updatePriceEntry } from './pricing.service.ts'

const SALES_DESK = ['sales', 'admin'] as const

defineRoute({
  method: 'get',
  path: '/api/prices',
  summary: 'The price book (gas per m³ at 15 °C, 101.325 kPa or per kg; rental per day; certification; surcharges)',
  tags: ['pricing'],
  access: SALES_DESK,
  response: PriceBookSchema,
  handler: ({ em }) => getPriceBook(em),
})

defineRoute({
  method: 'post',
  path: '/api/prices',
  summary: 'Add a price-book line',
  tags: ['pricing'],
  access: SALES_DESK,
  body: PriceEntryInputSchema,
  response: PriceEntrySchema,
  successStatus: 201,
  handler: ({ em, user, body }) => createPriceEntry(em, user, body),
})

defineRoute({
  method: 'put',
  path: '/api/prices/:id',
  summary: 'Change a price-book line',
  tags: ['pricing'],
  access: SALES_DESK,
  params: PriceIdParamsSchema,
  body: PriceEntryInputSchema,
  response: PriceEntrySchema,
  handler: ({ em, user, params, body }) => updatePriceEntry(em, user, params.id, body),
})

defineRoute({
  method: 'delete',
  path: '/api/prices/:id',
  summary: 'Remove a price-book line',
  tags: ['pricing'],
  access: SALES_DESK,
  params: PriceIdParamsSchema,
  handler: async ({ em, user, params }) => {
    await deletePriceEntry(em, user, params.id)
  },
})
