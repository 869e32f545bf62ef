import { useQuery } from '@tanstack/react-query'
import { Suspense, useState } from 'react'
import { Link, type LoaderFunctionArgs, useParams } from 'react-router-dom'
import type { OrderDetail } from '#shared/schemas/order.ts'
import { formatMoney } from '#shared/schemas/pricing.ts'
import { paths } from '#src/app/paths.ts'
import { formatDate } from '#src/components/order/format.ts'
import { OrderLines } from '#src/components/order/order-lines.tsx'
import { OrderProgress } from '#src/components/order/order-progress.tsx'
import { OrderTimeline } from '#src/components/order/order-timeline.tsx'
import { OrderStatusBadge } from '#src/components/order/status-badge.tsx'
import { Button } from '#src/components/ui/button.tsx'
import { Card, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { useAnswerQuote } from '../api/answer-quote.ts'
import { portalQueries } from '../api/portal-queries.ts'
import { SectionBoundary } from '../components/section-boundary.tsx'
import { type PortalSection, portalSections } from '../portal-sections.ts'

export async function loader({ params }: LoaderFunctionArgs) {
  const id = Number(params.id)
  if (Number.isInteger(id) && id > 0) void queryClient.prefetchQuery(portalQueries.order(id))
  return null
}

function QuoteAnswer({ order }: { order: OrderDetail }) {
  const answer = useAnswerQuote()
  const [confirmCancel, setConfirmCancel] = useState(false)
  const canAccept = order.transitions.some((t) => t.to === 'accepted')
  const canCancel = order.transitions.some((t) => t.to === 'cancelled')
  if (!canAccept && !canCancel) return null
  return (
    <Card title="Your answer">
      <p className="mb-3 text-sm text-ink-700">
        Quote total <strong className="num">{formatMoney(order.totalMinor, order.currency)}</strong> excl. VAT and transport, valid until{' '}
        {formatDate(order.quoteValidUntil)}.
      </p>
      <div className="flex flex-wrap gap-2">
        {canAccept && (
          <Button size="lg" onClick={() => answer.mutate({ id: order.id, to: 'accepted', version: order.version })} disabled={answer.isPending}>
            {answer.isPending && answer.variables?.to === 'accepted' ? 'Accepting…' : 'Accept quote'}
          </Button>
        )}
        {canCancel &&
          (confirmCancel ? (
            <>
              <Button
                size="lg"
                variant="danger"
                onClick={() => answer.mutate({ id: order.id, to: 'cancelled', version: order.version })}
                disabled={answer.isPending}
              >
                Yes, decline this quote
              </Button>
              <Button size="lg" variant="ghost" onClick={() => setConfirmCancel(false)}>
                Keep it
              </Button>
            </>
          ) : (
            <Button size="lg" variant="secondary" onClick={() => setConfirmCancel(true)}>
              Decline…
            </Button>
          ))}
      </div>
      {answer.error && (
        <p role="alert" className="mt-3 rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {answer.error instanceof ApiError ? answer.error.body.detail : 'The shop could not be reached; nothing changed. Try again.'}
        </p>
      )}
    </Card>
  )
}

function ExtraSection({ section, order }: { section: PortalSection; order: OrderDetail }) {
  const { Component: Section } = section
  return (
    <Card title={section.title} className="scroll-mt-20">
      <div id={`portal-section-${section.id}`}>
        <SectionBoundary title={section.title}>
          <Suspense fallback={<SkeletonRows rows={2} />}>
            <Section order={order} />
          </Suspense>
        </SectionBoundary>
      </div>
    </Card>
  )
}

/**
 * The customer's view of one order: status at a glance, the answer to a quote, the mixtures, the quote PDF, the
 * history, and the extra sections other features register in portal-sections.ts (certificates, invoices).
 */
export function PortalOrderDetail({ order, extraSections = portalSections }: { order: OrderDetail; extraSections?: readonly PortalSection[] }) {
  const sections = [...extraSections].filter((s) => !s.when || s.when(order)).sort((a, b) => a.order - b.order)
  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <PageHeader
        title={order.lines.length === 1 ? order.lines[0].description : `${order.lines.length} mixtures`}
        subtitle={
          <span className="flex flex-wrap items-center gap-2">
            <span className="font-mono text-xs">{order.number}</span>
            <OrderStatusBadge status={order.status} />
            {order.reference && <span>Your reference {order.reference}</span>}
          </span>
        }
      />
      <Card>
        <OrderProgress status={order.status} />
        <p className="mt-3 text-sm text-ink-700">
          {order.cylinders} cylinder{order.cylinders === 1 ? '' : 's'} · needed by {formatDate(order.neededBy)} · total{' '}
          <strong className="num">{formatMoney(order.totalMinor, order.currency)}</strong>
        </p>
        {order.status !== 'draft' && (
          <a
            href={`/api/orders/${order.id}/quote.pdf`}
            target="_blank"
            rel="noreferrer"
            className="mt-2 inline-flex min-h-12 items-center font-semibold text-copper-700 underline"
          >
            Download the quote (PDF)
          </a>
        )}
      </Card>
      <QuoteAnswer order={order} />
      <Card title="Mixtures">
        <OrderLines lines={order.lines} currency={order.currency} />
      </Card>
      {sections.map((s) => (
        <ExtraSection key={s.id} section={s} order={order} />
      ))}
      <Card title="History">
        <OrderTimeline events={order.timeline} />
      </Card>
    </div>
  )
}

export function Component() {
  const id = Number(useParams().id)
  const order = useQuery(portalQueries.order(id))
  if (order.isPending) return <SkeletonRows rows={8} />
  if (order.isError) {
    return (
      <div className="mx-auto max-w-3xl space-y-3">
        <ErrorState
          error={order.error instanceof ApiError && order.error.status === 404 ? new Error('There is no such order in your account.') : order.error}
          retry={() => order.refetch()}
        />
        <Link to={paths.portal.home.href()} className="font-semibold text-copper-700 underline">
          Back to your orders
        </Link>
      </div>
    )
  }
  return <PortalOrderDetail order={order.data} />
}

export function ErrorBoundary() {
  return <ErrorState error={new Error('This order could not be shown. Reload the page to try again.')} retry={() => window.location.reload()} />
}
