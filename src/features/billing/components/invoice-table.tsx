import { formatMoney, type Invoice } from '#shared/schemas/billing.ts'
import { ScrollRegion } from '#src/components/scroll-region.tsx'
import { InvoiceStatusPill } from './invoice-status.tsx'

/** Invoices with status and amount; `pay` adds the button that opens the provider's hosted payment page. */
export function InvoiceTable({ invoices, showCustomer, pay }: { invoices: Invoice[]; showCustomer: boolean; pay: boolean }) {
  return (
    <ScrollRegion label="Invoices">
      <table className="w-full text-sm">
        <caption className="sr-only">Invoices</caption>
        <thead>
          <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-3">
              Invoice
            </th>
            {showCustomer && (
              <th scope="col" className="py-2 pr-3">
                Customer
              </th>
            )}
            <th scope="col" className="py-2 pr-3">
              Order
            </th>
            <th scope="col" className="py-2 pr-3 text-right">
              Amount
            </th>
            <th scope="col" className="py-2 pr-3">
              Status
            </th>
            <th scope="col" className="py-2">
              {pay ? 'Payment' : 'Issued'}
            </th>
          </tr>
        </thead>
        <tbody>
          {invoices.map((i) => (
            <tr key={i.id} className="border-b border-ink-100 align-middle">
              <th scope="row" className="num py-2 pr-3 text-left font-mono text-xs font-semibold">
                {i.number ?? '—'}
              </th>
              {showCustomer && <td className="py-2 pr-3">{i.customerCompany}</td>}
              <td className="py-2 pr-3">{i.orderNumber}</td>
              <td className="num whitespace-nowrap py-2 pr-3 text-right">{formatMoney(i.amountMinor, i.currency)}</td>
              <td className="py-2 pr-3">
                <InvoiceStatusPill status={i.status} />
                {i.paidAt && <span className="ml-2 text-xs text-ink-600">on {i.paidAt.slice(0, 10)}</span>}
              </td>
              <td className="py-2">
                {pay && i.status === 'open' && i.hostedUrl ? (
                  <a
                    href={i.hostedUrl}
                    className="inline-flex min-h-10 items-center rounded-md bg-copper-600 px-4 text-sm font-medium text-white hover:bg-copper-700"
                    aria-label={`Pay invoice ${i.number ?? ''} (${formatMoney(i.amountMinor, i.currency)}) on the payment page`}
                  >
                    Pay
                  </a>
                ) : pay ? (
                  <span className="text-ink-600">{i.status === 'paid' ? 'Nothing to pay' : '—'}</span>
                ) : (
                  <span className="num whitespace-nowrap">{i.createdAt.slice(0, 10)}</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  )
}
