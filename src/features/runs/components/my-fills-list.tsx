import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { RUN_STATUS_LABEL, type RunSummary } from '#shared/schemas/run.ts'
import { paths } from '#src/app/paths.ts'
import { Formula } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { EmptyState, ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { cn } from '#src/lib/cn.ts'
import { runQueries } from '../api/run-queries.ts'
import { formatPressure } from '../lib/display.ts'

function FillRow({ run }: { run: RunSummary }) {
  const { units } = useDisplayUnits()
  const done = run.status === 'completed'
  return (
    <li>
      <Link
        to={paths.runs.detail.href(run.id)}
        className={cn(
          'flex min-h-16 flex-wrap items-center gap-x-4 gap-y-1 rounded-card border-2 px-4 py-3 text-ink-900 hover:border-copper-500 focus-visible:border-copper-600',
          done ? 'border-ink-200 bg-ink-50' : 'border-ink-300 bg-white',
        )}
      >
        <span className="font-mono text-xl font-bold">{run.cylinder.serial}</span>
        <span className="text-base text-ink-700">
          {run.orderNumber ?? ''} · {run.description ?? ''} · {run.cylinder.waterVolumeL} L
        </span>
        <span className="ml-auto flex items-center gap-2 text-base">
          {run.needsReplanConfirmation && <SafetyBadge state="caution" label="Re-plan to confirm" />}
          <span className="font-semibold">{RUN_STATUS_LABEL[run.status]}</span>
          {!done && (
            <span className="num text-ink-700">
              step {Math.min(run.currentStep + 1, run.stepCount)}/{run.stepCount}
            </span>
          )}
        </span>
        {run.next && (
          <span className="w-full text-base text-ink-800">
            Next:{' '}
            {run.next.formula ? <Formula formula={run.next.formula} className="font-semibold" /> : <span className="font-semibold">{run.next.label}</span>} to{' '}
            <span className="num font-semibold">
              {formatPressure(units, run.next.cumulativeGaugePressure.value)} {units.pressure} g
            </span>
          </span>
        )}
      </Link>
    </li>
  )
}

/** "My fills today": big touch targets, refreshed while open. */
export function MyFillsList({ date }: { date?: string }) {
  const fills = useQuery(runQueries.mine(date))
  if (fills.isPending) return <SkeletonRows rows={3} />
  if (fills.isError) return <ErrorState error={fills.error} retry={() => void fills.refetch()} />
  if (fills.data.length === 0) {
    return (
      <EmptyState title="No fills assigned to you today">Fills the blender books for you appear here. Scan a cylinder's barcode to open its fill.</EmptyState>
    )
  }
  return (
    <ul className="space-y-3" aria-label="My fills">
      {fills.data.map((r) => (
        <FillRow key={r.id} run={r} />
      ))}
    </ul>
  )
}
