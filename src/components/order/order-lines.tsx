import { FILL_METHOD_LABEL, type OrderLine } from '#shared/schemas/order.ts'
import { formatMoney } from '#shared/schemas/pricing.ts'
import { useDisplayUnits } from '#src/components/units-context.tsx'
import { Cautions } from './cautions.tsx'
import { formatGaugePressure } from './format.ts'
import { PriceBreakdown } from './price-breakdown.tsx'

/** The mixtures of an order: specification, cylinder and fill, price, breakdown and cautions. */
export function OrderLines({ lines, currency, breakdown = true }: { lines: OrderLine[]; currency: string; breakdown?: boolean }) {
  const { units } = useDisplayUnits()
  return (
    <div className="space-y-4">
      {lines.map((l) => (
        <article key={l.id} aria-labelledby={`line-${l.id}`} className="rounded-md border border-ink-200 p-3">
          <header className="flex flex-wrap items-baseline justify-between gap-2">
            <h3 id={`line-${l.id}`} className="font-semibold text-ink-900">
              {l.lineNo}. {l.description}
            </h3>
            <p className="num text-sm">
              {l.quantity} × {formatMoney(l.pricing?.perCylinderMinor ?? Math.round(l.priceMinor / l.quantity), currency)} ={' '}
              <strong>{formatMoney(l.priceMinor, currency)}</strong>
            </p>
          </header>
          <dl className="mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2 lg:grid-cols-3">
            <div>
              <dt className="inline text-ink-600">Cylinder: </dt>
              <dd className="num inline">
                {l.waterVolumeL} L water volume, valve {l.valveOutlet}
              </dd>
            </div>
            <div>
              <dt className="inline text-ink-600">Fill: </dt>
              <dd className="num inline">{formatGaugePressure(l.finalPressureBarGauge, units)} at 15 °C (settled)</dd>
            </div>
            <div>
              <dt className="inline text-ink-600">Method: </dt>
              <dd className="inline">{FILL_METHOD_LABEL[l.method]}</dd>
            </div>
            <div>
              <dt className="inline text-ink-600">Blend tolerance: </dt>
              <dd className="num inline">±{l.blendTolerancePct} % relative</dd>
            </div>
            <div>
              <dt className="inline text-ink-600">Certification: </dt>
              <dd className="num inline">±{l.certificationUncertaintyPct} % relative (k = 2)</dd>
            </div>
          </dl>
          {breakdown && l.pricing && (
            <details className="mt-2">
              <summary className="cursor-pointer text-sm font-medium text-copper-700">Gas use and price per cylinder</summary>
              <div className="mt-2">
                <PriceBreakdown pricing={l.pricing} caption={`Price breakdown of line ${l.lineNo}`} />
              </div>
            </details>
          )}
          {l.pricing && (
            <div className="mt-2">
              <Cautions cautions={l.pricing.cautions} />
            </div>
          )}
        </article>
      ))}
    </div>
  )
}
