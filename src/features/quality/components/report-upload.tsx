import { useRef, useState } from 'react'
import { REPORT_MAX_BYTES, type QaRunDetail } from '#shared/schemas/quality.ts'
import { ApiError } from '#src/lib/api-client.ts'
import { reportHref } from '../api/quality-queries.ts'
import { useUploadReport } from '../api/upload-report.ts'

const sizeText = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`)

/** The analysis report as a file: PDF or CSV, at most 10 MB (the server checks the content too). */
export function ReportUpload({ detail, disabled }: { detail: QaRunDetail; disabled: boolean }) {
  const upload = useUploadReport(detail.run.id)
  const input = useRef<HTMLInputElement>(null)
  const [localError, setLocalError] = useState<string | null>(null)
  const report = detail.analysis?.report ?? null

  const onChange = (file: File | undefined) => {
    setLocalError(null)
    if (!file) return
    if (!/\.(pdf|csv)$/i.test(file.name)) return setLocalError('Choose a PDF or a CSV file.')
    if (file.size > REPORT_MAX_BYTES) return setLocalError(`The file is ${sizeText(file.size)}; the limit is 10 MB.`)
    upload.mutate(file, {
      onSettled: () => {
        if (input.current) input.current.value = ''
      },
    })
  }
  const serverError =
    upload.error instanceof ApiError ? upload.error.body.detail : upload.error ? 'Could not reach the server; the file was not stored. Try again.' : null

  return (
    <div className="space-y-3 text-sm">
      {report ? (
        <p>
          <a className="font-semibold text-copper-700 underline" href={reportHref(detail.run.id)}>
            {report.originalName}
          </a>{' '}
          <span className="text-ink-600">
            ({report.contentType === 'application/pdf' ? 'PDF' : 'CSV'}, {sizeText(report.sizeBytes)})
          </span>
        </p>
      ) : (
        <p className="text-ink-600">No report attached yet. Attach the instrument's report (PDF or CSV) as evidence for the certified values.</p>
      )}
      <div>
        <label htmlFor="qa-report-file" className="mb-1 block text-sm font-medium text-ink-800">
          {report ? 'Replace the report' : 'Attach the report'} (PDF or CSV, at most 10 MB)
        </label>
        <input
          ref={input}
          id="qa-report-file"
          type="file"
          accept=".pdf,.csv,application/pdf,text/csv"
          disabled={disabled || upload.isPending}
          onChange={(e) => onChange(e.target.files?.[0])}
          className="block w-full text-sm file:mr-3 file:min-h-10 file:rounded-md file:border file:border-ink-300 file:bg-white file:px-3 file:text-ink-800"
        />
      </div>
      {upload.isPending && (
        <p role="status" className="text-ink-700">
          Uploading and checking the file…
        </p>
      )}
      {(localError || serverError) && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-blocked-fg">
          {localError ?? serverError}
        </p>
      )}
    </div>
  )
}
