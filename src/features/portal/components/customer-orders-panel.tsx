import { useInfiniteQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { paths } from '#src/app/paths.ts'
import { Card, EmptyState, ErrorState, SkeletonRows } from '#src/components/ui/states.tsx'
import { portalQueries } from '../api/portal-queries.ts'
import { PortalOrderCard } from './portal-order-card.tsx'

/** The customer's home queue: their open orders, quotes waiting for an answer first. */
export function CustomerOrdersPanel() {
  const orders = useInfiniteQuery(portalQueries.orders())
  const open = (orders.data?.pages.flatMap((p) => p.items) ?? []).filter((o) => o.status !== 'paid' && o.status !== 'cancelled')
  open.sort((a, b) => Number(b.status === 'quoted') - Number(a.status === 'quoted'))
  return (
    <Card
      title="Your open orders"
      actions={
        <Link to={paths.portal.home.href()} className="text-sm font-medium text-copper-700 underline">
          All your orders
        </Link>
      }
      className="lg:col-span-2"
    >
      {orders.isPending ? (
        <SkeletonRows rows={3} />
      ) : orders.isError ? (
        <ErrorState error={orders.error} retry={() => orders.refetch()} />
      ) : open.length === 0 ? (
        <EmptyState title="No open orders">Orders you place with the shop appear here with their status, certificates and invoices.</EmptyState>
      ) : (
        <ul className="space-y-3">
          {open.slice(0, 6).map((o) => (
            <PortalOrderCard key={o.id} order={o} />
          ))}
        </ul>
      )}
    </Card>
  )
}
