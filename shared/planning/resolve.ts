/**
 * Input checking and defaults: turns a FillPlanInput into vectors over one component list.
 * Every rejection is a PlanningInputError naming the wire field (400), never a generic crash.
 */
import { PlanningInputError } from './errors.ts'
import { gasFacts } from './gas-model.ts'
import type { ComponentAmount, CylinderRules, FillPlanInput, GaugeInput, ScaleInput } from './types.ts'

/** Mole fractions must sum to 1 within this (absolute). */
export const FRACTION_SUM_TOLERANCE = 1e-6

export interface ResolvedSource {
  readonly id: string
  readonly label: string
  readonly kind: 'pure' | 'premix'
  /** position in input.sources */
  readonly inputIndex: number
  /** amount fractions over the plan's component list */
  readonly a: readonly number[]
  /** standard uncertainties of `a` */
  readonly u: readonly number[]
  /** component that makes up the rest when another fraction changes (main gas or premix matrix) */
  readonly mainIndex: number
  readonly molarMassKgPerMol: number
}

export interface ResolvedResidual {
  readonly pressurePa: number
  readonly temperatureK: number
  readonly a: readonly number[]
  readonly u: readonly number[]
}

export interface ResolvedInput {
  readonly input: FillPlanInput
  readonly components: readonly string[]
  readonly molarMassKgPerMol: readonly number[]
  readonly target: readonly number[]
  readonly balanceIndex: number
  readonly volumeM3: number
  readonly finalPressurePa: number
  readonly referenceTemperatureK: number
  readonly fillTemperatureK: number
  readonly atmosphericPressurePa: number
  readonly minimumTemperatureK: number
  readonly maximumTemperatureK: number
  readonly rules: CylinderRules
  readonly toleranceRelative: number
  readonly budgetRelative: number
  readonly gauge: GaugeInput
  readonly scale: Required<ScaleInput>
  readonly temperatureUncertaintyK: number
  readonly atmosphericUncertaintyPa: number
  readonly residual: ResolvedResidual | null
  readonly sources: readonly ResolvedSource[]
  readonly assumptions: readonly string[]
}

/** Default lowest / highest cylinder temperature: −20 °C and 65 °C. */
export const DEFAULT_MINIMUM_TEMPERATURE_K = 253.15
export const DEFAULT_MAXIMUM_TEMPERATURE_K = 338.15
export const DEFAULT_BLEND_TOLERANCE = 0.05

/** Gauge spans offered when none is given, bar: the 1–1.6–2.5–4–6 series of EN 837-1 ranges (from memory). */
const GAUGE_SPANS_BAR = [1, 1.6, 2.5, 4, 6, 10, 16, 25, 40, 60, 100, 160, 250, 400, 600, 1000]

function finitePositive(value: number, field: string, what: string): number {
  if (!Number.isFinite(value) || value <= 0) throw new PlanningInputError(`${what} must be a positive finite number`, field)
  return value
}

function fraction(value: number, field: string): number {
  if (!Number.isFinite(value) || value < 0 || value > 1) {
    throw new PlanningInputError('an amount fraction must lie in 0..1', field)
  }
  return value
}

function checkComposition(list: readonly ComponentAmount[], field: string): void {
  if (list.length === 0) throw new PlanningInputError('a composition needs at least one component', field)
  const seen = new Set<string>()
  let sum = 0
  list.forEach((c, i) => {
    gasFacts(c.gasId, `${field}[${i}].gas`)
    if (seen.has(c.gasId)) throw new PlanningInputError(`gas "${c.gasId}" appears twice`, `${field}[${i}].gas`)
    seen.add(c.gasId)
    sum += fraction(c.x, `${field}[${i}].fraction`)
    if (c.u !== undefined && (!Number.isFinite(c.u) || c.u < 0)) {
      throw new PlanningInputError('an uncertainty must be a non-negative number', `${field}[${i}].uncertainty`)
    }
  })
  if (Math.abs(sum - 1) > FRACTION_SUM_TOLERANCE) {
    throw new PlanningInputError(`fractions sum to ${sum.toPrecision(10)}, not 1 (±${FRACTION_SUM_TOLERANCE})`, field)
  }
}

/**
 * Replace pseudo-components (air) by their constituents, merging repeats; uncertainties scale with the
 * constituent share and combine in quadrature. The gas library's stated composition is used as exact.
 */
export function expandComposition(list: readonly ComponentAmount[]): ComponentAmount[] {
  const out = new Map<string, { x: number; u2: number; hasU: boolean }>()
  const add = (gasId: string, x: number, u: number | undefined): void => {
    const prev = out.get(gasId) ?? { x: 0, u2: 0, hasU: false }
    out.set(gasId, { x: prev.x + x, u2: prev.u2 + (u ?? 0) ** 2, hasU: prev.hasU || u !== undefined })
  }
  for (const c of list) {
    const parts = gasFacts(c.gasId).composition
    if (!parts) add(c.gasId, c.x, c.u)
    else for (const part of parts) add(part.gasId, c.x * part.x, c.u === undefined ? undefined : c.u * part.x)
  }
  return [...out.entries()].map(([gasId, v]) => (v.hasU ? { gasId, x: v.x, u: Math.sqrt(v.u2) } : { gasId, x: v.x }))
}

export function resolveInput(input: FillPlanInput): ResolvedInput {
  const assumptions: string[] = []
  // --- target
  checkComposition(input.target, 'target')
  const givenTarget = input.target.filter((c) => c.x > 0)
  const givenBalance = input.balanceGasId ?? [...givenTarget].sort((p, q) => q.x - p.x)[0].gasId
  if (!givenTarget.some((c) => c.gasId === givenBalance)) {
    throw new PlanningInputError(`balance gas "${givenBalance}" is not a target component`, 'balanceGas')
  }
  const targetList = expandComposition(givenTarget)
  const balanceParts = gasFacts(givenBalance).composition
  const balanceGasId = balanceParts ? [...balanceParts].sort((p, q) => q.x - p.x)[0].gasId : givenBalance
  if (givenTarget.some((c) => gasFacts(c.gasId).composition)) {
    assumptions.push('Air is planned as its constituents N2/O2/Ar in the gas library proportions.')
  }
  // --- scalars
  const volumeM3 = finitePositive(input.cylinder.waterVolumeM3, 'cylinder.waterVolume', 'water volume')
  const finalPressurePa = finitePositive(input.finalPressurePa, 'finalPressure', 'final pressure (absolute)')
  const referenceTemperatureK = finitePositive(input.referenceTemperatureK, 'referenceTemperature', 'reference temperature')
  const fillTemperatureK = finitePositive(input.fillTemperatureK, 'fillTemperature', 'fill temperature')
  const atmosphericPressurePa = finitePositive(input.atmosphericPressurePa, 'atmosphericPressure', 'atmospheric pressure')
  if (finalPressurePa <= atmosphericPressurePa) {
    throw new PlanningInputError('final pressure must be above atmospheric pressure', 'finalPressure')
  }
  finitePositive(input.cylinder.servicePressurePa, 'cylinder.servicePressure', 'service pressure')
  const minimumTemperatureK = input.minimumTemperatureK ?? DEFAULT_MINIMUM_TEMPERATURE_K
  const maximumTemperatureK = input.maximumTemperatureK ?? DEFAULT_MAXIMUM_TEMPERATURE_K
  finitePositive(minimumTemperatureK, 'minimumTemperature', 'minimum temperature')
  finitePositive(maximumTemperatureK, 'maximumTemperature', 'maximum temperature')
  if (minimumTemperatureK > maximumTemperatureK) {
    throw new PlanningInputError('minimum temperature is above maximum temperature', 'minimumTemperature')
  }
  if (input.minimumTemperatureK === undefined) assumptions.push('Minimum cylinder temperature not given: −20 °C assumed.')
  if (input.maximumTemperatureK === undefined) assumptions.push('Maximum cylinder temperature not given: 65 °C assumed.')
  const toleranceRelative = input.blendToleranceRelative ?? DEFAULT_BLEND_TOLERANCE
  if (!Number.isFinite(toleranceRelative) || toleranceRelative <= 0 || toleranceRelative >= 1) {
    throw new PlanningInputError('blend tolerance must lie between 0 and 1 (relative)', 'blendTolerance')
  }
  if (input.blendToleranceRelative === undefined) assumptions.push('Blend tolerance not given: ±5 % relative assumed.')
  const budgetRelative = input.uncertaintyBudgetRelative ?? toleranceRelative
  finitePositive(budgetRelative, 'uncertaintyBudget', 'uncertainty budget')
  let gauge = input.gauge
  if (!gauge) {
    const needBar = (1.1 * (finalPressurePa - atmosphericPressurePa)) / 1e5
    const spanBar = GAUGE_SPANS_BAR.find((s) => s >= needBar) ?? GAUGE_SPANS_BAR[GAUGE_SPANS_BAR.length - 1]
    gauge = { spanPa: spanBar * 1e5, accuracyClassPercent: 0.25, resolutionPa: (spanBar * 1e5) / 2500 }
    assumptions.push(`Gauge not given: 0–${spanBar} bar, EN 837-1 class 0.25, resolution ${spanBar / 2500} bar assumed (common practice, no source).`)
  }
  finitePositive(gauge.spanPa, 'gauge.span', 'gauge span')
  finitePositive(gauge.resolutionPa, 'gauge.resolution', 'gauge resolution')
  if (!Number.isFinite(gauge.accuracyClassPercent) || gauge.accuracyClassPercent < 0) {
    throw new PlanningInputError('gauge accuracy class must be a non-negative number', 'gauge.accuracyClass')
  }
  const scale: Required<ScaleInput> = {
    resolutionKg: input.scale?.resolutionKg ?? 0.001,
    standardUncertaintyKg: input.scale?.standardUncertaintyKg ?? 0,
  }
  finitePositive(scale.resolutionKg, 'scale.resolution', 'scale resolution')
  if (!input.scale && input.method === 'gravimetric') {
    assumptions.push('Scale not given: 1 g resolution assumed, no other weighing uncertainty (common practice, no source).')
  }
  const temperatureUncertaintyK = input.temperatureUncertaintyK ?? 1
  const atmosphericUncertaintyPa = input.atmosphericPressureUncertaintyPa ?? 100

  // --- components: target first, then whatever sources and residual bring
  const components: string[] = targetList.map((c) => c.gasId)
  const add = (id: string): void => {
    if (!components.includes(id)) components.push(id)
  }
  if (input.sources.length === 0) throw new PlanningInputError('at least one source gas is needed', 'sources')
  const seenIds = new Set<string>()
  input.sources.forEach((s, i) => {
    const field = `sources[${i}]`
    if (seenIds.has(s.id)) throw new PlanningInputError(`source id "${s.id}" appears twice`, `${field}.id`)
    seenIds.add(s.id)
    if (s.composition && s.composition.length > 0) {
      checkComposition(s.composition, `${field}.composition`)
      for (const c of expandComposition(s.composition)) add(c.gasId)
    } else {
      if (!s.gasId) throw new PlanningInputError('a source needs a gas or a premix composition', `${field}.gas`)
      gasFacts(s.gasId, `${field}.gas`)
      for (const c of expandComposition([{ gasId: s.gasId, x: 1 }])) add(c.gasId)
      if (s.purity !== undefined && (!Number.isFinite(s.purity) || s.purity <= 0 || s.purity > 1)) {
        throw new PlanningInputError('purity must lie in (0, 1]', `${field}.purity`)
      }
      let impuritySum = 0
      ;(s.impurities ?? []).forEach((c, j) => {
        gasFacts(c.gasId, `${field}.impurities[${j}].gas`)
        if (c.gasId === s.gasId) throw new PlanningInputError('an impurity cannot be the main gas', `${field}.impurities[${j}].gas`)
        impuritySum += fraction(c.x, `${field}.impurities[${j}].fraction`)
        add(c.gasId)
      })
      const purity = s.purity ?? 1
      if (impuritySum > 1 - purity + FRACTION_SUM_TOLERANCE) {
        throw new PlanningInputError(`impurities sum to ${impuritySum}, more than 1 − purity = ${1 - purity}`, `${field}.impurities`)
      }
    }
  })
  const residualInput = input.cylinder.residual
  if (residualInput.kind === 'residual') {
    checkComposition(residualInput.composition, 'cylinder.residual.composition')
    for (const c of expandComposition(residualInput.composition)) add(c.gasId)
    if (!Number.isFinite(residualInput.pressurePa) || residualInput.pressurePa < 0) {
      throw new PlanningInputError('residual pressure must be a non-negative number (absolute)', 'cylinder.residual.pressure')
    }
  }
  const C = components.length
  const vector = (list: readonly ComponentAmount[]): { a: number[]; u: number[] } => {
    const a = new Array<number>(C).fill(0)
    const u = new Array<number>(C).fill(0)
    for (const c of expandComposition(list)) {
      const k = components.indexOf(c.gasId)
      a[k] += c.x
      u[k] = c.u ?? 0
    }
    return { a, u }
  }
  const target = vector(targetList).a
  const molarMassKgPerMol = components.map((id) => gasFacts(id).molarMassKgPerMol)
  const molarMass = (a: readonly number[]): number => a.reduce((s, xi, k) => s + xi * molarMassKgPerMol[k], 0)

  let premixDefaultNoted = false
  const sources: ResolvedSource[] = input.sources.map((s, i) => {
    if (s.composition && s.composition.length > 0) {
      const { a, u } = vector(s.composition)
      const mainIndex = a.indexOf(Math.max(...a))
      // a certificate without uncertainties: assume 1 % relative standard uncertainty on the minor components
      const missing = s.composition.some((c) => c.u === undefined)
      const expanded = expandComposition(s.composition)
      const uu = u.map((ui, k) => {
        const given = expanded.find((c) => c.gasId === components[k])
        if (given?.u !== undefined || k === mainIndex || a[k] === 0) return ui
        return 0.01 * a[k]
      })
      if (missing && !premixDefaultNoted) {
        premixDefaultNoted = true
        assumptions.push('Premix component without a stated uncertainty: 1 % relative standard uncertainty assumed (common practice, no source).')
      }
      const label = s.id
      return { id: s.id, label, kind: 'premix' as const, inputIndex: i, a, u: uu, mainIndex, molarMassKgPerMol: molarMass(a) }
    }
    const impurities = (s.impurities ?? []).map((c) => ({ ...c, u: c.u ?? c.x / Math.sqrt(3) }))
    const impuritySum = impurities.reduce((acc, c) => acc + c.x, 0)
    const { a, u } = vector([...impurities, { gasId: s.gasId!, x: 1 - impuritySum }])
    const mainParts = expandComposition([{ gasId: s.gasId!, x: 1 }])
    const mainIndex = components.indexOf([...mainParts].sort((p, q) => q.x - p.x)[0].gasId)
    const unlisted = Math.max(0, 1 - (s.purity ?? 1) - impuritySum)
    u[mainIndex] = Math.sqrt(u[mainIndex] ** 2 + (unlisted / Math.sqrt(3)) ** 2)
    return { id: s.id, label: s.gasId!, kind: 'pure' as const, inputIndex: i, a, u, mainIndex, molarMassKgPerMol: molarMass(a) }
  })
  if (input.sources.some((s) => !s.composition && (s.impurities ?? []).some((c) => c.u === undefined))) {
    assumptions.push('Impurity without a stated uncertainty: rectangular over 0..2x, u = x/√3 (the ISO 19229 detection-limit convention, from memory).')
  }
  if (input.sources.some((s) => !s.composition && s.purity !== undefined && s.purity < 1)) {
    assumptions.push(
      'Purity not covered by listed impurities is not carried as a component; it enters the main gas as a rectangular uncertainty, u = (1 − purity − Σ listed)/√3.',
    )
  }
  let residual: ResolvedResidual | null = null
  if (residualInput.kind === 'residual' && residualInput.pressurePa > 0) {
    const { a, u } = vector(residualInput.composition)
    residual = {
      pressurePa: residualInput.pressurePa,
      temperatureK: residualInput.temperatureK ?? fillTemperatureK,
      a,
      u,
    }
  }
  return {
    input,
    components,
    molarMassKgPerMol,
    target,
    balanceIndex: components.indexOf(balanceGasId),
    volumeM3,
    finalPressurePa,
    referenceTemperatureK,
    fillTemperatureK,
    atmosphericPressurePa,
    minimumTemperatureK,
    maximumTemperatureK,
    rules: input.cylinderRules ?? 'eu',
    toleranceRelative,
    budgetRelative,
    gauge,
    scale,
    temperatureUncertaintyK,
    atmosphericUncertaintyPa,
    residual,
    sources,
    assumptions,
  }
}
