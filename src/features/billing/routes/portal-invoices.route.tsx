import { useQuery } from '@tanstack/react-query'
import { useSearchParams } from 'react-router-dom'
import { Card, EmptyState, ErrorState, PageHeader, SkeletonRows } from '#src/components/ui/states.tsx'
import { queryClient } from '#src/lib/query-client.ts'
import { billingQueries } from '../api/billing-queries.ts'
import { InvoiceTable } from '../components/invoice-table.tsx'

export async function loader() {
  void queryClient.prefetchQuery(billingQueries.list({}))
  return null
}

/** The customer's invoices; "Pay" opens the payment provider's page, which brings them back here. */
export function Component() {
  const [params] = useSearchParams()
  const returning = params.has('paid')
  // back from the payment page: the provider's confirmation may take a moment to arrive, so look again shortly
  const list = useQuery({ ...billingQueries.list({}), refetchInterval: (q) => (returning && q.state.data?.some((i) => i.status === 'open') ? 3000 : false) })
  return (
    <div>
      <PageHeader title="Your invoices" subtitle="Pay open invoices online; paid invoices stay here for your records." />
      {returning && (
        <p role="status" className="mb-4 rounded border border-clear-border bg-clear-bg px-3 py-2 text-sm text-clear-fg">
          Thank you. Your payment is being confirmed; the invoice shows “Paid” as soon as the payment provider tells us.
        </p>
      )}
      <Card title="Invoices">
        {list.isPending ? (
          <SkeletonRows rows={4} />
        ) : list.isError ? (
          <ErrorState error={list.error} retry={() => list.refetch()} />
        ) : list.data.length === 0 ? (
          <EmptyState title="No invoices yet">An order's invoice appears here once it has shipped, with a button to pay it online.</EmptyState>
        ) : (
          <InvoiceTable invoices={list.data} showCustomer={false} pay />
        )}
      </Card>
    </div>
  )
}
