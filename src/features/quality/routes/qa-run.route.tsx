import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { Link, type LoaderFunctionArgs, useParams } from 'react-router-dom'
import { ANALYSIS_VERDICT_LABEL, type ReleaseResult } from '#shared/schemas/quality.ts'
import { paths } from '#src/app/paths.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { certificatePdfHref, qualityQueries } from '../api/quality-queries.ts'
import { AnalysisForm } from '../components/analysis-form.tsx'
import { ComparisonTable } from '../components/comparison-table.tsx'
import { dateTimeText } from '../components/format.ts'
import { HazardBox } from '../components/hazard-box.tsx'
import { RejectPanel } from '../components/reject-panel.tsx'
import { ReleaseNotice, ReleasePanel } from '../components/release-panel.tsx'
import { ReportUpload } from '../components/report-upload.tsx'

function runIdOf(raw: string | undefined): number {
  const n = Number(raw)
  return Number.isInteger(n) && n > 0 ? n : 0
}

export async function loader({ params }: LoaderFunctionArgs) {
  const id = runIdOf(params.runId)
  if (id) void queryClient.prefetchQuery(qualityQueries.run(id))
  return null
}

const FILL_METHOD = { gravimetric: 'Gravimetric (ISO 6142-1)', 'partial-pressure': 'Partial pressure (ISO 6146)' } as const

/** One filled cylinder at the QA desk: specification and analysis side by side, the report, then release or rework. */
export function Component() {
  const runId = runIdOf(useParams().runId)
  const q = useQuery({ ...qualityQueries.run(runId), enabled: runId > 0 })
  const [released, setReleased] = useState<ReleaseResult | null>(null)
  if (!runId) return <ErrorState error={new Error('This address does not name a fill run.')} />
  if (q.isPending) return <SkeletonRows rows={8} />
  if (q.isError) return <ErrorState error={q.error} retry={() => q.refetch()} />
  const d = q.data
  const verdict = d.analysis?.verdict ?? null
  const closed = verdict === 'released' || verdict === 'rejected'
  return (
    <div className="space-y-5">
      <PageHeader
        title={`Cylinder ${d.cylinder.serial}`}
        subtitle={`${d.order.number}, line ${d.line.lineNo} for ${d.order.customer}: ${d.line.description}. Filled ${dateTimeText(d.run.completedAt)}.`}
        actions={
          <Link
            to={paths.quality.queue.href()}
            className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium text-ink-800 hover:bg-ink-100"
          >
            Back to the queue
          </Link>
        }
      />
      <div className="flex flex-wrap items-center gap-3 text-sm">
        {verdict === 'within-tolerance' || verdict === 'released' ? (
          <SafetyBadge state="clear" label={ANALYSIS_VERDICT_LABEL[verdict]} />
        ) : verdict === 'out-of-tolerance' || verdict === 'rejected' ? (
          <SafetyBadge state="blocked" label={ANALYSIS_VERDICT_LABEL[verdict]} />
        ) : (
          <span className="text-ink-700">{ANALYSIS_VERDICT_LABEL.pending}</span>
        )}
        <span className="text-ink-700">
          {FILL_METHOD[d.line.method]} · blend tolerance ±{d.line.blendTolerancePct} % · certification uncertainty {d.line.certificationUncertaintyPct} % (k =
          2) · {d.line.finalPressureBarGauge} bar gauge at 15 °C · {d.cylinder.waterVolumeL} L {d.cylinder.material}, {d.cylinder.valveOutlet}
        </span>
      </div>
      {released && <ReleaseNotice result={released} orderNumber={d.order.number} />}
      {verdict === 'rejected' && d.analysis?.rejectReason && (
        <p role="status" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          Sent back for rework: {d.analysis.rejectReason}
        </p>
      )}
      <HazardBox hazard={d.hazard} />
      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="space-y-5">
          <Card title="Analysis against specification">
            <ComparisonTable comparison={d.comparison} />
          </Card>
          <Card title={closed ? 'Analysis (closed)' : 'Enter the analysis'}>
            <AnalysisForm key={`${d.analysis?.id ?? 'new'}-${d.analysis?.version ?? 0}`} detail={d} disabled={closed} />
          </Card>
        </div>
        <div className="space-y-5">
          <Card title="Analysis report">
            <ReportUpload detail={d} disabled={closed} />
          </Card>
          {d.certificates.length > 0 ? (
            <Card title="Certificate">
              <ul className="space-y-1 text-sm">
                {d.certificates.map((c) => (
                  <li key={c.id}>
                    <a className="font-semibold text-copper-700 underline" href={certificatePdfHref(c.id)}>
                      {c.number} rev. {c.revision}
                    </a>{' '}
                    {c.current ? (
                      <SafetyBadge state="clear" label="Current" />
                    ) : (
                      <span className="text-xs text-ink-600">superseded by rev. {c.supersededByRevision}</span>
                    )}
                  </li>
                ))}
              </ul>
              <Link className="mt-2 inline-block text-sm underline" to={paths.certificates.href()}>
                All certificates and corrections
              </Link>
            </Card>
          ) : verdict === 'rejected' ? (
            <Card title="Release">
              <EmptyState title="Closed">The cylinder went back for rework. Its next fill run comes back to this queue.</EmptyState>
            </Card>
          ) : (
            <>
              <Card title="Release the certificate">
                <ReleasePanel detail={d} onReleased={setReleased} />
              </Card>
              <Card title="Send back for rework">
                <RejectPanel detail={d} disabled={closed} />
              </Card>
            </>
          )}
        </div>
      </div>
    </div>
  )
}

export function ErrorBoundary() {
  return <ErrorState error={new Error('This cylinder could not be loaded. Go back to the queue and open it again.')} retry={() => window.location.reload()} />
}
