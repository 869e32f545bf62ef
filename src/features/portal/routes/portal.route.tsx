import { useInfiniteQuery } from '@tanstack/react-query'
import type { OrderSummary } from '#shared/schemas/order.ts'
import { Button } from '#src/components/ui/button.tsx'
import { EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { portalQueries } from '../api/portal-queries.ts'
import { PortalOrderCard } from '../components/portal-order-card.tsx'

export async function loader() {
  void queryClient.prefetchInfiniteQuery(portalQueries.orders())
  return null
}

const FINISHED = new Set(['paid', 'cancelled'])

export function Component() {
  const orders = useInfiniteQuery(portalQueries.orders())
  const all: OrderSummary[] = orders.data?.pages.flatMap((p) => p.items) ?? []
  const waiting = all.filter((o) => o.status === 'quoted')
  const open = all.filter((o) => o.status !== 'quoted' && !FINISHED.has(o.status))
  const done = all.filter((o) => FINISHED.has(o.status))
  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader title="Your orders" subtitle="Where each order is, quotes waiting for your answer, and what is finished." />
      {orders.isPending ? (
        <SkeletonRows rows={5} />
      ) : orders.isError ? (
        <ErrorState error={orders.error} retry={() => orders.refetch()} />
      ) : all.length === 0 ? (
        <EmptyState title="No orders yet">
          When you send the shop a specification, it appears here with its quote, progress, certificates and invoices.
        </EmptyState>
      ) : (
        <div className="space-y-6">
          {waiting.length > 0 && (
            <section aria-labelledby="portal-waiting">
              <h2 id="portal-waiting" className="mb-2 text-sm font-semibold uppercase tracking-wide text-copper-800">
                Quotes for you to answer ({waiting.length})
              </h2>
              <ul className="space-y-3">
                {waiting.map((o) => (
                  <PortalOrderCard key={o.id} order={o} />
                ))}
              </ul>
            </section>
          )}
          <section aria-labelledby="portal-open">
            <h2 id="portal-open" className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-700">
              In progress ({open.length})
            </h2>
            {open.length === 0 ? (
              <p className="text-sm text-ink-600">Nothing in progress right now.</p>
            ) : (
              <ul className="space-y-3">
                {open.map((o) => (
                  <PortalOrderCard key={o.id} order={o} />
                ))}
              </ul>
            )}
          </section>
          {done.length > 0 && (
            <section aria-labelledby="portal-done">
              <h2 id="portal-done" className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-700">
                Finished ({done.length})
              </h2>
              <ul className="space-y-3">
                {done.map((o) => (
                  <PortalOrderCard key={o.id} order={o} />
                ))}
              </ul>
            </section>
          )}
          {orders.hasNextPage && (
            <Button variant="secondary" onClick={() => orders.fetchNextPage()} disabled={orders.isFetchingNextPage}>
              {orders.isFetchingNextPage ? 'Loading…' : 'Show older orders'}
            </Button>
          )}
        </div>
      )}
    </div>
  )
}

export function ErrorBoundary() {
  return <ErrorState error={new Error('Your orders could not be loaded. Check your connection and reload the page.')} retry={() => window.location.reload()} />
}
