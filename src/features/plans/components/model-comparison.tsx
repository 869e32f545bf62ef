import type { CompareModelsResponse } from '#shared/schemas/fill-plan.ts'
import { ScrollRegion } from '#src/components/scroll-region.tsx'
import { MODEL_LABEL, type ModelIdWire } from '#shared/schemas/gas.ts'
import type { PlanLineSpec } from '#shared/schemas/plan.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { cn } from '#src/lib/cn.ts'
import { signedPct } from '#src/lib/format.ts'
import { formulaOf, inSpecUnits, nameOf, pressureText, specUnitOf } from '../lib/format-plan.ts'

/**
 * What each model's plan would really put in the cylinder, judged by the reference model (GERG-2008 where it
 * covers the gases), in the units of the specification.
 */
export function ModelComparison({
  comparison,
  selected,
  line,
  balanceGas,
}: {
  comparison: CompareModelsResponse
  selected: ModelIdWire
  line: Pick<PlanLineSpec, 'components'> | null
  balanceGas: string | null
}) {
  const gases =
    comparison.entries
      .find((e) => e.realised.length)
      ?.realised.map((r) => r.gas)
      .filter((g) => g !== balanceGas) ?? []
  return (
    <ScrollRegion label="Model comparison table">
      <table className="w-full text-sm">
        <caption className="pb-2 text-left text-xs text-ink-600">{comparison.referenceNote}</caption>
        <thead>
          <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
            <th scope="col" className="py-2 pr-2">
              Plan made with
            </th>
            {gases.map((g) => (
              <th key={g} scope="col" className="py-2 pr-2 text-right">
                <GasChip formula={formulaOf(g)} name={nameOf(g)} /> really
              </th>
            ))}
            <th scope="col" className="py-2 pr-2 text-right">
              Settled final
            </th>
            <th scope="col" className="py-2">
              Tolerance
            </th>
          </tr>
        </thead>
        <tbody>
          {comparison.entries.map((e) => (
            <tr key={e.model} className={cn('border-b border-ink-100', e.model === selected && 'bg-copper-50')}>
              <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                {MODEL_LABEL[e.model]}
                {e.model === selected && <span className="block text-xs font-semibold text-copper-700">this plan</span>}
              </th>
              {e.error ? (
                <td colSpan={gases.length + 2} className="py-1.5 text-xs text-ink-600">
                  {e.error}
                </td>
              ) : (
                <>
                  {gases.map((g) => {
                    const r = e.realised.find((x) => x.gas === g)
                    if (!r) return <td key={g} />
                    const unit = specUnitOf(g, line, r.target)
                    return (
                      <td key={g} className="num py-1.5 pr-2 text-right">
                        {inSpecUnits(r.realised, unit)}
                        <span className="block text-xs text-ink-600">
                          {r.deviationRelative === null ? '' : `${signedPct(r.deviationRelative * 100, 1)} of target`}
                        </span>
                      </td>
                    )
                  })}
                  <td className="num py-1.5 pr-2 text-right">{e.realisedFinalGaugePressure ? pressureText(e.realisedFinalGaugePressure, 1) : '—'}</td>
                  <td className="py-1.5">
                    {e.withinTolerance === null ? (
                      '—'
                    ) : e.withinTolerance ? (
                      <SafetyBadge state="clear" label="Within" />
                    ) : (
                      <SafetyBadge state="blocked" label="Outside" />
                    )}
                  </td>
                </>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  )
}
