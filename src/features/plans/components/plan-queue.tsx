import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { paths } from '#src/app/paths.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { planQueries } from '../api/plan-queries.ts'

const LINE_STATE = {
  none: { state: 'caution' as const, label: 'No plan' },
  draft: { state: 'caution' as const, label: 'Awaiting approval' },
  approved: { state: 'clear' as const, label: 'Approved' },
}

/** Accepted orders whose lines lack an approved plan (live). */
export function OrdersNeedingPlan() {
  const q = useQuery(planQueries.queue())
  return (
    <Card title="Orders needing a fill plan">
      {q.isLoading ? (
        <SkeletonRows rows={3} />
      ) : q.isError ? (
        <ErrorState error={q.error} retry={() => q.refetch()} />
      ) : !q.data?.ordersNeedingPlan.length ? (
        <EmptyState title="Nothing to plan">Accepted orders appear here; open a line to build and approve its fill plan.</EmptyState>
      ) : (
        <ul className="divide-y divide-ink-100">
          {q.data.ordersNeedingPlan.map((o) => (
            <li key={o.orderId} className="py-2">
              <p className="text-sm font-semibold text-ink-900">
                {o.number} · {o.customer}
                {o.neededBy && <span className="ml-2 text-xs font-normal text-ink-600">needed by {o.neededBy}</span>}
              </p>
              <ul className="mt-1 space-y-1">
                {o.lines.map((l) => (
                  <li key={l.id} className="flex flex-wrap items-center gap-2 text-sm">
                    <SafetyBadge state={LINE_STATE[l.planState].state} label={LINE_STATE[l.planState].label} />
                    <span className="min-w-0 flex-1">
                      Line {l.lineNo}: {l.description}
                    </span>
                    {l.planState !== 'approved' && (
                      <Link className="font-semibold text-copper-700 underline" to={paths.plans.new.href(l.id)}>
                        Plan line {l.lineNo}
                      </Link>
                    )}
                  </li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      )}
    </Card>
  )
}

/** Plans computed and waiting for the blender's approval (live). */
export function PlansAwaitingApproval() {
  const q = useQuery(planQueries.queue())
  return (
    <Card title="Plans awaiting approval">
      {q.isLoading ? (
        <SkeletonRows rows={3} />
      ) : q.isError ? (
        <ErrorState error={q.error} retry={() => q.refetch()} />
      ) : !q.data?.awaitingApproval.length ? (
        <EmptyState title="No plan waiting">Plans you save for an order line wait here until you approve them.</EmptyState>
      ) : (
        <ul className="divide-y divide-ink-100">
          {q.data.awaitingApproval.map((p) => (
            <li key={p.id} className="flex flex-wrap items-center gap-2 py-2 text-sm">
              {p.blocking ? <SafetyBadge state="blocked" label="Blocked" /> : <SafetyBadge state="caution" label="To review" />}
              <Link className="min-w-0 flex-1 font-medium text-copper-700 underline" to={paths.plans.detail.href(p.id)}>
                {p.orderNumber} line {p.lineNo} · v{p.planVersion} · {p.lineDescription}
              </Link>
              <span className="text-xs text-ink-600">{p.customer}</span>
              {p.blocking && p.blockingReason && <p className="w-full text-xs text-blocked-fg">{p.blockingReason}</p>}
            </li>
          ))}
        </ul>
      )}
    </Card>
  )
}
