import type { FillPlanResponse } from '#shared/schemas/fill-plan.ts'
import type { PlanLineSpec } from '#shared/schemas/plan.ts'
import { GasChip } from '#src/components/gas/gas-chip.tsx'
import { SafetyBadge } from '#src/components/ui/safety-badge.tsx'
import { fmt } from '#src/lib/format.ts'
import { formulaOf, inSpecUnits, nameOf, pressureText, specUnitOf, temperatureText } from '../lib/format-plan.ts'

/** Planned composition with its expanded uncertainty, in the specification's units. */
export function PredictedComposition({ plan, line }: { plan: FillPlanResponse; line: Pick<PlanLineSpec, 'components'> | null }) {
  return (
    <table className="w-full text-sm">
      <caption className="pb-2 text-left text-xs text-ink-600">
        Amount fractions; uncertainty expanded with k = 2.
        <details className="mt-1">
          <summary className="cursor-pointer font-medium">How the uncertainty was estimated</summary>
          <p className="mt-1">{plan.uncertaintyMethod}</p>
        </details>
      </caption>
      <thead>
        <tr className="border-b border-ink-200 text-left text-xs uppercase tracking-wide text-ink-600">
          <th scope="col" className="py-2 pr-2">
            Component
          </th>
          <th scope="col" className="py-2 pr-2 text-right">
            Target
          </th>
          <th scope="col" className="py-2 pr-2 text-right">
            Planned
          </th>
          <th scope="col" className="py-2 text-right">
            ± U (k = 2)
          </th>
        </tr>
      </thead>
      <tbody>
        {plan.predictedComposition.map((c) => {
          const unit = specUnitOf(c.gas, line, c.target || c.fraction)
          return (
            <tr key={c.gas} className="border-b border-ink-100">
              <th scope="row" className="py-1.5 pr-2 text-left font-normal">
                <GasChip formula={formulaOf(c.gas)} name={nameOf(c.gas)} />
              </th>
              <td className="num py-1.5 pr-2 text-right">{c.target > 0 ? inSpecUnits(c.target, unit) : '—'}</td>
              <td className="num py-1.5 pr-2 text-right">{inSpecUnits(c.fraction, unit)}</td>
              <td className="num py-1.5 text-right">{inSpecUnits(c.expandedUncertainty, unit)}</td>
            </tr>
          )
        })}
      </tbody>
    </table>
  )
}

/** Pressure rules checked for the cylinder (service/test pressure at the rule temperatures). */
export function PressureChecks({ plan }: { plan: FillPlanResponse }) {
  if (!plan.pressureChecks.length) return null
  return (
    <ul className="space-y-1.5 text-sm" aria-label="Pressure checks">
      {plan.pressureChecks.map((c, i) => (
        <li key={i} className="flex flex-wrap items-start gap-2">
          <SafetyBadge state={c.pass ? 'clear' : 'blocked'} label={c.pass ? 'Pass' : 'Fails'} />
          <span className="min-w-0 flex-1">
            {c.label}: {pressureText(c.gaugePressure, 1)} at {temperatureText(c.temperature)}
            {c.gaugeLimit ? ` (limit ${pressureText(c.gaugeLimit, 1)})` : ''}
            <span className="block text-xs text-ink-600">{c.rule}</span>
          </span>
        </li>
      ))}
    </ul>
  )
}

/** Transport and hazard classification computed from the composition. */
export function Classification({ plan }: { plan: FillPlanResponse }) {
  const c = plan.classification
  return (
    <dl className="grid grid-cols-[10rem_1fr] gap-x-3 gap-y-1 text-sm">
      <dt className="text-ink-600">Transport division</dt>
      <dd>
        {c.division}
        {c.subsidiary.length ? ` (+ ${c.subsidiary.join(', ')})` : ''}
      </dd>
      <dt className="text-ink-600">Flammable (ISO 10156)</dt>
      <dd>
        {c.flammable === null ? 'not assessed' : c.flammable ? 'yes' : 'no'}
        {c.flammabilityIndex !== null ? ` · index ${fmt(c.flammabilityIndex, 3)}` : ''}
      </dd>
      <dt className="text-ink-600">Oxidising</dt>
      <dd>
        {c.oxidising ? 'yes' : 'no'}
        {c.oxidisingPower !== null ? ` · oxidising power ${fmt(c.oxidisingPower * 100, 1)} %` : ''}
      </dd>
      <dt className="text-ink-600">Toxic</dt>
      <dd>
        {c.toxic ? 'yes' : 'no'}
        {c.lc50MixPpm !== null ? ` · LC50 of the mixture ${c.lc50MixPpm > 1_000_000 ? 'above 1 000 000 ppm' : `${fmt(c.lc50MixPpm, 0)} ppm`}` : ''}
      </dd>
      {plan.minimumSafeTemperature && (
        <>
          <dt className="text-ink-600">Lowest safe temperature</dt>
          <dd>{temperatureText(plan.minimumSafeTemperature)} (condensation screen)</dd>
        </>
      )}
      {c.notes.map((n) => (
        <dd key={n} className="col-span-2 text-xs text-ink-600">
          {n}
        </dd>
      ))}
    </dl>
  )
}

/** The dilution cascade the engine proposes when a step is too small to measure. */
export function PremixProposal({ plan }: { plan: FillPlanResponse }) {
  const p = plan.premixProposal
  if (!p) return null
  return (
    <div className="space-y-3 text-sm">
      <p>{p.reason}</p>
      <ol className="space-y-2">
        {p.stages.map((s, i) => (
          <li key={s.label} className="rounded border border-ink-200 p-2">
            <p className="font-medium">
              Stage {i + 1}: {s.label} <GasChip formula={formulaOf(s.gas)} name={nameOf(s.gas)} />
            </p>
            <p className="text-xs text-ink-600">{s.reason}</p>
            <p className="num mt-1 text-xs">
              Steps:{' '}
              {s.plan.steps
                .map((st) => `${st.sourceComposition.length > 1 ? st.source : formulaOf(st.gas)} to ${pressureText(st.cumulativeGaugePressure, 1)}`)
                .join(' → ')}
            </p>
          </li>
        ))}
        <li className="rounded border border-copper-300 p-2">
          <p className="font-medium">Then the product from the premix</p>
          <p className="num mt-1 text-xs">
            Steps:{' '}
            {p.productPlan.steps
              .map((st) => `${st.sourceComposition.length > 1 ? st.source : formulaOf(st.gas)} to ${pressureText(st.cumulativeGaugePressure, 1)}`)
              .join(' → ')}
          </p>
        </li>
      </ol>
      <p className="text-xs text-ink-600">To use the proposal, make the premix, then plan the product with the premix as a source (Sources below).</p>
    </div>
  )
}
