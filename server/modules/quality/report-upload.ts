import { randomUUID } from 'node:crypto'
import { mkdir, readFile, rm, writeFile } from 'node:fs/promises'
import { extname, resolve, sep } from 'node:path'
import multer from 'multer'
import Papa from 'papaparse'
import { REPORT_MAX_BYTES } from '#shared/schemas/quality.ts'
import { BadRequestError, HttpError, NotFoundError } from '../../lib/http-errors.ts'

/** The upload field of an analysis report. */
export const REPORT_FIELD = 'report'
const FOLDER = 'analysis-reports'

/**
 * Memory storage with hard limits: one file of at most 10 MB and nothing else. Filenames in part headers are
 * read as UTF-8. A larger file ends the request with 413 (the error handler maps multer's LIMIT_FILE_SIZE).
 */
export const reportUploadMiddleware = multer({
  storage: multer.memoryStorage(),
  defParamCharset: 'utf8',
  limits: { fileSize: REPORT_MAX_BYTES, files: 1, fields: 0, parts: 1, headerPairs: 20 },
}).single(REPORT_FIELD)

class UnsupportedReportError extends HttpError {
  constructor(message: string) {
    super(415, 'Unsupported file type', message, [{ field: REPORT_FIELD, message }])
  }
}

type Kind = 'pdf' | 'csv'
/** declared types accepted per kind (browsers on some systems declare CSV as the spreadsheet type) */
const DECLARED: Record<Kind, string[]> = {
  pdf: ['application/pdf'],
  csv: ['text/csv', 'application/csv', 'text/plain', 'application/vnd.ms-excel'],
}
const CONTENT_TYPE: Record<Kind, string> = { pdf: 'application/pdf', csv: 'text/csv' }

/** A PDF starts with the %PDF- header and ends with an %%EOF marker (ISO 32000-1 §7.5.2 and §7.5.5). */
function looksLikePdf(buf: Buffer): boolean {
  if (buf.length < 16 || buf.subarray(0, 5).toString('latin1') !== '%PDF-') return false
  const tail = buf.subarray(Math.max(0, buf.length - 2048)).toString('latin1')
  return tail.includes('%%EOF')
}

const isControl = (code: number) => code < 0x20 || code === 0x7f

/** Control characters other than tab, CR and LF (when `allowLineBreaks`) mean binary content. */
function hasControlCharacters(text: string, allowLineBreaks: boolean): boolean {
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i)
    if (allowLineBreaks && (code === 0x09 || code === 0x0a || code === 0x0d)) continue
    if (isControl(code)) return true
  }
  return false
}

/** Text CSV: valid UTF-8, no control characters but tab/CR/LF, and rows a CSV parser reads without quote errors. */
function looksLikeCsv(buf: Buffer): boolean {
  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(buf)
  } catch {
    return false
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1)
  if (!text.trim()) return false
  if (hasControlCharacters(text, true)) return false
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true, preview: 2000 })
  if (parsed.errors.some((e) => e.type === 'Quotes')) return false
  const rows = parsed.data
  return rows.length >= 1 && rows[0].length >= 2
}

/** The client's file name as metadata only: last path segment, no control characters, at most 255 characters. */
export function safeOriginalName(name: string, kind: Kind): string {
  const last = name.split(/[\\/]/).pop() ?? ''
  const cleaned = [...last]
    .filter((ch) => !isControl(ch.charCodeAt(0)) && ch !== '"')
    .join('')
    .replace(/^\.+/, '')
    .trim()
    .slice(0, 255)
  return cleaned || `report.${kind}`
}

export interface CheckedReport {
  kind: Kind
  contentType: string
  originalName: string
  buffer: Buffer
}

/** Accepts a PDF or CSV only when the extension, the declared type and the content all agree. */
export function checkReport(file: Express.Multer.File | undefined): CheckedReport {
  if (!file) throw new BadRequestError(`Attach the analysis report as the "${REPORT_FIELD}" field.`, [{ field: REPORT_FIELD, message: 'required' }])
  const ext = extname(file.originalname).toLowerCase()
  const kind: Kind | null = ext === '.pdf' ? 'pdf' : ext === '.csv' ? 'csv' : null
  if (!kind) throw new UnsupportedReportError('Only PDF (.pdf) or CSV (.csv) analysis reports are accepted.')
  const declared = (file.mimetype ?? '').split(';')[0].trim().toLowerCase()
  if (!DECLARED[kind].includes(declared)) throw new UnsupportedReportError(`A .${kind} file must be sent as ${DECLARED[kind].join(' or ')}, not "${declared}".`)
  if (file.size === 0 || file.buffer.length === 0) throw new UnsupportedReportError('The file is empty.')
  const ok = kind === 'pdf' ? looksLikePdf(file.buffer) : looksLikeCsv(file.buffer)
  if (!ok)
    throw new UnsupportedReportError(kind === 'pdf' ? 'The file is not a PDF document (its content does not match).' : 'The file is not a readable text CSV.')
  return { kind, contentType: CONTENT_TYPE[kind], originalName: safeOriginalName(file.originalname, kind), buffer: file.buffer }
}

/** Stores the bytes under the upload folder with a generated name; returns the stored name (relative). */
export async function storeReport(uploadDir: string, report: CheckedReport): Promise<string> {
  const dir = resolve(uploadDir, FOLDER)
  await mkdir(dir, { recursive: true })
  const storedName = `${FOLDER}/${randomUUID()}.${report.kind}`
  await writeFile(resolve(uploadDir, storedName), report.buffer, { flag: 'wx', mode: 0o640 })
  return storedName
}

/** Full path of a stored report, refusing anything that would leave the upload folder. */
export function reportPath(uploadDir: string, storedName: string): string {
  const root = resolve(uploadDir, FOLDER)
  const full = resolve(uploadDir, storedName)
  if (!full.startsWith(root + sep)) throw new NotFoundError('No report stored for this analysis.')
  return full
}

export async function readReport(uploadDir: string, storedName: string): Promise<Buffer> {
  try {
    return await readFile(reportPath(uploadDir, storedName))
  } catch (err) {
    if (err instanceof HttpError) throw err
    throw new NotFoundError('The stored report file is missing. Upload it again.')
  }
}

export async function removeReport(uploadDir: string, storedName: string): Promise<void> {
  await rm(reportPath(uploadDir, storedName), { force: true })
}
