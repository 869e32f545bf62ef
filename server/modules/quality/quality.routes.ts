import { z } from 'zod'
import {
  AnalysisInputSchema,
  CertificateDetailSchema,
  CertificateListQuerySchema,
  CertificateListSchema,
  CorrectionInputSchema,
  IdParamsSchema,
  QaQueueSchema,
  QaRunDetailSchema,
  RejectInputSchema,
  REPORT_MAX_BYTES,
  REPORT_TYPES,
  ReleaseInputSchema,
  ReleaseResultSchema,
  RunIdParamsSchema,
} from '#shared/schemas/quality.ts'
import { defineRoute } from '../../lib/route.ts'
import { checkReport, REPORT_FIELD, reportUploadMiddleware } from './report-upload.ts'
import * as quality from './quality.service.ts'

const QA = ['qa'] as const
const QA_DESK = ['qa', 'admin'] as const
/** who may read certificates: staff all of them, a customer only their own (checked in the service, 404 otherwise) */
const CERTIFICATE_READERS = ['qa', 'admin', 'sales', 'blender', 'customer'] as const

defineRoute({
  method: 'get',
  path: '/api/quality/queue',
  summary: 'Cylinders awaiting analysis and analyses ready to release',
  tags: ['quality'],
  access: QA_DESK,
  response: QaQueueSchema,
  handler: ({ em }) => quality.qaQueue(em),
})

defineRoute({
  method: 'get',
  path: '/api/quality/runs/:runId',
  summary: 'QA workspace of one filled cylinder: specification, analysis, comparison, hazard, release defaults, certificates',
  tags: ['quality'],
  access: QA_DESK,
  params: RunIdParamsSchema,
  response: QaRunDetailSchema,
  handler: ({ em, params }) => quality.runDetail(em, params.runId),
})

defineRoute({
  method: 'put',
  path: '/api/quality/runs/:runId/analysis',
  summary: 'Enter or replace the analysis results (values stored as mole fractions) and compare with the specification',
  tags: ['quality'],
  access: QA,
  params: RunIdParamsSchema,
  body: AnalysisInputSchema,
  response: QaRunDetailSchema,
  handler: ({ em, user, params, body }) => quality.saveAnalysis(em, user, params.runId, body),
})

defineRoute({
  method: 'post',
  path: '/api/quality/runs/:runId/report',
  summary: 'Upload the analysis report (PDF or CSV, at most 10 MB; type and content are both checked)',
  tags: ['quality'],
  access: QA,
  params: RunIdParamsSchema,
  upload: { field: REPORT_FIELD, maxBytes: REPORT_MAX_BYTES, types: [...REPORT_TYPES] },
  before: [reportUploadMiddleware],
  response: QaRunDetailSchema,
  handler: ({ em, deps, user, params, req }) => quality.attachReport(em, deps, user, params.runId, checkReport(req.file)),
})

defineRoute({
  method: 'get',
  path: '/api/quality/runs/:runId/report',
  summary: 'Download the uploaded analysis report',
  tags: ['quality'],
  access: ['qa', 'admin', 'blender', 'sales'],
  params: RunIdParamsSchema,
  produces: 'application/octet-stream',
  handler: async ({ em, deps, params, res }) => {
    const file = await quality.reportFile(em, deps, params.runId)
    res.attachment(file.name)
    res.type(file.contentType)
    res.setHeader('Cache-Control', 'private, no-store')
    res.send(file.bytes)
  },
})

const PreviewQuerySchema = z.strictObject({
  validityMonths: z.coerce.number().int().min(1).max(120).optional(),
  minimumUsePressureBarGauge: z.coerce.number().min(0).max(50).optional(),
  storageMinC: z.coerce.number().min(-60).max(60).optional(),
  storageMaxC: z.coerce.number().min(-20).max(65).optional(),
})

defineRoute({
  method: 'get',
  path: '/api/quality/runs/:runId/certificate-preview',
  summary: 'Draft certificate PDF as it would be released now (marked DRAFT, not valid)',
  tags: ['quality'],
  access: QA_DESK,
  params: RunIdParamsSchema,
  query: PreviewQuerySchema,
  produces: 'application/pdf',
  handler: async ({ em, user, params, query, res }) => {
    const detail = await quality.runDetail(em, params.runId)
    const d = detail.releaseDefaults
    const bytes = await quality.previewCertificate(em, user, params.runId, {
      validityMonths: query.validityMonths ?? d.validityMonths,
      minimumUsePressureBarGauge: query.minimumUsePressureBarGauge ?? d.minimumUsePressureBarGauge,
      storageMinC: query.storageMinC ?? d.storageMinC,
      storageMaxC: query.storageMaxC ?? d.storageMaxC,
    })
    res.type('application/pdf')
    res.setHeader('Content-Disposition', `inline; filename="draft-certificate-run-${params.runId}.pdf"`)
    res.setHeader('Cache-Control', 'private, no-store')
    res.send(bytes)
  },
})

defineRoute({
  method: 'post',
  path: '/api/quality/runs/:runId/release',
  summary: 'Sign and release the certificate (password re-entered); e-mails the PDF to the customer',
  tags: ['quality'],
  access: QA,
  params: RunIdParamsSchema,
  body: ReleaseInputSchema,
  response: ReleaseResultSchema,
  successStatus: 201,
  handler: ({ em, deps, user, params, body, req }) =>
    quality.releaseCertificate(em, deps, user, params.runId, body, (err) => req.log?.error({ err }, 'certificate e-mail not sent')),
})

defineRoute({
  method: 'post',
  path: '/api/quality/runs/:runId/reject',
  summary: 'Send the cylinder back for rework with a reason (closes the analysis, holds the cylinder in quarantine)',
  tags: ['quality'],
  access: QA,
  params: RunIdParamsSchema,
  body: RejectInputSchema,
  response: QaRunDetailSchema,
  handler: ({ em, user, params, body }) => quality.rejectAnalysis(em, user, params.runId, body),
})

defineRoute({
  method: 'get',
  path: '/api/certificates',
  summary: 'Certificates with every revision (a customer sees only their own)',
  tags: ['certificates'],
  access: CERTIFICATE_READERS,
  query: CertificateListQuerySchema,
  response: CertificateListSchema,
  handler: ({ em, user, query }) => quality.listCertificates(em, user, query),
})

defineRoute({
  method: 'get',
  path: '/api/certificates/:id',
  summary: 'One certificate revision with its frozen content and the list of revisions',
  tags: ['certificates'],
  access: CERTIFICATE_READERS,
  params: IdParamsSchema,
  response: CertificateDetailSchema,
  handler: ({ em, user, params }) => quality.certificateDetail(em, user, params.id),
})

defineRoute({
  method: 'get',
  path: '/api/certificates/:id/pdf',
  summary: 'The certificate PDF on A4 or US Letter (a superseded revision is stamped with the revision that replaces it)',
  tags: ['certificates'],
  access: CERTIFICATE_READERS,
  params: IdParamsSchema,
  query: z.strictObject({ paper: z.enum(['a4', 'letter']).default('a4') }),
  produces: 'application/pdf',
  handler: async ({ em, user, params, query, res }) => {
    const { bytes, filename } = await quality.certificatePdf(em, user, params.id, query.paper === 'letter' ? 'LETTER' : 'A4')
    res.type('application/pdf')
    res.attachment(filename)
    res.setHeader('Cache-Control', 'private, no-store')
    res.send(bytes)
  },
})

defineRoute({
  method: 'post',
  path: '/api/certificates/:id/corrections',
  summary: 'Correct a released certificate: issues the next revision naming the one it replaces (password re-entered)',
  tags: ['certificates'],
  access: QA,
  params: IdParamsSchema,
  body: CorrectionInputSchema,
  response: ReleaseResultSchema,
  successStatus: 201,
  handler: ({ em, deps, user, params, body, req }) =>
    quality.correctCertificate(em, deps, user, params.id, body, (err) => req.log?.error({ err }, 'certificate e-mail not sent')),
})
