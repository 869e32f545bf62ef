import { useState } from 'react'
import { Link } from 'react-router-dom'
import { CYLINDER_CSV_COLUMNS, type CylinderImportPreview, type CylinderImportResult } from '#shared/schemas/cylinder.ts'
import { paths } from '#src/app/paths.ts'
import { Button } from '#src/components/ui/button.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, ErrorState, PageHeader } from '#src/components/ui/states.tsx'
import { cylinderTemplateHref } from '../api/cylinder-queries.ts'
import { useConfirmImport, usePreviewImport } from '../api/import-cylinders.ts'

function PreviewTable({ preview }: { preview: CylinderImportPreview | CylinderImportResult }) {
  return (
    <div className="max-h-[28rem] overflow-auto">
      <table className="w-full text-sm">
        <caption className="sr-only">Rows of the file with what is wrong in each</caption>
        <thead className="sticky top-0 bg-white">
          <tr className="border-b border-ink-300 text-left text-xs uppercase text-ink-600">
            <th className="px-2 py-1">Line</th>
            <th className="px-2 py-1">Check</th>
            <th className="px-2 py-1">Serial</th>
            <th className="px-2 py-1">Barcode</th>
            <th className="px-2 py-1 text-right">Volume</th>
            <th className="px-2 py-1 text-right">Service</th>
            <th className="px-2 py-1">Next test</th>
            <th className="px-2 py-1">What to fix</th>
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((r) => (
            <tr key={r.line} className="border-b border-ink-100 align-top">
              <td className="num px-2 py-1">{r.line}</td>
              <td className="px-2 py-1">
                {r.ok ? (
                  r.overdue ? (
                    <SafetyBadge state="caution" label="Imports, test overdue" />
                  ) : (
                    <SafetyBadge state="clear" label="Ready" />
                  )
                ) : (
                  <SafetyBadge state="blocked" label="Skipped" />
                )}
              </td>
              <td className="px-2 py-1 font-mono text-xs">{r.raw.serial}</td>
              <td className="px-2 py-1 font-mono text-xs">{r.raw.barcode}</td>
              <td className="num px-2 py-1 text-right">{r.raw.waterVolumeL}</td>
              <td className="num px-2 py-1 text-right">{r.raw.servicePressureBar}</td>
              <td className="num px-2 py-1">{r.raw.nextTestDate}</td>
              <td className="px-2 py-1 text-blocked-fg">
                {r.errors.map((e) => (
                  <div key={`${e.field}-${e.message}`}>
                    <span className="font-semibold">{e.field}:</span> {e.message}
                  </div>
                ))}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}

export function Component() {
  const [file, setFile] = useState<File | null>(null)
  const preview = usePreviewImport()
  const confirm = useConfirmImport()
  const result = confirm.data
  return (
    <div className="max-w-6xl space-y-5">
      <PageHeader
        title="Import cylinders from CSV"
        subtitle="Upload the file, check every row, then import. Nothing is saved until you confirm; rows with errors are skipped."
        actions={
          <a
            href={cylinderTemplateHref()}
            className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium text-ink-800 hover:bg-ink-100"
          >
            Download template
          </a>
        }
      />
      <Card title="1. Choose the file">
        <p className="mb-3 text-sm text-ink-700">
          One cylinder per line, the first line naming the columns (comma or semicolon separated, UTF-8, at most 512 KB and 2000 rows):{' '}
          {CYLINDER_CSV_COLUMNS.map((c) => `${c.header}${c.required ? '' : ' (optional)'}`).join(', ')}. Pressures in bar gauge, dates as yyyy-mm-dd.
        </p>
        <div className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col gap-1 text-sm font-medium text-ink-800">
            CSV file
            <input
              type="file"
              accept=".csv,text/csv"
              className="min-h-10 text-sm"
              onChange={(e) => {
                setFile(e.target.files?.[0] ?? null)
                preview.reset()
                confirm.reset()
              }}
            />
          </label>
          <Button disabled={!file || preview.isPending} onClick={() => file && preview.mutate(file)}>
            {preview.isPending ? 'Checking…' : 'Check rows'}
          </Button>
        </div>
        {preview.isPending && <div className="mt-3 h-1.5 w-full animate-pulse rounded bg-copper-200" role="progressbar" aria-label="Checking the file" />}
        {preview.isError && (
          <div className="mt-3">
            <ErrorState error={preview.error} />
          </div>
        )}
      </Card>
      {preview.data && !result && (
        <Card title="2. Check the rows">
          {preview.data.fileErrors.map((e) => (
            <p key={e} role="alert" className="mb-2 rounded border border-caution-border bg-caution-bg px-3 py-2 text-sm text-caution-fg">
              {e}
            </p>
          ))}
          {preview.data.rows.length === 0 ? (
            <EmptyState title="No rows to import">Fix the file as described above and check it again.</EmptyState>
          ) : (
            <>
              <p className="mb-2 text-sm text-ink-700">
                <span className="font-semibold">{preview.data.validCount}</span> row(s) ready, <span className="font-semibold">{preview.data.errorCount}</span>{' '}
                with errors (skipped).
              </p>
              <PreviewTable preview={preview.data} />
              <div className="mt-3 flex items-center gap-3">
                <Button disabled={preview.data.validCount === 0 || confirm.isPending || !file} onClick={() => file && confirm.mutate(file)}>
                  {confirm.isPending ? 'Importing…' : `Import ${preview.data.validCount} cylinder(s)`}
                </Button>
                {confirm.isError && <ErrorState error={confirm.error} />}
              </div>
            </>
          )}
        </Card>
      )}
      {result && (
        <Card title="Imported">
          <p role="status" className="mb-3 text-sm text-ink-800">
            {result.created} cylinder(s) added to the inventory; {result.skipped} row(s) skipped.
          </p>
          <Link to={paths.cylinders.list.href()} className="font-semibold text-copper-700 underline">
            Back to the inventory
          </Link>
        </Card>
      )}
    </div>
  )
}
