import { useQuery } from '@tanstack/react-query'
import { ScrollRegion } from '#src/components/scroll-region.tsx'
import { Link } from 'react-router-dom'
import { MODEL_LABEL } from '#shared/schemas/gas.ts'
import { PLAN_STATUS_LABEL } from '#shared/schemas/plan.ts'
import { paths } from '#src/app/paths.ts'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { planQueries } from '../api/plan-queries.ts'
import { OrdersNeedingPlan, PlansAwaitingApproval } from '../components/plan-queue.tsx'

export async function loader() {
  void queryClient.prefetchQuery(planQueries.list({ limit: 50 }))
  return null
}

function RecentPlans() {
  const list = useQuery(planQueries.list({ limit: 50 }))
  if (list.isLoading) return <SkeletonRows rows={6} />
  if (list.isError) return <ErrorState error={list.error} retry={() => list.refetch()} />
  const items = list.data?.items ?? []
  if (!items.length) return <EmptyState title="No plans yet">Plans appear here once you save one for an order line.</EmptyState>
  return (
    <ScrollRegion label="Recent plans table">
      <table className="w-full text-sm">
        <caption className="sr-only">Recent fill plans</caption>
        <thead>
          <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-2">
              Order / line
            </th>
            <th scope="col" className="py-2 pr-2">
              Mixture
            </th>
            <th scope="col" className="py-2 pr-2">
              Version
            </th>
            <th scope="col" className="py-2 pr-2">
              Model
            </th>
            <th scope="col" className="py-2 pr-2">
              Cylinder
            </th>
            <th scope="col" className="py-2">
              Status
            </th>
          </tr>
        </thead>
        <tbody>
          {items.map((p) => (
            <tr key={p.id} className="border-b border-ink-100">
              <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                <Link className="font-medium text-copper-700 underline" to={paths.plans.detail.href(p.id)}>
                  {p.orderNumber} · {p.lineNo}
                </Link>
                <span className="block text-xs text-ink-600">{p.customer}</span>
              </th>
              <td className="py-1.5 pr-2">{p.lineDescription}</td>
              <td className="num py-1.5 pr-2">v{p.planVersion}</td>
              <td className="py-1.5 pr-2">{MODEL_LABEL[p.model]}</td>
              <td className="py-1.5 pr-2">{p.cylinderSerial ?? '—'}</td>
              <td className="py-1.5">
                <SafetyBadge
                  state={p.status === 'approved' ? 'clear' : p.status === 'superseded' || p.blocking ? 'blocked' : 'caution'}
                  label={p.blocking && p.status === 'draft' ? 'Blocked' : PLAN_STATUS_LABEL[p.status]}
                />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  )
}

export function Component() {
  return (
    <div>
      <PageHeader
        title="Fill plans"
        subtitle="Orders waiting for a plan, plans waiting for approval, and every plan made."
        actions={
          <Link
            className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium text-ink-800 hover:bg-ink-100"
            to={paths.plans.new.href()}
          >
            Ad-hoc plan
          </Link>
        }
      />
      <div className="grid gap-5 lg:grid-cols-2">
        <OrdersNeedingPlan />
        <PlansAwaitingApproval />
        <Card title="Recent plans" className="lg:col-span-2">
          <RecentPlans />
        </Card>
      </div>
    </div>
  )
}
