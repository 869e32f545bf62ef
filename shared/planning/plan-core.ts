/**
 * One fill plan, without the premix proposal: total amount from the final state, the material balance,
 * the order of additions, each step's cumulative pressure with the chosen model on the composition in the
 * cylinder after that step, p_k = p(T_fill, N_k/V, x^(k)), the scale readings, tolerance windows,
 * temperature tables, the predicted composition with its uncertainty, and the safety findings.
 */
import { solveBalance } from './balance.ts'
import { PlanningInputError } from './errors.ts'
import { type CompositionEos, gasFacts, prepareComposition } from './gas-model.ts'
import { orderAdditions } from './order.ts'
import type { ResolvedInput, ResolvedSource } from './resolve.ts'
import { CAUTIONS, RULES } from './rules.ts'
import { safetyFindings, type StateView } from './safety.ts'
import type { ComponentAmount, FillPlan, PlanStep, PlanWarning, PredictedComponent, TemperatureRow, ToleranceWindow } from './types.ts'
import { gaugeReadingUncertaintyPa, propagateUncertainty, scaleReadingUncertaintyKg } from './uncertainty.ts'

/** Offsets of the temperature table from the fill temperature, K. */
export const TEMPERATURE_TABLE_OFFSETS_K = [-10, -5, 0, 5, 10] as const

/** Molar gas constant for reporting Z = p/(ρRT), CODATA 2018 (exact since 2019). */
const R = 8.314462618

/** A cache of prepared equations of state for one model and component list. */
export function eosCache(r: Pick<ResolvedInput, 'components' | 'input'>, notes: Set<string>, model = r.input.model) {
  const cache = new Map<string, CompositionEos>()
  return (x: readonly number[]): CompositionEos => {
    // compositions equal to 12 significant digits share one prepared model
    const key = x.map((v) => v.toPrecision(12)).join(',')
    let eos = cache.get(key)
    if (!eos) {
      const prepared = prepareComposition(model, r.components, x)
      for (const n of prepared.notes) notes.add(n)
      eos = prepared.eos
      cache.set(key, eos)
    }
    return eos
  }
}

export function toComposition(components: readonly string[], x: readonly number[], u?: readonly number[]): ComponentAmount[] {
  const out: ComponentAmount[] = []
  components.forEach((gasId, i) => {
    if (x[i] > 0) out.push(u ? { gasId, x: x[i], u: u[i] } : { gasId, x: x[i] })
  })
  return out
}

/**
 * Interval of extra amount δ for one addition (others as planned) that keeps every target component
 * within lo..hi: (Cᵢ + aᵢ·δ)/(N + δ) within [loᵢ, hiᵢ] is linear in δ.
 */
export function additionWindow(
  finalAmounts: readonly number[],
  totalMoles: number,
  a: readonly number[],
  target: readonly number[],
  toleranceRelative: number,
): { low: number; high: number } {
  let low = -Infinity
  let high = Infinity
  const bound = (coef: number, rhs: number, upper: boolean): void => {
    // upper: coef·δ ≤ rhs ; lower: coef·δ ≥ rhs
    if (coef === 0) {
      if (upper ? rhs < 0 : rhs > 0) {
        low = 0
        high = 0
      }
      return
    }
    const v = rhs / coef
    const isUpper = upper === coef > 0
    if (isUpper) high = Math.min(high, v)
    else low = Math.max(low, v)
  }
  target.forEach((b, i) => {
    if (!(b > 0)) return
    const lo = b * (1 - toleranceRelative)
    const hi = b * (1 + toleranceRelative)
    bound(a[i] - lo, lo * totalMoles - finalAmounts[i], false)
    bound(a[i] - hi, hi * totalMoles - finalAmounts[i], true)
  })
  return { low: Math.min(low, 0), high: Math.max(high, 0) }
}

export interface BuiltPlan {
  readonly plan: FillPlan
  /** sources in filling order (one per step) */
  readonly stepSources: readonly ResolvedSource[]
  readonly residualMoles: number
  /** amount per resolved source, mol */
  readonly amounts: readonly number[]
}

export function buildPlan(r: ResolvedInput, asOfDate?: string): BuiltPlan {
  const model = r.input.model
  const comps = r.components
  const C = comps.length
  const V = r.volumeM3
  const Tfill = r.fillTemperatureK
  const atm = r.atmosphericPressurePa
  const notes = new Set<string>()
  const eosOf = eosCache(r, notes)
  const warnings: PlanWarning[] = []

  // ---- residual gas
  let residualMoles = 0
  if (r.residual) residualMoles = eosOf(r.residual.a).densityMolPerM3(r.residual.temperatureK, r.residual.pressurePa) * V
  const present = comps.map((_, i) => (r.residual ? r.residual.a[i] * residualMoles : 0))

  // ---- total amount and material balance (the final composition feeds back into ρ through impurities)
  let xFinal = [...r.target]
  let N = 0
  let solution = null as ReturnType<typeof solveBalance> | null
  for (let iteration = 0; iteration < 10; iteration++) {
    const Nnew = eosOf(xFinal).densityMolPerM3(r.referenceTemperatureK, r.finalPressurePa) * V
    if (residualMoles >= Nnew) {
      throw new PlanningInputError('the gas already in the cylinder is at least the amount the finished cylinder holds', 'cylinder.residual', 422)
    }
    solution = solveBalance({
      components: comps,
      target: r.target,
      balanceIndex: r.balanceIndex,
      sourceA: r.sources.map((s) => s.a),
      sourceIds: r.sources.map((s) => s.id),
      present,
      totalMoles: Nnew,
      toleranceRelative: r.toleranceRelative,
      presentField: 'cylinder.residual',
    })
    const change = Math.abs(Nnew - N) / Nnew
    const dx = Math.max(...solution.predicted.map((v, i) => Math.abs(v - xFinal[i])))
    N = Nnew
    xFinal = solution.predicted
    if (change < 1e-13 && dx < 1e-15) break
  }
  const sol = solution!
  const amounts = sol.amounts

  // ---- order and steps
  const { order, rules } = orderAdditions(r.input.order, comps, r.sources, amounts, r.balanceIndex, r.residual !== null, Tfill)
  const finalAmounts = [...present]
  for (const A of order) for (let i = 0; i < C; i++) finalAmounts[i] += r.sources[A].a[i] * amounts[A]
  const Ntot = finalAmounts.reduce((s, v) => s + v, 0)
  const c = [...present]
  let Ncum = residualMoles
  let massCum = 0
  const steps: PlanStep[] = []
  const states: StateView[] = []
  if (r.residual) states.push({ step: null, x: r.residual.a, moles: residualMoles, eos: eosOf(r.residual.a) })
  const initialPressurePa = r.residual ? eosOf(r.residual.a).pressurePa(Tfill, residualMoles / V) : 0
  let prevPressure = initialPressurePa
  const stepSources = order.map((A) => r.sources[A])
  order.forEach((A, k) => {
    const src = r.sources[A]
    const n = amounts[A]
    for (let i = 0; i < C; i++) c[i] += src.a[i] * n
    Ncum += n
    const x = c.map((v) => v / Ncum)
    const eos = eosOf(x)
    const rho = Ncum / V
    const p = eos.pressurePa(Tfill, rho)
    const mass = n * src.molarMassKgPerMol
    massCum += mass
    // tolerance window: this addition varied, the others as planned
    const w = additionWindow(finalAmounts, Ntot, src.a, r.target, r.toleranceRelative)
    const dLow = Math.max(w.low, -n)
    const dHigh = Number.isFinite(w.high) ? w.high : Ntot
    // window edges with the step's composition (the edge composition differs only within the tolerance)
    const pressureAt = (d: number): number => (Ncum + d > 0 ? eos.pressurePa(Tfill, (Ncum + d) / V) : 0)
    const window: ToleranceWindow = {
      molesLow: Ncum + dLow,
      molesHigh: Ncum + dHigh,
      pressureLowPa: pressureAt(dLow),
      pressureHighPa: pressureAt(dHigh),
      massLowKg: massCum + dLow * src.molarMassKgPerMol,
      massHighKg: massCum + dHigh * src.molarMassKgPerMol,
    }
    const temperatureTable: TemperatureRow[] = TEMPERATURE_TABLE_OFFSETS_K.map((dT) => ({
      temperatureK: Tfill + dT,
      pressurePa: dT === 0 ? p : eos.pressurePa(Tfill + dT, rho),
    }))
    steps.push({
      index: k,
      sourceId: src.id,
      label: src.label,
      sourceComposition: toComposition(comps, src.a, src.u),
      molesAdded: n,
      massAddedKg: mass,
      cumulativeMoles: Ncum,
      cumulativeMassKg: massCum,
      cumulativePressurePa: p,
      cumulativeGaugePressurePa: p - atm,
      pressureRisePa: p - prevPressure,
      compressibility: p / (rho * R * Tfill),
      window,
      temperatureTable,
      compositionAfter: toComposition(comps, x),
    })
    states.push({ step: k, x, moles: Ncum, eos })
    prevPressure = p
  })
  const final = states[states.length - 1]

  // ---- uncertainty of the predicted composition
  const unc = propagateUncertainty({
    method: r.input.method,
    components: comps,
    volumeM3: V,
    fillTemperatureK: Tfill,
    residual: r.residual ? { moles: residualMoles, a: r.residual.a, u: r.residual.u, temperatureK: r.residual.temperatureK, eos: eosOf(r.residual.a) } : null,
    steps: stepSources.map((src, k) => ({
      label: src.label,
      a: src.a,
      u: src.u,
      mainIndex: src.mainIndex,
      moles: steps[k].molesAdded,
      cumulativeMoles: steps[k].cumulativeMoles,
      molarMassKgPerMol: src.molarMassKgPerMol,
      eos: states[r.residual ? k + 1 : k].eos,
      pressurePa: steps[k].cumulativePressurePa,
    })),
    predicted: final.x,
    gauge: r.gauge,
    scale: r.scale,
    temperatureUncertaintyK: r.temperatureUncertaintyK,
    atmosphericUncertaintyPa: r.atmosphericUncertaintyPa,
    eosOf: model === 'ideal' || r.input.method !== 'partial-pressure' ? undefined : eosOf,
  })
  const predictedComposition: PredictedComponent[] = comps.flatMap((gasId, i) =>
    final.x[i] > 0 || r.target[i] > 0
      ? [
          {
            gasId,
            x: final.x[i],
            u: unc.u[i],
            expandedU: 2 * unc.u[i],
            target: r.target[i],
            deviationRelative: r.target[i] > 0 ? (final.x[i] - r.target[i]) / r.target[i] : null,
          },
        ]
      : [],
  )
  // largest contributions per target component
  const budget = comps.flatMap((gasId, i) =>
    r.target[i] > 0
      ? unc.contributions
          .filter((q) => q.gasId === gasId)
          .sort((p, q) => q.contribution - p.contribution)
          .slice(0, 4)
      : [],
  )

  // ---- findings about the solution and measurability
  if (sol.maxRelativeDeviation > 1e-6) {
    // above a tenth of the tolerance it matters for the blender; below it is only reported
    const notable = sol.maxRelativeDeviation > 0.1 * r.toleranceRelative
    warnings.push({
      code: 'TARGET_NOT_EXACT',
      severity: notable ? 'caution' : 'info',
      message: `The sources cannot reproduce the target exactly (impurities or premix compositions); largest deviation ${(sol.maxRelativeDeviation * 100).toPrecision(2)} % relative for ${gasFacts(comps[sol.worstIndex]).formula}, within the ±${(r.toleranceRelative * 100).toFixed(1)} % blend tolerance.`,
    })
  }
  comps.forEach((gasId, i) => {
    if (r.target[i] === 0 && final.x[i] >= 1e-3) {
      warnings.push({
        code: 'UNPLANNED_COMPONENT',
        severity: 'caution',
        message: `${gasFacts(gasId).formula} is not in the target but will be ${(final.x[i] * 100).toPrecision(3)} % of the mixture.`,
      })
    }
  })
  r.sources.forEach((s, A) => {
    if (!order.includes(A)) warnings.push({ code: 'SOURCE_NOT_USED', severity: 'info', message: `Source ${s.id} is not needed for this target.` })
  })
  for (const note of notes) warnings.push({ code: 'MODEL_FALLBACK', severity: 'info', message: note })
  const uP = gaugeReadingUncertaintyPa(r.gauge)
  const uM = scaleReadingUncertaintyKg(r.scale)
  const minSteps = RULES.measurableResolutionSteps.value
  steps.forEach((step, k) => {
    if (!(step.pressureRisePa > 0)) {
      warnings.push({
        code: 'PRESSURE_NOT_RISING',
        severity: 'block',
        caution: CAUTIONS.condensation,
        step: k,
        message: `The ${model} model predicts no pressure rise (${(step.pressureRisePa / 1e5).toPrecision(3)} bar) for step ${k + 1}: the cylinder contents are in or near the two-phase region at the fill temperature. Lower the pressure, warm the fill or change the order.`,
      })
    }
  })
  steps.forEach((step, k) => {
    const src = stepSources[k]
    const principal = principalComponent(src, amounts[order[k]], finalAmounts, r)
    if (principal < 0) return
    const relU = (2 * unc.u[principal]) / final.x[principal]
    const tooSmall =
      r.input.method === 'gravimetric' ? step.massAddedKg < minSteps * r.scale.resolutionKg : step.pressureRisePa < minSteps * r.gauge.resolutionPa
    const formula = gasFacts(comps[principal]).formula
    if (tooSmall) {
      warnings.push({
        code: 'STEP_NOT_MEASURABLE',
        severity: 'caution',
        caution: CAUTIONS.measurement,
        step: k,
        message:
          r.input.method === 'gravimetric'
            ? `Step ${k + 1} adds ${(step.massAddedKg * 1000).toPrecision(3)} g, less than ${minSteps} × the scale resolution (${(r.scale.resolutionKg * 1000).toPrecision(3)} g).`
            : `Step ${k + 1} raises the pressure by ${(step.pressureRisePa / 1e5).toPrecision(3)} bar, less than ${minSteps} × the gauge resolution (${(r.gauge.resolutionPa / 1e5).toPrecision(3)} bar).`,
      })
    }
    if (relU > r.budgetRelative) {
      warnings.push({
        code: 'UNCERTAINTY_OVER_BUDGET',
        severity: 'caution',
        caution: CAUTIONS.measurement,
        step: k,
        message: `${formula}: expanded uncertainty (k = 2) ${(relU * 100).toPrecision(3)} % relative exceeds the budget of ${(r.budgetRelative * 100).toPrecision(3)} % (one reading: u = ${r.input.method === 'gravimetric' ? `${(uM * 1000).toPrecision(2)} g` : `${(uP / 1e5).toPrecision(2)} bar`}).`,
      })
    }
  })

  // ---- safety
  const safety = safetyFindings({ r, states, stepSources, asOfDate })
  warnings.push(...safety.warnings)
  const totalMassKg = massCum + (r.residual ? residualMoles * r.residual.a.reduce((s, ai, i) => s + ai * r.molarMassKgPerMol[i], 0) : 0)
  const plan: FillPlan = {
    method: r.input.method,
    model,
    modelNotes: [...notes],
    finalPressurePa: r.finalPressurePa,
    referenceTemperatureK: r.referenceTemperatureK,
    fillTemperatureK: Tfill,
    atmosphericPressurePa: atm,
    waterVolumeM3: V,
    totalMoles: N,
    totalMassKg,
    initial: {
      moles: residualMoles,
      pressurePa: initialPressurePa,
      composition: r.residual ? toComposition(comps, r.residual.a) : [],
    },
    steps,
    predictedComposition,
    uncertaintyMethod: unc.method,
    uncertaintyBudget: budget,
    solution: {
      method: sol.method,
      maxRelativeDeviation: sol.maxRelativeDeviation,
      note:
        sol.method === 'direct'
          ? 'Material balance solved directly: one source per target component, square system (target rows other than the balance gas, plus the total amount).'
          : 'Material balance solved by non-negative least squares (Lawson–Hanson) over every component, relative weights, total amount held.',
    },
    orderRules: rules,
    pressureChecks: safety.pressureChecks,
    classification: safety.classification,
    minimumSafeTemperatureK: safety.minimumSafeTemperatureK,
    warnings,
    approvable: !warnings.some((w) => w.severity === 'block'),
    assumptions: [
      ...r.assumptions,
      'Cylinder volume taken as the water volume; elastic expansion under pressure neglected.',
      'Readings are taken with the gas at the fill temperature (settled); the temperature table shows the targets if it is not.',
      'Gauge readings converted to absolute with the local atmospheric pressure.',
      "Tolerance-window pressures are evaluated with the step's planned composition.",
    ],
  }
  return { plan, stepSources, residualMoles, amounts }
}

/** The target component (other than the balance gas) this addition supplies the largest share of; −1 for none. */
export function principalComponent(src: ResolvedSource, moles: number, finalAmounts: readonly number[], r: ResolvedInput): number {
  let best = -1
  let bestShare = 0
  r.target.forEach((b, i) => {
    if (!(b > 0) || i === r.balanceIndex || !(finalAmounts[i] > 0)) return
    const share = (src.a[i] * moles) / finalAmounts[i]
    if (share > bestShare) {
      bestShare = share
      best = i
    }
  })
  return bestShare > 0.5 ? best : -1
}
