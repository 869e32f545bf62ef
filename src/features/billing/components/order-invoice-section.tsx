import { useSuspenseQuery } from '@tanstack/react-query'
import { EmptyState } from '#src/components/ui/states.tsx'
import { billingQueries } from '../api/billing-queries.ts'
import { InvoiceTable } from './invoice-table.tsx'

/** The customer's order page: this order's invoice, with "Pay" while it is open. */
export default function OrderInvoiceSection({ order }: { order: { id: number } }) {
  const { data } = useSuspenseQuery(billingQueries.list({ orderId: order.id }))
  if (data.length === 0) return <EmptyState title="Not invoiced yet">The invoice appears here once the order has shipped.</EmptyState>
  return <InvoiceTable invoices={data} showCustomer={false} pay />
}
