import { z } from 'zod'
import type { Role } from '#shared/schemas/auth.ts'
import {
  CylinderHistorySchema,
  CylinderImportPreviewSchema,
  CylinderImportResultSchema,
  CylinderInputSchema,
  CylinderListQuerySchema,
  CylinderListSchema,
  CylinderOwnerOptionsSchema,
  CylinderSchema,
  CylinderUpdateSchema,
} from '#shared/schemas/cylinder.ts'
import { NotFoundError } from '../../lib/http-errors.ts'
import { defineRoute } from '../../lib/route.ts'
import { cylinderLabelPdf } from './cylinder-label.ts'
import { confirmImport, csvUpload, IMPORT_MAX_BYTES, IMPORT_TYPES, importTemplateCsv, previewImport, requireFile } from './cylinders.import.ts'
import {
  createCylinder,
  cylinderHistory,
  findCylinderByCode,
  findCylinderOr404,
  getCylinder,
  listCylinders,
  ownerOptions,
  toCylinderDto,
  updateCylinder,
} from './cylinders.service.ts'

/** Who keeps the inventory (creates, edits, imports). */
const KEEPERS: readonly Role[] = ['admin', 'blender', 'sales']
/** Who may look at it. */
const READERS: readonly Role[] = ['admin', 'blender', 'sales', 'technician', 'qa']

const IdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })

defineRoute({
  method: 'get',
  path: '/api/cylinders',
  summary: 'Cylinder inventory with search, filters and paging',
  tags: ['cylinders'],
  access: READERS,
  query: CylinderListQuerySchema,
  response: CylinderListSchema,
  handler: ({ em, query }) => listCylinders(em, query),
})

defineRoute({
  method: 'get',
  path: '/api/cylinders/owners',
  summary: 'Customers who may own a cylinder (for the owner field)',
  tags: ['cylinders'],
  access: KEEPERS,
  response: CylinderOwnerOptionsSchema,
  handler: ({ em }) => ownerOptions(em),
})

defineRoute({
  method: 'get',
  path: '/api/cylinders/lookup',
  summary: 'The cylinder with a scanned barcode (or serial)',
  tags: ['cylinders'],
  access: READERS,
  query: z.strictObject({ code: z.string().trim().min(1).max(64) }),
  response: CylinderSchema,
  handler: async ({ em, query }) => {
    const c = await findCylinderByCode(em, query.code)
    if (!c) throw new NotFoundError(`No cylinder with barcode or serial "${query.code}".`)
    return toCylinderDto(c)
  },
})

defineRoute({
  method: 'get',
  path: '/api/cylinders/import/template',
  summary: 'CSV template for the cylinder import',
  tags: ['cylinders'],
  access: KEEPERS,
  produces: 'text/csv',
  handler: ({ res }) => {
    res.setHeader('Content-Type', 'text/csv; charset=utf-8')
    res.setHeader('Content-Disposition', 'attachment; filename="fillwright-cylinders-template.csv"')
    res.send(importTemplateCsv())
  },
})

defineRoute({
  method: 'post',
  path: '/api/cylinders/import/preview',
  summary: 'Check a CSV file of cylinders row by row; saves nothing',
  tags: ['cylinders'],
  access: KEEPERS,
  upload: { field: 'file', maxBytes: IMPORT_MAX_BYTES, types: IMPORT_TYPES },
  before: [csvUpload],
  response: CylinderImportPreviewSchema,
  handler: ({ em, req }) => previewImport(em, requireFile(req.file)),
})

defineRoute({
  method: 'post',
  path: '/api/cylinders/import/confirm',
  summary: 'Import the valid rows of a CSV file of cylinders in one transaction',
  tags: ['cylinders'],
  access: KEEPERS,
  upload: { field: 'file', maxBytes: IMPORT_MAX_BYTES, types: IMPORT_TYPES },
  before: [csvUpload],
  response: CylinderImportResultSchema,
  successStatus: 201,
  handler: ({ em, req, user }) => confirmImport(em, user, requireFile(req.file)),
})

defineRoute({
  method: 'post',
  path: '/api/cylinders',
  summary: 'Add a cylinder to the inventory',
  tags: ['cylinders'],
  access: KEEPERS,
  body: CylinderInputSchema,
  response: CylinderSchema,
  successStatus: 201,
  handler: ({ em, user, body }) => createCylinder(em, user, body),
})

defineRoute({
  method: 'get',
  path: '/api/cylinders/:id',
  summary: 'One cylinder',
  tags: ['cylinders'],
  access: READERS,
  params: IdParamsSchema,
  response: CylinderSchema,
  handler: ({ em, params }) => getCylinder(em, params.id),
})

defineRoute({
  method: 'put',
  path: '/api/cylinders/:id',
  summary: 'Edit a cylinder (with the version read; a stale version is 409)',
  tags: ['cylinders'],
  access: KEEPERS,
  params: IdParamsSchema,
  body: CylinderUpdateSchema,
  response: CylinderSchema,
  handler: ({ em, user, params, body }) => updateCylinder(em, user, params.id, body),
})

defineRoute({
  method: 'get',
  path: '/api/cylinders/:id/history',
  summary: "A cylinder's fill history: runs and their readings",
  tags: ['cylinders'],
  access: READERS,
  params: IdParamsSchema,
  response: CylinderHistorySchema,
  handler: ({ em, params }) => cylinderHistory(em, params.id),
})

defineRoute({
  method: 'get',
  path: '/api/cylinders/:id/label.pdf',
  summary: 'Printable cylinder label (Code 128 and QR code) as PDF',
  tags: ['cylinders'],
  access: ['admin', 'blender', 'sales', 'technician'],
  params: IdParamsSchema,
  query: z.strictObject({ size: z.enum(['A4', 'LETTER']).default('A4') }),
  produces: 'application/pdf',
  handler: async ({ em, params, query, res, deps }) => {
    const c = await findCylinderOr404(em, params.id)
    const pdf = await cylinderLabelPdf(c, { publicUrl: deps.publicUrl, size: query.size })
    res.setHeader('Content-Type', 'application/pdf')
    res.setHeader('Content-Disposition', `inline; filename="label-${c.serial.replace(/[^A-Za-z0-9._-]/g, '_')}.pdf"`)
    res.send(pdf)
  },
})
