import { getGas, isKnownGas } from '#shared/physics/index.ts'
import type { FillPlanRequest } from '#shared/schemas/fill-plan.ts'
import type { PlanLineSpec } from '#shared/schemas/plan.ts'
import { fmt } from '#src/lib/format.ts'

export function formulaOf(gasId: string): string {
  return isKnownGas(gasId) ? getGas(gasId).formula : gasId
}
export function nameOf(gasId: string): string {
  return isKnownGas(gasId) ? getGas(gasId).name : gasId
}

/** Decimals that match the gauge's resolution; without a gauge, 0.1 bar / 1 psi / 10 kPa are assumed. */
export function pressureDecimals(request: Pick<FillPlanRequest, 'gauge'>, unit: string): number {
  const res = request.gauge?.resolution
  if (res && res.value > 0 && res.unit === unit) return Math.max(0, Math.min(4, Math.ceil(-Math.log10(res.value) - 1e-9)))
  return unit === 'bar' ? 1 : unit === 'MPa' ? 3 : unit === 'mbar' ? 0 : 0
}

export function pressureText(q: { value: number; unit: string; reference?: 'gauge' | 'absolute' }, decimals: number): string {
  const ref = q.reference === 'gauge' ? ' g' : q.reference === 'absolute' ? ' a' : ''
  return `${fmt(q.value, decimals)} ${q.unit}${ref}`
}

export function massText(q: { value: number; unit: string }): string {
  return `${fmt(q.value, q.unit === 'g' ? 1 : 3)} ${q.unit}`
}

export const TEMPERATURE_TEXT: Record<string, string> = { C: '°C', F: '°F', K: 'K' }

export function temperatureText(q: { value: number; unit: string }, decimals = 1): string {
  return `${fmt(q.value, decimals)} ${TEMPERATURE_TEXT[q.unit] ?? q.unit}`
}

/** The unit a specification states a component in: as the customer asked, else ppm below 0.1 %, else %. */
export function specUnitOf(gasId: string, line: Pick<PlanLineSpec, 'components'> | null, fraction: number): 'ppm' | 'percent' {
  const c = line?.components.find((x) => x.gas === gasId)
  if (c?.unit === 'ppm') return 'ppm'
  if (c?.unit === 'percent') return 'percent'
  return fraction > 0 && fraction < 0.001 ? 'ppm' : 'percent'
}

export function inSpecUnits(fraction: number, unit: 'ppm' | 'percent'): string {
  return unit === 'ppm' ? `${fmt(fraction * 1e6, 2)} ppm` : `${fmt(fraction * 100, 3)} %`
}
