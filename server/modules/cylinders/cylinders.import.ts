import type { EntityManager } from '@mikro-orm/core'
import type { RequestHandler } from 'express'
import multer from 'multer'
import Papa from 'papaparse'
import type { SessionUser } from '#shared/schemas/auth.ts'
import {
  CYLINDER_CSV_COLUMNS,
  type CylinderImportPreview,
  type CylinderImportResult,
  type CylinderImportRow,
  CylinderInputSchema,
  localIsoDate,
} from '#shared/schemas/cylinder.ts'
import { audit } from '../../lib/audit.ts'
import { BadRequestError, HttpError, UnprocessableError } from '../../lib/http-errors.ts'
import { CustomerSchema } from '../customers/customer.entity.ts'
import { CylinderSchema } from './cylinder.entity.ts'

/** Limits of one import file. */
export const IMPORT_MAX_BYTES = 512 * 1024
export const IMPORT_MAX_ROWS = 2000
export const IMPORT_TYPES = ['text/csv', 'application/csv', 'text/plain', 'application/vnd.ms-excel']

/** multer with memory storage: one CSV file in the field `file`, size and type checked before the handler runs. */
export const csvUpload: RequestHandler = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: IMPORT_MAX_BYTES, files: 1, fields: 4, parts: 6 },
  fileFilter: (_req, file, cb) => {
    const typeOk = IMPORT_TYPES.includes(file.mimetype.toLowerCase()) || file.mimetype === 'application/octet-stream'
    if (!typeOk || !/\.(csv|txt)$/i.test(file.originalname)) {
      cb(
        new HttpError(415, 'Unsupported file type', `Upload a CSV file (.csv, comma or semicolon separated); "${file.originalname}" is ${file.mimetype}.`, [
          { field: 'file', message: 'Not a CSV file.' },
        ]),
      )
      return
    }
    cb(null, true)
  },
}).single('file')

type ColumnKey = (typeof CYLINDER_CSV_COLUMNS)[number]['key']

const normalise = (h: string) => h.toLowerCase().replace(/[^a-z0-9]/g, '')
const HEADER_TO_KEY = new Map<string, ColumnKey>()
for (const c of CYLINDER_CSV_COLUMNS) {
  HEADER_TO_KEY.set(normalise(c.header), c.key)
  HEADER_TO_KEY.set(normalise(c.key), c.key)
}
// a few spellings people use in their own sheets
HEADER_TO_KEY.set('serialnumber', 'serial')
HEADER_TO_KEY.set('watervolume', 'waterVolumeL')
HEADER_TO_KEY.set('volumel', 'waterVolumeL')
HEADER_TO_KEY.set('servicepressure', 'servicePressureBar')
HEADER_TO_KEY.set('workingpressurebar', 'servicePressureBar')
HEADER_TO_KEY.set('testpressure', 'testPressureBar')
HEADER_TO_KEY.set('valve', 'valveOutlet')
HEADER_TO_KEY.set('o2clean', 'oxygenClean')
HEADER_TO_KEY.set('owner', 'ownerCode')
HEADER_TO_KEY.set('lasttest', 'lastTestDate')
HEADER_TO_KEY.set('nexttest', 'nextTestDate')

const HEADER_OF: Record<ColumnKey, string> = Object.fromEntries(CYLINDER_CSV_COLUMNS.map((c) => [c.key, c.header])) as Record<ColumnKey, string>

/** The file as text: UTF-8 only (with or without BOM), no binary content. */
export function decodeCsv(buffer: Buffer): string {
  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(buffer)
  } catch {
    throw new HttpError(415, 'Unsupported file type', 'The file is not UTF-8 text. Save the sheet as "CSV UTF-8" and upload it again.', [
      { field: 'file', message: 'Not UTF-8 text.' },
    ])
  }
  if (text.includes('\u0000'))
    throw new HttpError(415, 'Unsupported file type', 'The file holds binary data, not CSV text.', [{ field: 'file', message: 'Not a CSV file.' }])
  return text.replace(/^\uFEFF/, '')
}

function parseNumber(cell: string): number | undefined {
  const t = cell.trim().replace(/\s/g, '')
  if (!t) return undefined
  // a decimal comma ("12,5") is read as a decimal point; thousands separators are not accepted
  const normalised = /^-?\d+,\d+$/.test(t) ? t.replace(',', '.') : t
  if (!/^-?(\d+\.?\d*|\.\d+)(e-?\d+)?$/i.test(normalised)) return Number.NaN
  return Number(normalised)
}

function parseBoolean(cell: string): boolean | undefined {
  const t = cell.trim().toLowerCase()
  if (t === '') return false
  if (['yes', 'y', 'true', '1', 'x'].includes(t)) return true
  if (['no', 'n', 'false', '0'].includes(t)) return false
  return undefined
}

interface ParsedFile {
  rows: CylinderImportRow[]
  fileErrors: string[]
}

/**
 * Reads the file row by row: each row is checked against the same zod schema as the form, the owner code
 * against the customers, and serial and barcode against the inventory and the rows above it.
 * Writes nothing.
 */
export async function parseCylinderCsv(em: EntityManager, buffer: Buffer): Promise<ParsedFile> {
  const text = decodeCsv(buffer)
  const parsed = Papa.parse<Record<string, string>>(text, {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim(),
    delimitersToGuess: [',', ';', '\t'],
  })
  const fileErrors: string[] = []
  const headers = (parsed.meta.fields ?? []).filter((h) => h !== '')
  const keyOf = new Map<string, ColumnKey>()
  const unknown: string[] = []
  for (const h of headers) {
    const key = HEADER_TO_KEY.get(normalise(h))
    if (key) keyOf.set(h, key)
    else unknown.push(h)
  }
  const present = new Set(keyOf.values())
  const missing = CYLINDER_CSV_COLUMNS.filter((c) => c.required && !present.has(c.key)).map((c) => c.header)
  if (missing.length)
    fileErrors.push(`Missing column${missing.length > 1 ? 's' : ''}: ${missing.join(', ')}. The first line must name the columns (download the template).`)
  if (unknown.length) fileErrors.push(`Column${unknown.length > 1 ? 's' : ''} not used: ${unknown.join(', ')}.`)
  if (parsed.data.length > IMPORT_MAX_ROWS) {
    throw new UnprocessableError(`The file has ${parsed.data.length} rows; import at most ${IMPORT_MAX_ROWS} at a time.`, [
      { field: 'file', message: 'Too many rows.' },
    ])
  }
  if (missing.length || parsed.data.length === 0) {
    if (parsed.data.length === 0) fileErrors.push('The file has no data rows below the header line.')
    return { rows: [], fileErrors }
  }

  const customers = await em.find(CustomerSchema, {})
  const customerByCode = new Map(customers.map((c) => [c.code.toLowerCase(), c]))
  const rawRows = parsed.data.map((record) => {
    const raw: Record<string, string> = {}
    for (const [h, v] of Object.entries(record)) {
      const key = keyOf.get(h)
      if (key) raw[key] = typeof v === 'string' ? v.trim() : ''
    }
    return raw
  })
  const serials = rawRows.map((r) => r.serial).filter(Boolean)
  const barcodes = rawRows.map((r) => r.barcode).filter(Boolean)
  const existing =
    serials.length || barcodes.length ? await em.find(CylinderSchema, { $or: [{ serial: { $in: serials } }, { barcode: { $in: barcodes } }] }) : []
  const takenSerials = new Set(existing.map((c) => c.serial))
  const takenBarcodes = new Set(existing.map((c) => c.barcode))
  const rowErrorsOf = new Map<number, number>()
  for (const e of parsed.errors) if (typeof e.row === 'number') rowErrorsOf.set(e.row, (rowErrorsOf.get(e.row) ?? 0) + 1)
  const today = localIsoDate()

  const rows: CylinderImportRow[] = rawRows.map((raw, i) => {
    const line = i + 2
    const errors: { field: string; message: string }[] = []
    if (rowErrorsOf.has(i)) errors.push({ field: '(row)', message: 'The row does not have the same number of cells as the header line.' })
    const numberCell = (key: ColumnKey) => {
      const n = parseNumber(raw[key] ?? '')
      if (n !== undefined && Number.isNaN(n)) errors.push({ field: HEADER_OF[key], message: `"${raw[key]}" is not a number.` })
      return n === undefined || Number.isNaN(n) ? undefined : n
    }
    const oxygenClean = parseBoolean(raw.oxygenClean ?? '')
    if (oxygenClean === undefined) errors.push({ field: HEADER_OF.oxygenClean, message: `"${raw.oxygenClean}" is not yes or no.` })
    const ownerCode = (raw.ownerCode ?? '').trim()
    const owner = ownerCode ? customerByCode.get(ownerCode.toLowerCase()) : undefined
    if (ownerCode && !owner) errors.push({ field: HEADER_OF.ownerCode, message: `No customer with code "${ownerCode}".` })
    const candidate = {
      serial: raw.serial ?? '',
      barcode: raw.barcode ?? '',
      waterVolumeL: numberCell('waterVolumeL'),
      servicePressureBar: numberCell('servicePressureBar'),
      testPressureBar: numberCell('testPressureBar'),
      material: (raw.material ?? '').toLowerCase() === 'aluminum' ? 'aluminium' : (raw.material ?? '').toLowerCase(),
      valveOutlet: raw.valveOutlet ?? '',
      oxygenClean: oxygenClean ?? false,
      ownerId: owner?.id ?? null,
      lastTestDate: raw.lastTestDate ?? '',
      nextTestDate: raw.nextTestDate ?? '',
      notes: raw.notes ?? '',
    }
    const result = CylinderInputSchema.safeParse(candidate)
    if (!result.success) {
      for (const issue of result.error.issues) {
        const key = String(issue.path[0] ?? '') as ColumnKey
        const field = HEADER_OF[key] ?? key
        // a number cell already reported as "not a number" need not be reported twice
        if (errors.some((e) => e.field === field)) continue
        const message = issue.code === 'invalid_type' && (candidate as Record<string, unknown>)[key] === undefined ? 'Required.' : issue.message
        errors.push({ field, message })
      }
    }
    const serial = candidate.serial.trim()
    const barcode = candidate.barcode.trim()
    if (serial) {
      if (takenSerials.has(serial))
        errors.push({
          field: 'serial',
          message: existing.some((c) => c.serial === serial) ? `Serial ${serial} is already in the inventory.` : `Serial ${serial} appears on an earlier line.`,
        })
      takenSerials.add(serial)
    }
    if (barcode) {
      if (takenBarcodes.has(barcode))
        errors.push({
          field: 'barcode',
          message: existing.some((c) => c.barcode === barcode)
            ? `Barcode ${barcode} is already in the inventory.`
            : `Barcode ${barcode} appears on an earlier line.`,
        })
      takenBarcodes.add(barcode)
    }
    const ok = errors.length === 0 && result.success
    const values = ok && result.success ? { ...result.data, ownerCode: owner?.code ?? null } : null
    return {
      line,
      ok,
      raw,
      values: values
        ? {
            serial: values.serial,
            barcode: values.barcode,
            waterVolumeL: values.waterVolumeL,
            servicePressureBar: values.servicePressureBar,
            testPressureBar: values.testPressureBar,
            material: values.material,
            valveOutlet: values.valveOutlet,
            oxygenClean: values.oxygenClean,
            ownerId: values.ownerId,
            ownerCode: values.ownerCode,
            lastTestDate: values.lastTestDate,
            nextTestDate: values.nextTestDate,
            notes: values.notes,
          }
        : null,
      errors,
      overdue: !!values && values.nextTestDate < today,
    }
  })
  return { rows, fileErrors }
}

export function requireFile(file: Express.Multer.File | undefined): Express.Multer.File {
  if (!file) throw new BadRequestError('Choose a CSV file to upload (form field "file").', [{ field: 'file', message: 'Required.' }])
  return file
}

export async function previewImport(em: EntityManager, file: Express.Multer.File): Promise<CylinderImportPreview> {
  const { rows, fileErrors } = await parseCylinderCsv(em, file.buffer)
  const validCount = rows.filter((r) => r.ok).length
  return { fileName: file.originalname, rows, validCount, errorCount: rows.length - validCount, fileErrors }
}

/** Saves every valid row of the file in one transaction; rows with errors are skipped and reported. */
export async function confirmImport(em: EntityManager, user: SessionUser, file: Express.Multer.File): Promise<CylinderImportResult> {
  return em.transactional(async (tx) => {
    const { rows, fileErrors } = await parseCylinderCsv(tx, file.buffer)
    const valid = rows.filter((r) => r.ok && r.values)
    if (valid.length === 0) {
      throw new UnprocessableError(fileErrors[0] ?? 'No row of the file can be imported; correct the rows shown in the preview.', [
        { field: 'file', message: 'No valid rows.' },
      ])
    }
    const created = valid.map((r) => {
      const v = r.values!
      return tx.create(CylinderSchema, {
        serial: v.serial,
        barcode: v.barcode,
        waterVolumeL: v.waterVolumeL,
        servicePressureBar: v.servicePressureBar,
        testPressureBar: v.testPressureBar,
        material: v.material,
        valveOutlet: v.valveOutlet,
        oxygenClean: v.oxygenClean,
        owner: v.ownerId === null ? null : tx.getReference(CustomerSchema, v.ownerId),
        lastTestDate: v.lastTestDate,
        nextTestDate: v.nextTestDate,
        status: 'available',
        residual: { kind: 'evacuated' },
        notes: v.notes,
      })
    })
    await tx.flush()
    audit(tx, user, 'cylinder.import', 'Cylinder', created[0].id, {
      file: file.originalname,
      created: created.length,
      skipped: rows.length - valid.length,
      serials: created.map((c) => c.serial),
    })
    await tx.flush()
    return { created: created.length, skipped: rows.length - valid.length, createdIds: created.map((c) => c.id), rows }
  })
}

/** The template: the header line and one example row. */
export function importTemplateCsv(): string {
  const header = CYLINDER_CSV_COLUMNS.map((c) => c.header).join(',')
  const example = ['KR-S50-2001', 'FW200001', '50', '200', '300', 'steel', 'DIN 477 No. 10', 'no', '', '2024-03-01', '2034-03-01', ''].join(',')
  return `${header}\n${example}\n`
}
