import type { Comparison } from '#shared/schemas/quality.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { cn } from '#src/lib/cn.ts'
import { certifiedText, fractionText, signedPercent } from './format.ts'

/** Analysis against specification in one table; every deviation carries Blocked or Clear with its icon and word. */
export function ComparisonTable({ comparison }: { comparison: Comparison }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="sr-only">Analysed values compared with the specification, one row per certified component</caption>
        <thead>
          <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-3">
              Component
            </th>
            <th scope="col" className="py-2 pr-3 text-right">
              Specified
            </th>
            <th scope="col" className="py-2 pr-3 text-right">
              Analysed (U, k)
            </th>
            <th scope="col" className="py-2 pr-3 text-right">
              Deviation
            </th>
            <th scope="col" className="py-2 pr-3 text-right">
              U relative
            </th>
            <th scope="col" className="py-2">
              Check
            </th>
          </tr>
        </thead>
        <tbody>
          {comparison.rows.map((r) => (
            <tr key={r.gas} className={cn('border-b border-ink-100 align-top', r.state === 'blocked' && 'bg-blocked-bg/40')}>
              <th scope="row" className="py-2 pr-3 text-left font-normal">
                <GasChip formula={r.formula} name={r.name} />
              </th>
              <td className="num py-2 pr-3 text-right">{fractionText(r.targetFraction, r.unit)}</td>
              <td className="num py-2 pr-3 text-right">
                {r.measuredFraction === null || r.expandedUncertainty === null
                  ? '—'
                  : certifiedText(r.measuredFraction, r.expandedUncertainty, r.coverageFactor ?? 2, r.unit)}
              </td>
              <td className={cn('num py-2 pr-3 text-right', r.withinTolerance === false && 'font-semibold text-blocked-fg')}>
                {r.deviationRelative === null ? '—' : signedPercent(r.deviationRelative)}
                <span className="block text-xs font-normal text-ink-600">limit ±{r.tolerancePct} %</span>
              </td>
              <td className={cn('num py-2 pr-3 text-right', r.uncertaintyWithinSpec === false && 'font-semibold text-blocked-fg')}>
                {r.uncertaintyRelativePct === null ? '—' : `${r.uncertaintyRelativePct.toFixed(2)} %`}
                <span className="block text-xs font-normal text-ink-600">limit {r.uncertaintyLimitPct} %</span>
              </td>
              <td className="py-2">
                <SafetyBadge state={r.state} />
                <p className="mt-1 max-w-xs text-xs text-ink-700">{r.message}</p>
              </td>
            </tr>
          ))}
          <tr>
            <th scope="row" className="py-2 pr-3 text-left font-normal">
              <GasChip formula={comparison.balanceGas.formula} name={comparison.balanceGas.name} />
            </th>
            <td colSpan={5} className="py-2 text-sm text-ink-600">
              Balance gas: the remainder to 1 mol/mol, not certified by analysis.
            </td>
          </tr>
        </tbody>
      </table>
    </div>
  )
}
