/**
 * Re-planning from what was actually put in. You cannot take one component out of a cylinder: venting
 * removes everything in proportion. So after an overshoot or undershoot the options are, in order of
 * preference: adjust the later additions; raise the final pressure (within the cylinder's limit) so the
 * excess becomes the right fraction; vent part of the contents and re-add; or vent, evacuate and remake
 * (DOMAIN §11.1).
 */
import { guardPhysics, PlanningInputError } from './errors.ts'
import { computeFillPlan } from './fill-plan.ts'
import { inferSteps, type Reading } from './inference.ts'
import { buildPlan, eosCache, toComposition } from './plan-core.ts'
import { resolveInput } from './resolve.ts'
import { RULES } from './rules.ts'
import type { ComponentAmount, FillPlan, FillPlanInput, PlanWarning } from './types.ts'

export interface StepActual {
  /** index into the original plan's steps (0-based) */
  readonly stepIndex: number
  /** cumulative absolute pressure read after the step, with the gas temperature at that reading */
  readonly pressurePa?: number
  readonly temperatureK?: number
  /** cumulative scale reading: gas mass added since the start of the fill */
  readonly scaleMassKg?: number
}

export type ReplanStatus = 'on-track' | 'adjusted' | 'cannot-meet'

export interface ReplanOption {
  readonly kind: 'continue' | 'accept' | 'top-up' | 'vent' | 'remake'
  readonly description: string
  /** new settled final pressure (top-up), absolute */
  readonly finalPressurePa?: number
  /** pressure at fill temperature to vent down to before re-adding (vent), absolute */
  readonly ventToPressurePa?: number
  readonly plan?: FillPlan
}

export interface InferredStepReport {
  readonly index: number
  readonly sourceId: string
  readonly plannedMoles: number
  readonly actualMoles: number
  readonly deviationRelative: number
  readonly measured: boolean
}

export interface ReplanResult {
  readonly status: ReplanStatus
  readonly verdict: string
  readonly completedSteps: number
  readonly original: FillPlan
  readonly inferredSteps: readonly InferredStepReport[]
  /** inferred contents of the cylinder now */
  readonly composition: readonly ComponentAmount[]
  readonly moles: number
  readonly pressureAtFillTemperaturePa: number
  /** plan for the remaining steps from the present contents (null when it cannot meet the spec) */
  readonly remainingPlan: FillPlan | null
  readonly options: readonly ReplanOption[]
  readonly warnings: readonly PlanWarning[]
}

function tryPlan(input: FillPlanInput): FillPlan | null {
  try {
    return computeFillPlan({ ...input, proposePremix: false })
  } catch (error) {
    if (error instanceof PlanningInputError && error.status === 422) return null
    throw error
  }
}

export function replanFromActuals(input: FillPlanInput, actuals: readonly StepActual[]): ReplanResult {
  return guardPhysics(() => replanFromActualsUnguarded(input, actuals))
}

function replanFromActualsUnguarded(input: FillPlanInput, actuals: readonly StepActual[]): ReplanResult {
  const r = resolveInput(input)
  const built = buildPlan(r, input.asOfDate)
  const original = built.plan
  const K = original.steps.length
  if (actuals.length === 0) throw new PlanningInputError('no actual readings given', 'actuals')
  const readings: (Reading | undefined)[] = []
  const seen = new Set<number>()
  actuals.forEach((a, j) => {
    const field = `actuals[${j}]`
    if (!Number.isInteger(a.stepIndex) || a.stepIndex < 0 || a.stepIndex >= K) {
      throw new PlanningInputError(`step index must be 0..${K - 1}`, `${field}.stepIndex`)
    }
    if (seen.has(a.stepIndex)) throw new PlanningInputError('two readings for one step', `${field}.stepIndex`)
    seen.add(a.stepIndex)
    if (a.pressurePa !== undefined) {
      if (!(a.pressurePa > 0) || !Number.isFinite(a.pressurePa))
        throw new PlanningInputError('pressure must be a positive number (absolute)', `${field}.pressure`)
      const T = a.temperatureK ?? r.fillTemperatureK
      if (!(T > 0) || !Number.isFinite(T)) throw new PlanningInputError('temperature must be positive', `${field}.temperature`)
      readings[a.stepIndex] = { kind: 'pressure', pressurePa: a.pressurePa, temperatureK: T }
    } else if (a.scaleMassKg !== undefined) {
      if (!Number.isFinite(a.scaleMassKg) || a.scaleMassKg < 0)
        throw new PlanningInputError('scale reading must be a non-negative number', `${field}.scaleMass`)
      readings[a.stepIndex] = { kind: 'scale', cumulativeMassKg: a.scaleMassKg }
    } else {
      throw new PlanningInputError('a reading needs a pressure (with temperature) or a scale mass', field)
    }
  })
  const completed = Math.max(...actuals.map((a) => a.stepIndex)) + 1
  while (readings.length < completed) readings.push(undefined)
  const notes = new Set<string>()
  const eosOf = eosCache(r, notes)
  const start = r.components.map((_, i) => (r.residual ? r.residual.a[i] * built.residualMoles : 0))
  const planned = original.steps.map((s) => s.molesAdded)
  const inferred = inferSteps(eosOf, r.volumeM3, start, built.stepSources, readings, planned)
  const last = inferred[inferred.length - 1]
  const x = last.x
  const moles = last.cumulativeMoles
  const pressureNow = eosOf(x).pressurePa(r.fillTemperatureK, moles / r.volumeM3)
  const composition = toComposition(r.components, x)
  const inferredSteps: InferredStepReport[] = inferred.map((s, k) => ({
    index: k,
    sourceId: built.stepSources[k].id,
    plannedMoles: planned[k],
    actualMoles: s.molesAdded,
    deviationRelative: (s.molesAdded - planned[k]) / planned[k],
    measured: readings[k] !== undefined,
  }))
  const asResidual = (pressurePa: number): FillPlanInput['cylinder'] => ({
    ...input.cylinder,
    residual: { kind: 'residual', pressurePa, temperatureK: r.fillTemperatureK, composition },
  })
  const warnings: PlanWarning[] = []
  const options: ReplanOption[] = []
  let remainingPlan: FillPlan | null = null
  let status: ReplanStatus

  if (completed >= K) {
    const worst = Math.max(...r.target.map((b, i) => (b > 0 ? Math.abs(x[i] - b) / b : 0)))
    status = worst <= r.toleranceRelative ? 'on-track' : 'cannot-meet'
    if (status === 'on-track') {
      options.push({
        kind: 'accept',
        description: `All additions made; every component is within ±${(r.toleranceRelative * 100).toFixed(1)} % of target (largest deviation ${(worst * 100).toFixed(2)} %). Settle, analyse and certify the actual value.`,
      })
    }
  } else {
    const remainingSources = built.stepSources.slice(completed).map((s) => input.sources[s.inputIndex])
    remainingPlan = tryPlan({ ...input, cylinder: asResidual(pressureNow), sources: remainingSources, order: 'as-given' })
    if (remainingPlan) {
      const shift = Math.max(...remainingPlan.steps.map((s, j) => Math.abs(s.cumulativePressurePa - original.steps[completed + j].cumulativePressurePa)))
      const massShift = Math.max(
        ...remainingPlan.steps.map(
          (s, j) => Math.abs(s.molesAdded - original.steps[completed + j].molesAdded) * built.stepSources[completed + j].molarMassKgPerMol,
        ),
      )
      const small = input.method === 'gravimetric' ? massShift <= r.scale.resolutionKg : shift <= r.gauge.resolutionPa
      status = small ? 'on-track' : 'adjusted'
      options.push({
        kind: 'continue',
        description: small ? 'Continue with the original targets.' : 'Continue with the adjusted targets for the remaining steps.',
        plan: remainingPlan,
      })
    } else status = 'cannot-meet'
  }

  if (status === 'cannot-meet') {
    const serviceLimit = input.cylinder.servicePressurePa - r.atmosphericPressurePa
    const limitAbs = serviceLimit * (r.rules === 'us' && input.cylinder.plusRated ? RULES.usPlusFactor.value : 1) + r.atmosphericPressurePa
    // top-up: the lowest higher final pressure that brings every component within tolerance
    const topUpAt = (p: number): FillPlan | null => tryPlan({ ...input, finalPressurePa: p, cylinder: asResidual(pressureNow), order: 'auto' })
    let found: { p: number; plan: FillPlan } | null = null
    let lastBad = r.finalPressurePa
    for (let j = 1; j <= 24 && !found; j++) {
      const p = r.finalPressurePa + ((limitAbs - r.finalPressurePa) * j) / 24
      if (p <= r.finalPressurePa) break
      const plan = topUpAt(p)
      if (plan) found = { p, plan }
      else lastBad = p
    }
    if (found) {
      let lo = lastBad
      let hi = found.p
      for (let j = 0; j < 14; j++) {
        const mid = (lo + hi) / 2
        const plan = topUpAt(mid)
        if (plan) {
          hi = mid
          found = { p: mid, plan }
        } else lo = mid
      }
      options.push({
        kind: 'top-up',
        description: `Raise the settled final pressure to ${((found.p - r.atmosphericPressurePa) / 1e5).toFixed(2)} bar gauge (service pressure ${(serviceLimit / 1e5).toFixed(1)} bar gauge) so the excess becomes the right fraction.`,
        finalPressurePa: found.p,
        plan: found.plan,
      })
    }
    // vent: keep the largest share of the contents that still lets the sources reach the target
    const ventAt = (f: number): FillPlan | null => {
      const p = eosOf(x).pressurePa(r.fillTemperatureK, (f * moles) / r.volumeM3)
      return tryPlan({ ...input, cylinder: asResidual(p), order: 'auto' })
    }
    let keep: { f: number; plan: FillPlan } | null = null
    let lastBadF = 1
    for (let j = 1; j < 20 && !keep; j++) {
      const f = 1 - j / 20
      const plan = ventAt(f)
      if (plan) keep = { f, plan }
      else lastBadF = f
    }
    if (keep) {
      let lo = keep.f
      let hi = lastBadF
      for (let j = 0; j < 14; j++) {
        const mid = (lo + hi) / 2
        const plan = ventAt(mid)
        if (plan) {
          lo = mid
          keep = { f: mid, plan }
        } else hi = mid
      }
      const pv = eosOf(x).pressurePa(r.fillTemperatureK, (keep.f * moles) / r.volumeM3)
      options.push({
        kind: 'vent',
        description: `Vent to ${((pv - r.atmosphericPressurePa) / 1e5).toFixed(2)} bar gauge at fill temperature (keeps ${(keep.f * 100).toFixed(1)} % of the contents, composition unchanged), then fill by the new plan.${pv < r.atmosphericPressurePa ? ' Below atmospheric pressure: needs the vacuum pump.' : ''}`,
        ventToPressurePa: pv,
        plan: keep.plan,
      })
    }
    const remake = tryPlan({ ...input, cylinder: { ...input.cylinder, residual: { kind: 'evacuated' } } })
    if (remake) options.push({ kind: 'remake', description: 'Vent, evacuate and make the cylinder again from the start.', plan: remake })
    warnings.push({
      code: 'SPEC_CANNOT_BE_MET',
      severity: 'caution',
      message:
        'With the gas already in the cylinder the ordered composition cannot be reached at the ordered pressure. Choose one of the options; venting removes every component in proportion.',
    })
  }
  for (const note of notes) warnings.push({ code: 'MODEL_FALLBACK', severity: 'info', message: note })
  const verdict =
    status === 'on-track'
      ? 'On track: the readings agree with the plan.'
      : status === 'adjusted'
        ? 'Adjusted: the remaining targets were recomputed so the finished cylinder lands within tolerance.'
        : `Cannot meet the specification as ordered; ${options.length} option(s): ${options.map((o) => o.kind).join(', ') || 'none'}.`
  return {
    status,
    verdict,
    completedSteps: completed,
    original,
    inferredSteps,
    composition,
    moles,
    pressureAtFillTemperaturePa: pressureNow,
    remainingPlan,
    options,
    warnings,
  }
}
