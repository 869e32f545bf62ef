import { useQuery } from '@tanstack/react-query'
import { formatMoney } from '#shared/schemas/billing.ts'
import { Button } from '#src/components/ui/button.tsx'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { ApiError } from '#src/lib/api-client.ts'
import { queryClient } from '#src/lib/query-client.ts'
import { billingQueries } from '../api/billing-queries.ts'
import { useCreateInvoice } from '../api/create-invoice.ts'
import { InvoiceTable } from '../components/invoice-table.tsx'

export async function loader() {
  void queryClient.prefetchQuery(billingQueries.ready())
  void queryClient.prefetchQuery(billingQueries.list({}))
  return null
}

function ReadyToInvoice() {
  const ready = useQuery(billingQueries.ready())
  const create = useCreateInvoice()
  if (ready.isPending) return <SkeletonRows rows={3} />
  if (ready.isError) return <ErrorState error={ready.error} retry={() => ready.refetch()} />
  if (ready.data.length === 0) return <EmptyState title="Nothing to invoice">Orders appear here when they are marked shipped.</EmptyState>
  const failed =
    create.error instanceof ApiError ? create.error.body.detail : create.error ? 'Could not reach the server; nothing was invoiced. Try again.' : null
  return (
    <div className="space-y-3">
      {failed && (
        <p role="alert" className="rounded border border-blocked-border bg-blocked-bg px-3 py-2 text-sm text-blocked-fg">
          {failed}
        </p>
      )}
      {create.data && (
        <p role="status" className="rounded border border-clear-border bg-clear-bg px-3 py-2 text-sm text-clear-fg">
          Invoice {create.data.invoice.number} for {create.data.invoice.orderNumber} is open (
          {formatMoney(create.data.invoice.amountMinor, create.data.invoice.currency)})
          {create.data.emailed ? '; the customer got it by e-mail.' : '; the e-mail could not be sent.'}
        </p>
      )}
      <ul className="divide-y divide-ink-100">
        {ready.data.map((o) => (
          <li key={o.orderId} className="py-3">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <div>
                <span className="font-mono text-sm font-semibold">{o.orderNumber}</span> <span className="text-sm text-ink-700">{o.customerCompany}</span>
                {o.reference && <span className="ml-2 text-xs text-ink-600">ref. {o.reference}</span>}
              </div>
              <div className="flex items-center gap-3">
                <span className="num font-semibold">{formatMoney(o.totalMinor, o.currency)}</span>
                <Button onClick={() => create.mutate(o.orderId)} disabled={create.isPending && create.variables === o.orderId}>
                  {create.isPending && create.variables === o.orderId ? 'Invoicing…' : 'Invoice'}
                </Button>
              </div>
            </div>
            <ul className="mt-1 text-xs text-ink-600">
              {o.lines.map((l) => (
                <li key={l.description} className="num">
                  {l.description}: {formatMoney(l.amountMinor, o.currency)}
                </li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
    </div>
  )
}

/** The sales desk's billing: shipped orders to invoice, and every invoice with its payment status. */
export function Component() {
  const list = useQuery(billingQueries.list({}))
  return (
    <div>
      <PageHeader title="Invoices" subtitle="Invoices go out through the payment provider; the customer pays on its page and the invoice marks itself paid." />
      <div className="grid gap-5 xl:grid-cols-2">
        <Card title="Shipped, not yet invoiced">
          <ReadyToInvoice />
        </Card>
        <Card title="Invoices">
          {list.isPending ? (
            <SkeletonRows rows={5} />
          ) : list.isError ? (
            <ErrorState error={list.error} retry={() => list.refetch()} />
          ) : list.data.length === 0 ? (
            <EmptyState title="No invoices yet">Invoice a shipped order to see it here with its payment status.</EmptyState>
          ) : (
            <InvoiceTable invoices={list.data} showCustomer pay={false} />
          )}
        </Card>
      </div>
    </div>
  )
}
