import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { ANALYSIS_VERDICT_LABEL, type QaQueueItem } from '#shared/schemas/quality.ts'
import { paths } from '#src/app/paths.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { qualityQueries } from '../api/quality-queries.ts'
import { dateTimeText } from './format.ts'

function QueueList({ items, label }: { items: QaQueueItem[]; label: string }) {
  return (
    <ul aria-label={label} className="divide-y divide-ink-100">
      {items.map((i) => (
        <li key={i.runId} className="flex flex-wrap items-center justify-between gap-2 py-2">
          <div className="min-w-0">
            <Link to={paths.quality.run.href(i.runId)} className="font-mono text-sm font-semibold text-ink-900 underline-offset-2 hover:underline">
              {i.cylinder.serial}
            </Link>
            <span className="ml-2 text-sm text-ink-700">
              {i.order.number} · line {i.line.lineNo} · {i.order.customer}
            </span>
            <p className="truncate text-xs text-ink-600">
              {i.line.description} · filled {dateTimeText(i.completedAt)}
              {i.reportAttached ? ' · report attached' : ''}
            </p>
          </div>
          {i.verdict === 'out-of-tolerance' ? (
            <SafetyBadge state="blocked" label="Outside specification" />
          ) : i.verdict === 'within-tolerance' ? (
            <SafetyBadge state="clear" label="Within specification" />
          ) : (
            <span className="text-xs text-ink-600">{i.verdict ? ANALYSIS_VERDICT_LABEL[i.verdict] : 'Not analysed yet'}</span>
          )}
        </li>
      ))}
    </ul>
  )
}

type Pick = 'awaitingAnalysis' | 'readyToRelease'

function QueuePanel({ pick, title, empty, label }: { pick: Pick; title: string; empty: { title: string; text: string }; label: string }) {
  const q = useQuery(qualityQueries.queue())
  return (
    <Card title={`${title}${q.data ? ` (${q.data[pick].length})` : ''}`}>
      {q.isPending ? (
        <SkeletonRows rows={3} />
      ) : q.isError ? (
        <ErrorState error={q.error} retry={() => q.refetch()} />
      ) : q.data[pick].length === 0 ? (
        <EmptyState title={empty.title}>{empty.text}</EmptyState>
      ) : (
        <QueueList items={q.data[pick]} label={label} />
      )}
    </Card>
  )
}

/** QA's live queue: completed fill runs whose analysis is not entered yet or is outside specification. */
export function QaAwaitingPanel() {
  return (
    <QueuePanel
      pick="awaitingAnalysis"
      title="Awaiting analysis"
      label="Cylinders awaiting analysis"
      empty={{ title: 'No cylinders awaiting analysis', text: 'Cylinders appear here when the technician completes their fill run.' }}
    />
  )
}

/** QA's live queue: analyses within specification, a signature away from a certificate. */
export function QaReadyPanel() {
  return (
    <QueuePanel
      pick="readyToRelease"
      title="Ready to release"
      label="Analyses ready to release"
      empty={{
        title: 'Nothing to sign',
        text: 'A cylinder appears here once its analysis is within specification; open it to preview and sign the certificate.',
      }}
    />
  )
}
