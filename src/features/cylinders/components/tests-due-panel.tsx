import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { paths } from '#src/app/paths.ts'
import { Card, EmptyState, ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { cylinderQueries } from '../api/cylinder-queries.ts'
import { UsabilityBadge } from './cylinder-badges.tsx'

const FILTERS = { test: 'due-soon', sort: 'nextTestDate', dir: 'asc', limit: 12 } as const

/** Home panel: cylinders whose periodic test is overdue (blocked) or due within 90 days, soonest first. */
export function TestsDuePanel() {
  const due = useQuery(cylinderQueries.list(FILTERS))
  return (
    <Card
      title="Cylinders due for their periodic test"
      actions={
        <Link to={`${paths.cylinders.list.href()}?test=due-soon&sort=nextTestDate`} className="text-sm font-semibold text-copper-700 underline">
          All
        </Link>
      }
    >
      {due.isPending ? (
        <SkeletonRows rows={3} />
      ) : due.isError ? (
        <ErrorState error={due.error} retry={() => void due.refetch()} />
      ) : due.data.items.length === 0 ? (
        <EmptyState title="No test due in the next 90 days">
          Cylinders appear here 90 days before their next periodic test, and stay blocked once it has passed.
        </EmptyState>
      ) : (
        <ul className="divide-y divide-ink-100 text-sm">
          {due.data.items.map((c) => (
            <li key={c.id} className="flex min-h-12 items-center gap-3 py-1">
              <Link to={paths.cylinders.detail.href(c.id)} className="font-mono font-semibold underline-offset-2 hover:underline">
                {c.serial}
              </Link>
              <span className="num text-ink-700">due {c.nextTestDate}</span>
              <span className="text-ink-600">{c.ownerName ?? 'shop'}</span>
              <span className="ml-auto">
                <UsabilityBadge cylinder={c} />
              </span>
            </li>
          ))}
          {due.data.total > due.data.items.length && <li className="py-2 text-ink-600">and {due.data.total - due.data.items.length} more</li>}
        </ul>
      )}
    </Card>
  )
}
