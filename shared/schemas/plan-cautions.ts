import { getGas, isKnownGas } from '../physics/gases.ts'
import { CAUTIONS } from '../planning/rules.ts'

/**
 * Standing cautions of a mixture, for the plan workspace, the calculator and the fill sheet. Kept apart from
 * plan.ts so the wire schemas do not pull the planning engine into every screen that lists plans.
 */

export interface StandingCaution {
  key: 'pressure' | 'oxygen' | 'flammable' | 'fuelOxidiser' | 'toxic'
  /** a short headline shown with the SafetyBadge */
  title: string
  text: string
}

/** Share of the lower flammability limit from which a fuel content earns the flammable caution (25 % LFL: common practice, no source). */
export const FLAMMABLE_CAUTION_LFL_SHARE = 0.25
/** Oxygen content above which the oxygen caution applies (oxygen-enriched above 23.5 %, OSHA 29 CFR 1910.146(b)). */
export const OXYGEN_CAUTION_FRACTION = 0.235

/**
 * The usual cautions for handling these gases, each given with the highest amount fraction it has anywhere in the
 * work (target, any parent gas: a pure parent gas counts as 1): high pressure always; oxidiser above 23.5 % O2 (or any
 * other oxidiser above 1 %); flammable from a quarter of the lower flammability limit; fuel + oxidiser when both
 * appear; toxic whenever a toxic gas is handled. Texts come from the planner's CAUTIONS, each deferring to local
 * codes and licensed practice.
 */
export function standingCautions(items: readonly { gas: string; fraction: number }[]): StandingCaution[] {
  const most = new Map<string, number>()
  for (const i of items) if (isKnownGas(i.gas)) most.set(i.gas, Math.max(most.get(i.gas) ?? 0, i.fraction))
  const gases = [...most.entries()].map(([id, x]) => ({ gas: getGas(id), x }))
  const flags = (g: (typeof gases)[number]['gas']) => g.hazards as readonly string[]
  const oxidiser = gases.some(({ gas, x }) => flags(gas).includes('oxidiser') && x > (gas.id === 'oxygen' ? OXYGEN_CAUTION_FRACTION : 0.01))
  const flammable = gases.some(
    ({ gas, x }) => flags(gas).includes('flammable') && (gas.flammability ? x >= (FLAMMABLE_CAUTION_LFL_SHARE * gas.flammability.lflPercent) / 100 : x > 0),
  )
  const supportsCombustion = gases.some(({ gas, x }) => (gas.groups as readonly string[]).includes('oxidiser') && x > 0)
  const toxic = gases.some(({ gas, x }) => flags(gas).includes('toxic') && x > 0)
  const out: StandingCaution[] = [{ key: 'pressure', title: 'High pressure', text: CAUTIONS.pressure }]
  if (oxidiser) out.push({ key: 'oxygen', title: 'Oxidiser', text: CAUTIONS.oxygen })
  if (flammable) out.push({ key: 'flammable', title: 'Flammable', text: CAUTIONS.flammable })
  if (flammable && supportsCombustion) out.push({ key: 'fuelOxidiser', title: 'Fuel with oxidiser', text: CAUTIONS.fuelOxidiser })
  if (toxic) out.push({ key: 'toxic', title: 'Toxic', text: CAUTIONS.toxic })
  return out
}
