import { z } from 'zod'

/**
 * QA: analysis of filled cylinders against their specification, release of certificates of composition
 * (content per ISO 6141), corrections as new revisions. Compositions cross the wire as mole (amount)
 * fractions 0..1; the unit QA typed a value in is kept for display only.
 */

// ---- composition units ------------------------------------------------------------------------------

export const COMPOSITION_UNITS = ['percent', 'ppm', 'mol/mol'] as const
export const CompositionUnitSchema = z.enum(COMPOSITION_UNITS)
export type CompositionUnit = z.infer<typeof CompositionUnitSchema>

/** how each unit is printed: amount-fraction units, never "% vol" */
export const COMPOSITION_UNIT_LABEL: Record<CompositionUnit, string> = {
  percent: '% mol/mol',
  ppm: 'µmol/mol',
  'mol/mol': 'mol/mol',
}

/** how many of each unit make 1 mol/mol (dividing by these keeps entered decimals exact to the last bit) */
export const COMPOSITION_UNIT_PER_MOL_MOL: Record<CompositionUnit, number> = { percent: 100, ppm: 1e6, 'mol/mol': 1 }

export function toMoleFraction(value: number, unit: CompositionUnit): number {
  return value / COMPOSITION_UNIT_PER_MOL_MOL[unit]
}

/** a mole fraction in `unit`, rid of binary noise beyond 12 significant digits (far below any measurement) */
export function fromMoleFraction(x: number, unit: CompositionUnit): number {
  return Number((x * COMPOSITION_UNIT_PER_MOL_MOL[unit]).toPrecision(12))
}

/** the unit a fraction reads best in: % from 1 % up, µmol/mol below (common practice, no source) */
export function naturalUnit(x: number): CompositionUnit {
  return x >= 0.01 ? 'percent' : 'ppm'
}

function decimalsFor(step: number): number {
  return Math.max(0, -Math.floor(Math.log10(step)))
}

/**
 * A value with its expanded uncertainty in one unit: the uncertainty rounded to two significant digits and the
 * value to the same last digit (JCGM 100:2008 (GUM) 7.2.6).
 * @example formatWithUncertainty(0.020034, 0.00040, 'percent') // { value: '2.003', uncertainty: '0.040' }
 */
export function formatWithUncertainty(x: number, expandedU: number, unit: CompositionUnit): { value: string; uncertainty: string } {
  const v = fromMoleFraction(x, unit)
  const u = fromMoleFraction(expandedU, unit)
  if (!(u > 0) || !Number.isFinite(u)) return { value: formatSignificant(v, 4), uncertainty: '' }
  const exponent = Math.floor(Math.log10(u)) - 1
  const step = 10 ** exponent
  const digits = decimalsFor(step)
  const round = (n: number) => (Math.round(n / step) * step).toFixed(digits)
  return { value: round(v), uncertainty: round(u) }
}

/** a number to n significant digits, without exponent notation */
export function formatSignificant(n: number, significant: number): string {
  if (n === 0 || !Number.isFinite(n)) return String(n)
  const exponent = Math.floor(Math.log10(Math.abs(n)))
  const digits = Math.max(0, significant - 1 - exponent)
  return n.toFixed(Math.min(digits, 12))
}

// ---- analysis entry ---------------------------------------------------------------------------------

const finite = () => z.number().refine(Number.isFinite, 'must be a finite number')
const text = (max: number) => z.string().trim().min(1, 'required').max(max)

export const AnalysisComponentInputSchema = z
  .strictObject({
    gas: z.string().trim().min(1).max(64),
    /** measured content in `unit` */
    value: finite().positive('a certified content is above zero'),
    unit: CompositionUnitSchema,
    /** expanded uncertainty, in the same unit as the value */
    expandedUncertainty: finite().positive('state the expanded uncertainty'),
    coverageFactor: finite().min(1, 'coverage factor k is at least 1').max(4, 'coverage factor k is at most 4').default(2),
    instrument: text(120),
    method: text(200),
  })
  .superRefine((c, ctx) => {
    if (toMoleFraction(c.value, c.unit) > 1) ctx.addIssue({ code: 'custom', path: ['value'], message: 'more than 100 % mol/mol: check the unit' })
    if (c.expandedUncertainty >= c.value)
      ctx.addIssue({ code: 'custom', path: ['expandedUncertainty'], message: 'the uncertainty must be smaller than the value' })
  })
export type AnalysisComponentInput = z.input<typeof AnalysisComponentInputSchema>

export const AnalysisInputSchema = z
  .strictObject({
    results: z.array(AnalysisComponentInputSchema).min(1, 'enter at least one component').max(30),
  })
  .superRefine((a, ctx) => {
    const seen = new Set<string>()
    a.results.forEach((r, i) => {
      if (seen.has(r.gas)) ctx.addIssue({ code: 'custom', path: ['results', i, 'gas'], message: 'this gas is entered twice' })
      seen.add(r.gas)
    })
  })
export type AnalysisInput = z.input<typeof AnalysisInputSchema>

export const RejectInputSchema = z.strictObject({
  reason: z.string().trim().min(5, 'say in a few words why (at least 5 characters)').max(2000),
})
export type RejectInput = z.infer<typeof RejectInputSchema>

/** Release conditions the signer confirms; defaults are filled from the plan where it knows better. */
const releaseConditions = {
  /** period of validity (stability) from the date of certification */
  validityMonths: z.number().int().min(1).max(120),
  /** do not use the cylinder below this pressure, bar gauge */
  minimumUsePressureBarGauge: finite().min(0).max(50),
  /** storage and use temperature limits, °C */
  storageMinC: finite().min(-60).max(60),
  storageMaxC: finite().min(-20).max(65),
}

export const ReleaseInputSchema = z
  .strictObject({
    /** the signer's own sign-in password, entered again as the signature */
    password: z.string().min(1, 'enter your password to sign').max(512),
    ...releaseConditions,
  })
  .refine((r) => r.storageMinC < r.storageMaxC, { path: ['storageMaxC'], message: 'the upper limit must be above the lower limit' })
export type ReleaseInput = z.infer<typeof ReleaseInputSchema>

export const CorrectionInputSchema = z
  .strictObject({
    password: z.string().min(1, 'enter your password to sign').max(512),
    reason: z.string().trim().min(5, 'say what is corrected and why (at least 5 characters)').max(2000),
    /** corrected composition (replaces the certified values) */
    results: z.array(AnalysisComponentInputSchema).min(1).max(30).optional(),
    validityMonths: releaseConditions.validityMonths.optional(),
    minimumUsePressureBarGauge: releaseConditions.minimumUsePressureBarGauge.optional(),
    storageMinC: releaseConditions.storageMinC.optional(),
    storageMaxC: releaseConditions.storageMaxC.optional(),
  })
  .refine(
    (c) =>
      c.results !== undefined ||
      c.validityMonths !== undefined ||
      c.minimumUsePressureBarGauge !== undefined ||
      c.storageMinC !== undefined ||
      c.storageMaxC !== undefined,
    { path: ['reason'], message: 'a correction changes at least one value' },
  )
export type CorrectionInput = z.input<typeof CorrectionInputSchema>

// ---- comparison with the specification -------------------------------------------------------------------

export const ComparisonRowSchema = z.object({
  gas: z.string(),
  formula: z.string(),
  name: z.string(),
  /** the specification's content, mole fraction */
  targetFraction: z.number(),
  measuredFraction: z.number().nullable(),
  expandedUncertainty: z.number().nullable(),
  coverageFactor: z.number().nullable(),
  /** the unit QA entered the value in (display) */
  unit: CompositionUnitSchema,
  /** (measured − target)/target */
  deviationRelative: z.number().nullable(),
  /** the order line's blend tolerance, relative % */
  tolerancePct: z.number(),
  withinTolerance: z.boolean().nullable(),
  /** U/measured, relative % */
  uncertaintyRelativePct: z.number().nullable(),
  /** the order line's certification uncertainty, relative % */
  uncertaintyLimitPct: z.number(),
  uncertaintyWithinSpec: z.boolean().nullable(),
  /** blocked: out of tolerance, uncertainty too large or not entered; clear: within both */
  state: z.enum(['clear', 'blocked']),
  message: z.string(),
  instrument: z.string().nullable(),
  method: z.string().nullable(),
})
export type ComparisonRow = z.infer<typeof ComparisonRowSchema>

export const ComparisonSchema = z.object({
  rows: z.array(ComparisonRowSchema),
  balanceGas: z.object({ gas: z.string(), formula: z.string(), name: z.string() }),
  /** true when every component is entered, within tolerance and within the certification uncertainty */
  releasable: z.boolean(),
  blockers: z.array(z.string()),
})
export type Comparison = z.infer<typeof ComparisonSchema>

// ---- analysis, queue, workspace ------------------------------------------------------------------------

export const ANALYSIS_VERDICTS = ['pending', 'within-tolerance', 'out-of-tolerance', 'rejected', 'released'] as const
export const AnalysisVerdictSchema = z.enum(ANALYSIS_VERDICTS)
export type AnalysisVerdict = z.infer<typeof AnalysisVerdictSchema>
export const ANALYSIS_VERDICT_LABEL: Record<AnalysisVerdict, string> = {
  pending: 'Not yet entered',
  'within-tolerance': 'Within specification',
  'out-of-tolerance': 'Outside specification',
  rejected: 'Sent back for rework',
  released: 'Certificate released',
}

export const AnalysisResultSchema = z.object({
  gas: z.string(),
  value: z.number(),
  expandedUncertainty: z.number(),
  coverageFactor: z.number(),
  instrument: z.string(),
  method: z.string(),
  unit: CompositionUnitSchema,
})

export const ReportMetaSchema = z.object({
  originalName: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
})
export type ReportMeta = z.infer<typeof ReportMetaSchema>

export const AnalysisSchema = z.object({
  id: z.number().int(),
  runId: z.number().int(),
  verdict: AnalysisVerdictSchema,
  results: z.array(AnalysisResultSchema),
  rejectReason: z.string().nullable(),
  report: ReportMetaSchema.nullable(),
  analysedByName: z.string().nullable(),
  analysedAt: z.string().nullable(),
  version: z.number().int(),
})
export type Analysis = z.infer<typeof AnalysisSchema>

export const QaQueueItemSchema = z.object({
  runId: z.number().int(),
  analysisId: z.number().int().nullable(),
  verdict: AnalysisVerdictSchema.nullable(),
  cylinder: z.object({ id: z.number().int(), serial: z.string(), waterVolumeL: z.number() }),
  order: z.object({ id: z.number().int(), number: z.string(), customer: z.string() }),
  line: z.object({ id: z.number().int(), lineNo: z.number().int(), description: z.string() }),
  completedAt: z.string().nullable(),
  reportAttached: z.boolean(),
})
export type QaQueueItem = z.infer<typeof QaQueueItemSchema>

export const QaQueueSchema = z.object({
  /** completed runs whose analysis is not entered yet or is outside specification */
  awaitingAnalysis: z.array(QaQueueItemSchema),
  /** analysis within specification: a signature away from a certificate */
  readyToRelease: z.array(QaQueueItemSchema),
})
export type QaQueue = z.infer<typeof QaQueueSchema>

export const HazardSchema = z.object({
  /** the cylinder's hazard statement, printed on the certificate */
  statement: z.string(),
  /** short, risk-specific cautions in plain words */
  cautions: z.array(z.string()),
})
export type Hazard = z.infer<typeof HazardSchema>

export const ReleaseDefaultsSchema = z.object({
  validityMonths: z.number().int(),
  minimumUsePressureBarGauge: z.number(),
  storageMinC: z.number(),
  storageMaxC: z.number(),
  /** where the lower storage temperature comes from */
  storageMinSource: z.string(),
})
export type ReleaseDefaults = z.infer<typeof ReleaseDefaultsSchema>

// ---- certificates --------------------------------------------------------------------------------------

export const CertifiedComponentSchema = z.object({
  gas: z.string(),
  formula: z.string(),
  name: z.string(),
  /** certified value, mole fraction */
  fraction: z.number(),
  /** expanded uncertainty, mole fraction */
  expandedUncertainty: z.number(),
  coverageFactor: z.number(),
  unit: CompositionUnitSchema,
  /** as printed, in `unit` */
  valueText: z.string(),
  uncertaintyText: z.string(),
  instrument: z.string(),
  method: z.string(),
})
export type CertifiedComponent = z.infer<typeof CertifiedComponentSchema>

/** Everything printed on a certificate, frozen at release (ISO 6141 mandatory items and some optional ones). */
export const CertificateContentSchema = z.object({
  title: z.string(),
  number: z.string(),
  revision: z.number().int(),
  producer: z.object({ name: z.string(), address: z.string(), phone: z.string(), email: z.string() }),
  customer: z.object({ company: z.string(), contactName: z.string(), address: z.string() }),
  order: z.object({ number: z.string(), reference: z.string(), lineNo: z.number().int(), description: z.string() }),
  cylinder: z.object({
    serial: z.string(),
    barcode: z.string(),
    waterVolumeL: z.number(),
    material: z.string(),
    valveOutlet: z.string(),
    servicePressureBar: z.number(),
    nextTestDate: z.string(),
  }),
  filling: z.object({
    /** settled filling pressure, bar gauge at the reference temperature */
    pressureBarGauge: z.number(),
    referenceTemperatureC: z.number(),
    minimumUsePressureBarGauge: z.number(),
    storageMinC: z.number(),
    storageMaxC: z.number(),
  }),
  composition: z.array(CertifiedComponentSchema),
  balanceGas: z.object({ gas: z.string(), formula: z.string(), name: z.string() }),
  preparation: z.object({ method: z.enum(['partial-pressure', 'gravimetric']), label: z.string(), reference: z.string() }),
  analysis: z.object({ methods: z.array(z.string()), instruments: z.array(z.string()), reference: z.string() }),
  traceability: z.string(),
  /** ISO dates (yyyy-mm-dd); certifiedOn stays the first release's date across revisions, issuedOn is this revision's */
  dates: z.object({ preparedOn: z.string(), analysedOn: z.string(), certifiedOn: z.string(), issuedOn: z.string(), validUntil: z.string() }),
  signatory: z.object({ name: z.string(), email: z.string(), capacity: z.string() }),
  hazard: HazardSchema,
  /** set on a correction: which revision this one replaces and why */
  correction: z.object({ replacesRevision: z.number().int(), reason: z.string() }).nullable(),
})
export type CertificateContent = z.infer<typeof CertificateContentSchema>

export const CertificateSummarySchema = z.object({
  id: z.number().int(),
  number: z.string(),
  revision: z.number().int(),
  replacesId: z.number().int().nullable(),
  /** the newest revision of this number is current; older ones are superseded */
  current: z.boolean(),
  supersededById: z.number().int().nullable(),
  supersededByRevision: z.number().int().nullable(),
  orderId: z.number().int(),
  orderNumber: z.string(),
  customerId: z.number().int(),
  customerCompany: z.string(),
  cylinderSerial: z.string(),
  description: z.string(),
  releasedAt: z.string(),
  validUntil: z.string(),
  signatoryName: z.string(),
  correctionReason: z.string().nullable(),
})
export type CertificateSummary = z.infer<typeof CertificateSummarySchema>
export const CertificateListSchema = z.array(CertificateSummarySchema)

export const CertificateDetailSchema = CertificateSummarySchema.extend({
  content: CertificateContentSchema,
  /** every revision of this number, oldest first */
  revisions: z.array(CertificateSummarySchema),
})
export type CertificateDetail = z.infer<typeof CertificateDetailSchema>

export const CertificateListQuerySchema = z.strictObject({
  orderId: z.coerce.number().int().positive().optional(),
  /** only the current revision of each number */
  current: z.enum(['true', 'false']).optional(),
})
export type CertificateListQuery = z.infer<typeof CertificateListQuerySchema>

export const ReleaseResultSchema = z.object({
  certificate: CertificateSummarySchema,
  /** the customer's contact got the PDF by e-mail */
  emailed: z.boolean(),
  /** the order moved to "Certified" with this release (every cylinder of it is certified) */
  orderReleased: z.boolean(),
})
export type ReleaseResult = z.infer<typeof ReleaseResultSchema>

export const QaRunDetailSchema = z.object({
  run: z.object({
    id: z.number().int(),
    status: z.string(),
    startedAt: z.string().nullable(),
    completedAt: z.string().nullable(),
  }),
  cylinder: z.object({
    id: z.number().int(),
    serial: z.string(),
    waterVolumeL: z.number(),
    material: z.string(),
    valveOutlet: z.string(),
    servicePressureBar: z.number(),
    status: z.string(),
  }),
  order: z.object({ id: z.number().int(), number: z.string(), status: z.string(), customer: z.string(), reference: z.string() }),
  line: z.object({
    id: z.number().int(),
    lineNo: z.number().int(),
    description: z.string(),
    method: z.enum(['partial-pressure', 'gravimetric']),
    blendTolerancePct: z.number(),
    certificationUncertaintyPct: z.number(),
    finalPressureBarGauge: z.number(),
    components: z.array(z.object({ gas: z.string(), formula: z.string(), name: z.string(), fraction: z.number(), balance: z.boolean() })),
  }),
  analysis: AnalysisSchema.nullable(),
  comparison: ComparisonSchema,
  hazard: HazardSchema,
  releaseDefaults: ReleaseDefaultsSchema,
  certificates: z.array(CertificateSummarySchema),
})
export type QaRunDetail = z.infer<typeof QaRunDetailSchema>

export const RunIdParamsSchema = z.strictObject({ runId: z.coerce.number().int().positive() })
export const IdParamsSchema = z.strictObject({ id: z.coerce.number().int().positive() })

/** analysis report uploads */
export const REPORT_MAX_BYTES = 10 * 1024 * 1024
export const REPORT_TYPES = ['application/pdf', 'text/csv'] as const
