import { formatMoney } from '#shared/schemas/pricing.ts'
import type { LinePricing } from '#shared/schemas/quote.ts'
import { Formula } from '#src/components/gas/gas-chip.tsx'

function fractionText(x: number): string {
  return x >= 0.01 ? `${(x * 100).toPrecision(4)} %` : `${(x * 1e6).toPrecision(4)} ppm`
}

function modelName(model: string): string {
  return model === 'gerg-2008' ? 'GERG-2008' : model === 'peng-robinson' ? 'Peng–Robinson' : model
}

/** What one cylinder holds and what it costs: gas use per component, rental, certification, surcharges. */
export function PriceBreakdown({ pricing, caption }: { pricing: LinePricing; caption?: string }) {
  const money = (m: number) => formatMoney(m, pricing.currency)
  return (
    <div className="space-y-2">
      <p className="text-xs text-ink-600">
        Per cylinder: <span className="num">{pricing.amountMolPerCylinder.toFixed(1)} mol</span>,{' '}
        <span className="num">{pricing.massKgPerCylinder.toFixed(2)} kg</span> at {pricing.temperatureC} °C and{' '}
        <span className="num">{pricing.pressureBarAbsolute.toFixed(2)} bar absolute</span> (Z ={' '}
        <span className="num">{pricing.compressibility.toFixed(4)}</span>, {modelName(pricing.model)}).
      </p>
      <div className="overflow-x-auto">
        <table className="w-full text-xs">
          <caption className="sr-only">{caption ?? 'Price per cylinder'}</caption>
          <thead>
            <tr className="border-b border-ink-200 text-left text-ink-600">
              <th scope="col" className="py-1 pr-2 font-medium">
                Item
              </th>
              <th scope="col" className="py-1 pr-2 text-right font-medium">
                Fraction
              </th>
              <th scope="col" className="py-1 pr-2 text-right font-medium">
                kg
              </th>
              <th scope="col" className="py-1 pr-2 text-right font-medium">
                m³ at {pricing.referenceLabel}
              </th>
              <th scope="col" className="py-1 pr-2 font-medium">
                Price
              </th>
              <th scope="col" className="py-1 text-right font-medium">
                Amount
              </th>
            </tr>
          </thead>
          <tbody className="num">
            {pricing.gases.map((g) => (
              <tr key={g.gas} className="border-b border-ink-100">
                <th scope="row" className="py-1 pr-2 text-left font-semibold">
                  <Formula formula={g.formula} />
                </th>
                <td className="py-1 pr-2 text-right">{fractionText(g.fraction)}</td>
                <td className="py-1 pr-2 text-right">{g.massKg.toFixed(g.massKg < 0.01 ? 5 : 3)}</td>
                <td className="py-1 pr-2 text-right">{g.standardVolumeM3.toFixed(g.standardVolumeM3 < 0.01 ? 5 : 3)}</td>
                <td className="py-1 pr-2">
                  {money(g.unitPriceMinor)} per {g.unit === 'kg' ? 'kg' : 'm³'}
                </td>
                <td className="py-1 text-right">{money(g.costMinor)}</td>
              </tr>
            ))}
            {pricing.rental && (
              <tr className="border-b border-ink-100">
                <th scope="row" className="py-1 pr-2 text-left font-normal" colSpan={4}>
                  Rental, {pricing.rental.key} class
                </th>
                <td className="py-1 pr-2">
                  {pricing.rental.days} days × {money(pricing.rental.unitPriceMinor)}
                </td>
                <td className="py-1 text-right">{money(pricing.rental.costMinor)}</td>
              </tr>
            )}
            <tr className="border-b border-ink-100">
              <th scope="row" className="py-1 pr-2 text-left font-normal" colSpan={4}>
                Certification
              </th>
              <td className="py-1 pr-2">{pricing.certification.label}</td>
              <td className="py-1 text-right">{money(pricing.certification.costMinor)}</td>
            </tr>
            {pricing.surcharges.map((s) => (
              <tr key={s.key} className="border-b border-ink-100">
                <th scope="row" className="py-1 pr-2 text-left font-normal" colSpan={4}>
                  Surcharge
                </th>
                <td className="py-1 pr-2">{s.label}</td>
                <td className="py-1 text-right">{money(s.costMinor)}</td>
              </tr>
            ))}
            <tr>
              <th scope="row" className="py-1 pr-2 text-left font-semibold" colSpan={4}>
                Per cylinder
              </th>
              <td className="py-1 pr-2">
                × {pricing.quantity} = <strong>{money(pricing.totalMinor)}</strong>
              </td>
              <td className="py-1 text-right font-semibold">{money(pricing.perCylinderMinor)}</td>
            </tr>
          </tbody>
        </table>
      </div>
      {pricing.notes.length > 0 && (
        <ul className="space-y-1 text-xs text-caution-fg">
          {pricing.notes.map((n) => (
            <li key={n}>Note: {n}</li>
          ))}
        </ul>
      )}
    </div>
  )
}
