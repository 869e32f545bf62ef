import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { Link, type LoaderFunctionArgs, useLocation, useParams } from 'react-router-dom'
import type { SessionUser } from '#shared/schemas/auth.ts'
import type { OrderDetail } from '#shared/schemas/order.ts'
import type { OrderStatus } from '#shared/schemas/order-lifecycle.ts'
import { formatMoney } from '#shared/schemas/pricing.ts'
import { paths } from '#src/app/paths.ts'
import { formatDate, formatDateTime } from '#src/components/order/format.ts'
import { OrderLines } from '#src/components/order/order-lines.tsx'
import { OrderTimeline } from '#src/components/order/order-timeline.tsx'
import { OrderStatusBadge } from '#src/components/order/status-badge.tsx'
import { Button } from '#src/components/ui/button.tsx'
import { Card, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { authQueries } from '#src/features/auth/api/auth-queries.ts'
import { ApiError } from '#src/lib/api-client.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { orderQueries } from '../api/order-queries.ts'
import { useTransitionOrder } from '../api/transition-order.ts'

export async function loader({ params }: LoaderFunctionArgs) {
  const id = Number(params.id)
  if (Number.isInteger(id) && id > 0) void queryClient.prefetchQuery(orderQueries.detail(id))
  return null
}

/** The moves open to the user, as buttons; cancelling asks once more. */
function TransitionButtons({ order }: { order: OrderDetail }) {
  const move = useTransitionOrder()
  const [confirming, setConfirming] = useState<OrderStatus | null>(null)
  if (order.transitions.length === 0) return null
  const run = (to: OrderStatus) => move.mutate({ id: order.id, to, version: order.version }, { onSettled: () => setConfirming(null) })
  return (
    <div className="flex flex-col items-end gap-2">
      <div className="flex flex-wrap justify-end gap-2">
        {order.transitions.map((t) =>
          t.to === 'cancelled' ? (
            confirming === 'cancelled' ? (
              <span key={t.to} className="flex items-center gap-2">
                <Button variant="danger" onClick={() => run('cancelled')} disabled={move.isPending}>
                  Yes, cancel {order.number}
                </Button>
                <Button variant="ghost" onClick={() => setConfirming(null)}>
                  Keep it
                </Button>
              </span>
            ) : (
              <Button key={t.to} variant="secondary" onClick={() => setConfirming('cancelled')} disabled={move.isPending}>
                {t.action}…
              </Button>
            )
          ) : (
            <Button key={t.to} onClick={() => run(t.to)} disabled={move.isPending}>
              {move.isPending && move.variables?.to === t.to ? 'Working…' : t.to === 'quoted' ? `${t.action} to ${order.customer.contactEmail}` : t.action}
            </Button>
          ),
        )}
      </div>
      {move.error && (
        <div role="alert" className="max-w-xl rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          <p>{move.error instanceof ApiError ? move.error.body.detail : 'The server could not be reached; nothing changed.'}</p>
          {move.error instanceof ApiError && move.error.body.errors?.length ? (
            <ul className="mt-1 list-disc pl-5">
              {move.error.body.errors.map((e) => (
                <li key={`${e.field}-${e.message}`}>{e.message}</li>
              ))}
            </ul>
          ) : null}
        </div>
      )}
    </div>
  )
}

export function Component() {
  const id = Number(useParams().id)
  const location = useLocation()
  const notice = (location.state as { notice?: string } | null)?.notice
  const order = useQuery(orderQueries.detail(id))
  const me = useQuery(authQueries.me()).data as SessionUser | null | undefined
  const salesDesk = !!me?.roles.some((r) => r === 'sales' || r === 'admin')

  if (order.isPending) return <SkeletonRows rows={10} />
  if (order.isError) {
    return (
      <div className="space-y-3">
        <ErrorState error={order.error} retry={() => order.refetch()} />
        <Link to={paths.orders.list.href()} className="font-semibold text-copper-700 underline">
          Back to the orders
        </Link>
      </div>
    )
  }
  const o = order.data
  return (
    <div>
      <PageHeader
        title={o.number}
        subtitle={
          <span className="flex flex-wrap items-center gap-2">
            <OrderStatusBadge status={o.status} />
            <span>
              {o.customer.company} ({o.customer.code}){o.reference ? ` · ref. ${o.reference}` : ''} · needed by {formatDate(o.neededBy)}
            </span>
          </span>
        }
        actions={
          <div className="flex flex-wrap items-start justify-end gap-2">
            {salesDesk && o.status === 'draft' && (
              <Link
                to={paths.orders.edit.href(o.id)}
                className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium text-ink-800 hover:bg-ink-100"
              >
                Edit specification
              </Link>
            )}
            {salesDesk && (
              <a
                href={`/api/orders/${o.id}/quote.pdf`}
                target="_blank"
                rel="noreferrer"
                className="inline-flex min-h-10 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium text-ink-800 hover:bg-ink-100"
              >
                {o.status === 'draft' ? 'Preview quote PDF' : 'Quote PDF'}
              </a>
            )}
            <TransitionButtons order={o} />
          </div>
        }
      />
      {notice && (
        <p role="alert" className="mb-4 rounded border border-caution-border bg-caution-bg px-3 py-2 text-sm text-caution-fg">
          {notice}
        </p>
      )}
      <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(18rem,1fr)]">
        <div className="space-y-5">
          <Card title={`Mixtures (${o.lines.length}) · ${o.cylinders} cylinder${o.cylinders === 1 ? '' : 's'}`}>
            <OrderLines lines={o.lines} currency={o.currency} />
          </Card>
          {o.notes && (
            <Card title="Notes for the shop">
              <p className="whitespace-pre-line text-sm">{o.notes}</p>
            </Card>
          )}
        </div>
        <div className="space-y-5">
          <Card title="Quote">
            <dl className="space-y-1.5 text-sm">
              <div className="flex justify-between gap-3">
                <dt className="text-ink-600">Total (excl. VAT, transport)</dt>
                <dd className="num text-lg font-semibold">{formatMoney(o.totalMinor, o.currency)}</dd>
              </div>
              <div className="flex justify-between gap-3">
                <dt className="text-ink-600">Rental included</dt>
                <dd className="num">{o.rentalDays} days</dd>
              </div>
              <div className="flex justify-between gap-3">
                <dt className="text-ink-600">Quote sent</dt>
                <dd>{o.quoteSentAt ? formatDateTime(o.quoteSentAt) : 'not yet'}</dd>
              </div>
              <div className="flex justify-between gap-3">
                <dt className="text-ink-600">Valid until</dt>
                <dd>{formatDate(o.quoteValidUntil)}</dd>
              </div>
              <div className="flex justify-between gap-3">
                <dt className="text-ink-600">Accepted</dt>
                <dd>{o.acceptedAt ? formatDateTime(o.acceptedAt) : '—'}</dd>
              </div>
              <div className="flex justify-between gap-3">
                <dt className="text-ink-600">Contact</dt>
                <dd className="text-right">
                  {o.customer.contactName}
                  <br />
                  <span className="text-xs text-ink-600">{o.customer.contactEmail}</span>
                </dd>
              </div>
            </dl>
          </Card>
          <Card title="History">
            <OrderTimeline events={o.timeline} />
          </Card>
        </div>
      </div>
    </div>
  )
}

export function ErrorBoundary() {
  return <ErrorState error={new Error('The order could not be shown. Reload the page to try again.')} retry={() => window.location.reload()} />
}
