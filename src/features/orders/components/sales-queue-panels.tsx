import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import type { OrderSort } from '#shared/schemas/order.ts'
import type { OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { formatMoney } from '#shared/schemas/pricing.ts'
import { paths } from '#src/app/paths.ts'
import { formatDate } from '#src/components/order/format.ts'
import { Card, EmptyState, ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { orderQueries } from '../api/order-queries.ts'

interface Queue {
  key: string
  title: string
  status: OrderStatus
  sort: OrderSort
  empty: string
  emptyHint: string
  /** the date shown per row */
  when: 'created' | 'neededBy'
}

/** The sales desk's work: what to quote, what waits on the customer, what to ship and what to invoice. */
export const SALES_QUEUES: Queue[] = [
  {
    key: 'draft',
    title: 'Specifications to quote',
    status: 'draft',
    sort: 'created',
    empty: 'Nothing to quote',
    emptyHint: 'New specifications appear here until their quote is sent.',
    when: 'created',
  },
  {
    key: 'quoted',
    title: 'Quotes awaiting an answer',
    status: 'quoted',
    sort: 'created',
    empty: 'No quotes waiting',
    emptyHint: 'Sent quotes wait here until the customer accepts or declines.',
    when: 'created',
  },
  {
    key: 'released',
    title: 'Certified, ready to ship',
    status: 'released',
    sort: 'neededBy',
    empty: 'Nothing to ship',
    emptyHint: 'Orders appear here once QA releases their certificates.',
    when: 'neededBy',
  },
  {
    key: 'shipped',
    title: 'Shipped, to invoice',
    status: 'shipped',
    sort: 'created',
    empty: 'Nothing to invoice',
    emptyHint: 'Shipped orders wait here until they are invoiced.',
    when: 'created',
  },
]

function QueuePanel({ queue }: { queue: Queue }) {
  const list = useQuery(orderQueries.list({ status: queue.status, sort: queue.sort, limit: 5 }))
  const total = list.data?.total ?? 0
  const seeAll = `${paths.orders.list.href()}?status=${queue.status}&sort=${queue.sort}`
  return (
    <Card
      title={
        <>
          {queue.title}
          {list.data && <span className="num ml-2 rounded-full bg-ink-100 px-2 py-0.5 text-xs text-ink-800">{total}</span>}
        </>
      }
      actions={
        total > 0 && (
          <Link to={seeAll} className="text-sm font-medium text-copper-700 underline">
            See all
          </Link>
        )
      }
    >
      {list.isPending ? (
        <SkeletonRows rows={3} />
      ) : list.isError ? (
        <ErrorState error={list.error} retry={() => list.refetch()} />
      ) : list.data.items.length === 0 ? (
        <EmptyState title={queue.empty}>{queue.emptyHint}</EmptyState>
      ) : (
        <ul className="divide-y divide-ink-100">
          {list.data.items.map((o) => (
            <li key={o.id} className="flex items-start justify-between gap-3 py-2">
              <div className="min-w-0">
                <Link to={paths.orders.detail.href(o.id)} className="font-mono text-xs font-semibold text-ink-900 underline-offset-2 hover:underline">
                  {o.number}
                </Link>
                <p className="truncate text-sm text-ink-900">{o.customer.company}</p>
                <p className="truncate text-xs text-ink-600">{o.lineSummary}</p>
              </div>
              <div className="shrink-0 text-right text-xs text-ink-600">
                <p className="num text-sm font-semibold text-ink-900">{formatMoney(o.totalMinor, o.currency)}</p>
                <p>{queue.when === 'neededBy' ? `needed ${formatDate(o.neededBy)}` : `entered ${formatDate(o.createdAt)}`}</p>
              </div>
            </li>
          ))}
        </ul>
      )}
    </Card>
  )
}

/** The sales role's home panels (src/features/home/queue-panels.tsx). */
export function salesQueuePanels() {
  return SALES_QUEUES.map((q) => <QueuePanel key={`sales-${q.key}`} queue={q} />)
}
