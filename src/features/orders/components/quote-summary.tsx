import { useDeferredValue, useMemo } from 'react'
import { type OrderLineInput, OrderLineInputSchema } from '#shared/schemas/order.ts'
import { formatMoney, HAZARD_LABEL, type PriceBook } from '#shared/schemas/pricing.ts'
import { describeMixture, indexPriceBook, type LineQuoteResult, quoteLine } from '#shared/schemas/quote.ts'
import { Cautions } from '#src/components/order/cautions.tsx'
import { PriceBreakdown } from '#src/components/order/price-breakdown.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'

type LinePreview = { state: 'incomplete'; message: string } | { state: 'priced'; result: LineQuoteResult; description: string }

function preview(raw: unknown, index: ReturnType<typeof indexPriceBook>, rentalDays: number): LinePreview {
  const parsed = OrderLineInputSchema.safeParse(raw)
  if (!parsed.success) {
    const first = parsed.error.issues[0]
    return { state: 'incomplete', message: first ? `${first.path.join('.') || 'line'}: ${first.message}` : 'Complete this mixture to see its price' }
  }
  const line: OrderLineInput = parsed.data
  return { state: 'priced', result: quoteLine(line, index, rentalDays), description: line.description || describeMixture(line) }
}

/**
 * The price as it is typed: every complete mixture is priced in the browser with the same function the server
 * uses (gas use from the equation of state, the price book, rental, certification, surcharges). The server
 * prices again when the specification is saved; its number is the one on the quote.
 */
export function QuoteSummary({ values, book }: { values: { lines?: unknown[]; rentalDays?: unknown }; book: PriceBook }) {
  const key = useDeferredValue(JSON.stringify({ lines: values.lines ?? [], rentalDays: values.rentalDays }))
  const index = useMemo(() => indexPriceBook(book), [book])
  const previews = useMemo(() => {
    const v = JSON.parse(key) as { lines: unknown[]; rentalDays: unknown }
    const days = typeof v.rentalDays === 'number' && Number.isInteger(v.rentalDays) && v.rentalDays >= 0 ? v.rentalDays : 0
    return v.lines.map((l) => preview(l, index, days))
  }, [key, index])
  const complete = previews.length > 0 && previews.every((p) => p.state === 'priced' && p.result.ok)
  const total = previews.reduce((s, p) => s + (p.state === 'priced' && p.result.ok ? p.result.pricing.totalMinor : 0), 0)
  const cautions = [...new Set(previews.flatMap((p) => (p.state === 'priced' && p.result.ok ? p.result.pricing.cautions : [])))]

  return (
    <section aria-label="Price" className="space-y-3">
      <div className="rounded-md bg-ink-900 px-4 py-3 text-white">
        <p className="text-xs uppercase tracking-wide text-ink-300">{complete ? 'Total, excl. VAT and transport' : 'Total so far'}</p>
        <p className="num text-3xl font-semibold" aria-live="polite">
          {formatMoney(total, book.currency)}
        </p>
        {!complete && <p className="text-xs text-ink-300">Some mixtures are not priced yet; see below.</p>}
      </div>
      {previews.map((p, i) => (
        <div key={i} className="rounded-md border border-ink-200 p-3">
          <p className="text-sm font-semibold text-ink-900">
            Mixture {i + 1}
            {p.state === 'priced' ? `: ${p.description}` : ''}
          </p>
          {p.state === 'incomplete' ? (
            <p className="mt-1 text-sm text-ink-600">Complete this mixture to see its price ({p.message}).</p>
          ) : !p.result.ok ? (
            <ul className="mt-1 space-y-1 text-sm text-blocked-fg" role="alert">
              {p.result.problems.map((x) => (
                <li key={`${x.field}-${x.message}`}>{x.message}</li>
              ))}
            </ul>
          ) : (
            <>
              <p className="num mt-1 text-sm">
                {p.result.pricing.quantity} × {formatMoney(p.result.pricing.perCylinderMinor, book.currency)} ={' '}
                <strong>{formatMoney(p.result.pricing.totalMinor, book.currency)}</strong>
              </p>
              {p.result.pricing.hazards.length > 0 && (
                <div className="mt-1 flex flex-wrap gap-1">
                  {p.result.pricing.hazards.map((h) => (
                    <SafetyBadge key={h} state="caution" label={HAZARD_LABEL[h]} />
                  ))}
                </div>
              )}
              <details className="mt-2">
                <summary className="cursor-pointer text-xs font-medium text-copper-700">Gas use and price per cylinder</summary>
                <div className="mt-2">
                  <PriceBreakdown pricing={p.result.pricing} caption={`Price of mixture ${i + 1}`} />
                </div>
              </details>
            </>
          )}
        </div>
      ))}
      <Cautions cautions={cautions} />
      <p className="text-xs text-ink-600">Preview computed here as you type; the server prices the order again when you save it.</p>
    </section>
  )
}
