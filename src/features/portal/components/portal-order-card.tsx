import { Link } from 'react-router-dom'
import type { OrderSummary } from '#shared/schemas/order.ts'
import { formatMoney } from '#shared/schemas/pricing.ts'
import { paths } from '#src/app/paths.ts'
import { formatDate } from '#src/components/order/format.ts'
import { OrderProgress } from '#src/components/order/order-progress.tsx'
import { OrderStatusBadge } from '#src/components/order/status-badge.tsx'
import { cn } from '#src/lib/cn.ts'

/** One order at a glance, sized for a phone: what, how many, where it is, what it costs. */
export function PortalOrderCard({ order }: { order: OrderSummary }) {
  const waiting = order.status === 'quoted'
  return (
    <li>
      <Link
        to={paths.portal.order.href(order.id)}
        className={cn(
          'block rounded-card border bg-white p-4 shadow-sm hover:border-ink-400',
          waiting ? 'border-copper-400 ring-1 ring-copper-300' : 'border-ink-200',
        )}
      >
        <div className="flex flex-wrap items-start justify-between gap-2">
          <div>
            <p className="font-mono text-xs text-ink-600">{order.number}</p>
            <p className="font-semibold text-ink-900">{order.lineSummary}</p>
            <p className="text-sm text-ink-600">
              {order.cylinders} cylinder{order.cylinders === 1 ? '' : 's'}
              {order.reference ? ` · ${order.reference}` : ''} · needed by {formatDate(order.neededBy)}
            </p>
          </div>
          <div className="text-right">
            <OrderStatusBadge status={order.status} />
            <p className="num mt-1 text-sm font-semibold">{formatMoney(order.totalMinor, order.currency)}</p>
          </div>
        </div>
        <OrderProgress status={order.status} className="mt-3" />
        {waiting && <p className="mt-2 text-sm font-semibold text-copper-800">Quote waiting for your answer: open it to accept.</p>}
      </Link>
    </li>
  )
}
