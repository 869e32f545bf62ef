/**
 * Safety findings of a fill plan. Findings never hide numbers and never stop the plan being
 * computed; a 'block' only stops approval. Every state the cylinder passes through is checked:
 * the residual, the state after every addition and the finished mixture.
 */
import {
  type CompositionEos,
  gasFacts,
  incompatibilities,
  iso10156FlammabilityIndex,
  lc50MixPpm,
  oxidisingPower,
  saturationPressureForScreenPa,
} from './gas-model.ts'
import { fuelFraction, lflMixFraction, oxygenEquivalent, REACTIVE_PRESENCE_FRACTION } from './hazard-groups.ts'
import { isLiquefiableSource } from './order.ts'
import type { ResolvedInput, ResolvedSource } from './resolve.ts'
import { CAUTIONS, RULES } from './rules.ts'
import type { Classification, PlanWarning, PressureCheck } from './types.ts'

export interface StateView {
  /** step index (0-based) the state follows, or null for the residual before the first addition */
  readonly step: number | null
  readonly x: readonly number[]
  readonly moles: number
  readonly eos: CompositionEos
}

export interface SafetyInput {
  readonly r: ResolvedInput
  /** residual (if any) first, then the state after each step; the last is the finished mixture */
  readonly states: readonly StateView[]
  /** sources in filling order, one per step */
  readonly stepSources: readonly ResolvedSource[]
  readonly asOfDate?: string
}

export interface SafetyResult {
  readonly warnings: PlanWarning[]
  readonly pressureChecks: PressureCheck[]
  readonly classification: Classification
  readonly minimumSafeTemperatureK: number | null
}

const bar = (pa: number): string => `${(pa / 1e5).toFixed(2)} bar`
const pct = (x: number): string => `${(x * 100).toPrecision(3)} %`
const degC = (k: number): string => `${(k - 273.15).toFixed(1)} °C`
const stepName = (s: StateView): string => (s.step === null ? 'residual gas' : `after step ${s.step + 1}`)

/** Condensation screen of one state at temperature T: partial over vapour pressure per component and Raoult dew sum. */
export function condensationScreen(
  components: readonly string[],
  state: Pick<StateView, 'x' | 'moles' | 'eos'>,
  volumeM3: number,
  temperatureK: number,
  include: (i: number) => boolean = () => true,
): { pressurePa: number; ratios: { i: number; ratio: number; estimated: boolean }[]; dewSum: number; noGasState: boolean } {
  let pressurePa: number
  try {
    pressurePa = state.eos.pressurePa(temperatureK, state.moles / volumeM3)
  } catch {
    pressurePa = Number.NaN
  }
  const ratios: { i: number; ratio: number; estimated: boolean }[] = []
  // a model that gives no positive pressure at this density and temperature has no gas-only state there
  const noGasState = !(pressurePa > 0) || !Number.isFinite(pressurePa)
  if (noGasState) {
    const condensable = components.some((id, i) => state.x[i] > 0 && include(i) && gasFacts(id).criticalTemperatureK > temperatureK)
    return { pressurePa: 0, ratios, dewSum: condensable ? Number.MAX_VALUE : 0, noGasState: condensable }
  }
  let dewSum = 0
  for (let i = 0; i < components.length; i++) {
    if (!(state.x[i] > 0) || !include(i)) continue
    const sat = saturationPressureForScreenPa(components[i], temperatureK)
    if (!sat) continue
    const ratio = (state.x[i] * pressurePa) / sat.pressurePa
    ratios.push({ i, ratio, estimated: sat.estimated })
    dewSum += ratio
  }
  return { pressurePa, ratios, dewSum, noGasState: false }
}

/**
 * Lowest temperature at which a state still passes the dew screen Σ xᵢ·p(T)/p_sat,i(T) < 1 at constant
 * density; null when no component can condense above `floorK`.
 */
export function minimumSafeTemperature(
  components: readonly string[],
  state: Pick<StateView, 'x' | 'moles' | 'eos'>,
  volumeM3: number,
  upperK: number,
  include: (i: number) => boolean,
  floorK = 200,
): number | null {
  if (!components.some((id, i) => include(i) && state.x[i] > 0 && gasFacts(id).criticalTemperatureK > floorK)) return null
  // g(T) = ln Σ xᵢp/p_sat,i, smooth and falling with T; root by the Illinois variant of regula falsi
  const g = (T: number): number => {
    const screen = condensationScreen(components, state, volumeM3, T, include)
    if (screen.noGasState) return 50
    return screen.dewSum > 0 ? Math.log(screen.dewSum) : -50
  }
  let hi = upperK
  let gHi = g(hi)
  if (gHi >= 0) return upperK
  let lo = hi
  let gLo = gHi
  for (;;) {
    if (hi <= floorK) return null
    lo = Math.max(floorK, hi - 25)
    gLo = g(lo)
    if (gLo >= 0) break
    hi = lo
    gHi = gLo
  }
  let side = 0
  for (let k = 0; k < 40 && hi - lo > 0.01; k++) {
    const T = (lo * gHi - hi * gLo) / (gHi - gLo)
    const gT = g(T)
    if (gT >= 0) {
      lo = T
      gLo = gT
      if (side === -1) gHi /= 2
      side = -1
    } else {
      hi = T
      gHi = gT
      if (side === 1) gLo /= 2
      side = 1
    }
  }
  return hi
}

export function safetyFindings(input: SafetyInput): SafetyResult {
  const { r, states, stepSources } = input
  const comps = r.components
  const V = r.volumeM3
  const warnings: PlanWarning[] = []
  const pressureChecks: PressureCheck[] = []
  const final = states[states.length - 1]
  const atm = r.atmosphericPressurePa
  const gauge = (p: number): number => p - atm
  const targetIndex = (i: number): boolean => r.target[i] > 0
  const finalAt = (T: number): number => final.eos.pressurePa(T, final.moles / V)

  // ---- pressure limits (all compared on the gauge basis the cylinder is marked in)
  const serviceGauge = gauge(r.input.cylinder.servicePressurePa)
  const settledGauge = gauge(r.finalPressurePa)
  const plus = r.rules === 'us' && r.input.cylinder.plusRated === true
  const serviceLimit = serviceGauge * (plus ? RULES.usPlusFactor.value : 1)
  const check = (label: string, T: number, pGauge: number, limit: number | null, rule: string): boolean => {
    const pass = limit === null || pGauge <= limit * (1 + 1e-9)
    pressureChecks.push({ label, temperatureK: T, pressurePa: pGauge + atm, limitPa: limit === null ? null : limit + atm, rule, pass })
    return pass
  }
  if (
    !check(
      'settled pressure at reference temperature',
      r.referenceTemperatureK,
      settledGauge,
      serviceLimit,
      plus ? RULES.usPlusFactor.source : 'marked service (working) pressure',
    )
  ) {
    warnings.push({
      code: 'OVER_SERVICE_PRESSURE',
      severity: 'block',
      caution: CAUTIONS.pressure,
      message: `Settled pressure ${bar(settledGauge)} gauge at ${degC(r.referenceTemperatureK)} is above the cylinder's ${plus ? '110 % ' : ''}service pressure ${bar(serviceLimit)} gauge.`,
    })
  }
  const Tmax = r.maximumTemperatureK
  if (r.rules === 'us') {
    const T70 = RULES.usServiceTemperatureK.value
    const p70 = gauge(finalAt(T70))
    if (!check('pressure at 70 °F (21.1 °C)', T70, p70, serviceLimit, RULES.usServiceTemperatureK.source)) {
      warnings.push({
        code: 'US_OVER_SERVICE_AT_70F',
        severity: 'block',
        caution: CAUTIONS.pressure,
        message: `At 70 °F the cylinder would hold ${bar(p70)} gauge, above the limit ${bar(serviceLimit)} gauge (49 CFR 173.301a(c)).`,
      })
    }
    const T55 = RULES.usHotTemperatureK.value
    const p55 = gauge(finalAt(T55))
    const limit55 = RULES.usHotFactor.value * serviceLimit
    if (!check('pressure at 131 °F (55 °C)', T55, p55, limit55, `${RULES.usHotTemperatureK.source}; ${RULES.usHotFactor.source}`)) {
      warnings.push({
        code: 'US_OVER_5_4_AT_55C',
        severity: 'block',
        caution: CAUTIONS.pressure,
        message: `At 55 °C the cylinder would develop ${bar(p55)} gauge, above 5/4 of its service pressure, ${bar(limit55)} gauge (49 CFR 173.301a(d)).`,
      })
    }
    if (Tmax > T55) {
      const pMax = gauge(finalAt(Tmax))
      if (!check('pressure at the maximum temperature', Tmax, pMax, limit55, 'the 5/4 × service pressure limit, applied at the stated maximum temperature')) {
        warnings.push({
          code: 'OVER_LIMIT_AT_MAX_TEMPERATURE',
          severity: 'caution',
          caution: CAUTIONS.pressure,
          message: `At the stated maximum of ${degC(Tmax)} the cylinder would develop ${bar(pMax)} gauge, above ${bar(limit55)} gauge. Keep it below 55 °C.`,
        })
      }
    }
  } else {
    const testGauge = r.input.cylinder.testPressurePa !== undefined ? gauge(r.input.cylinder.testPressurePa) : RULES.euDefaultTestFactor.value * serviceGauge
    if (r.input.cylinder.testPressurePa === undefined) {
      warnings.push({
        code: 'TEST_PRESSURE_ASSUMED',
        severity: 'info',
        message: `Test pressure not given: ${bar(testGauge)} gauge (1.5 × service pressure) assumed. Enter the pressure marked on the cylinder.`,
      })
    }
    const T15 = RULES.euReferenceTemperatureK.value
    const p15 = gauge(finalAt(T15))
    const limitWorking = RULES.euWorkingToTestFactor.value * testGauge
    if (!check('working pressure at 15 °C', T15, p15, limitWorking, RULES.euWorkingToTestFactor.source)) {
      warnings.push({
        code: 'EU_OVER_TWO_THIRDS_TEST',
        severity: 'block',
        caution: CAUTIONS.pressure,
        message: `Working pressure at 15 °C, ${bar(p15)} gauge, is above 2/3 of the test pressure, ${bar(limitWorking)} gauge (ADR P200 (3)(f)).`,
      })
    }
    const pMax = gauge(finalAt(Tmax))
    if (
      !check(
        'developed pressure at the maximum temperature',
        Tmax,
        pMax,
        testGauge,
        'developed pressure at the highest temperature must stay within the test pressure',
      )
    ) {
      warnings.push({
        code: 'OVER_TEST_PRESSURE_AT_MAX_TEMPERATURE',
        severity: 'block',
        caution: CAUTIONS.pressure,
        message: `At ${degC(Tmax)} the cylinder would develop ${bar(pMax)} gauge, above its test pressure ${bar(testGauge)} gauge.`,
      })
    }
  }
  const fillGauge = gauge(final.eos.pressurePa(r.fillTemperatureK, final.moles / V))
  if (fillGauge > r.gauge.spanPa) {
    warnings.push({
      code: 'GAUGE_OVER_RANGE',
      severity: 'block',
      caution: CAUTIONS.pressure,
      message: `The last reading, ${bar(fillGauge)} gauge, is beyond the gauge span of ${bar(r.gauge.spanPa)}.`,
    })
  }

  // ---- a liquefied parent gas cannot be delivered as gas above its vapour pressure at the fill temperature
  stepSources.forEach((src, k) => {
    if (!isLiquefiableSource(comps, src, r.fillTemperatureK)) return
    const after = states.find((s) => s.step === k)!
    const p = after.eos.pressurePa(r.fillTemperatureK, after.moles / V)
    const sat = saturationPressureForScreenPa(comps[src.mainIndex], r.fillTemperatureK)
    if (sat && p >= sat.pressurePa) {
      warnings.push({
        code: 'SOURCE_ABOVE_VAPOUR_PRESSURE',
        severity: 'block',
        caution: CAUTIONS.condensation,
        step: k,
        message: `Step ${k + 1} must reach ${bar(p)} (absolute), above the vapour pressure of ${gasFacts(comps[src.mainIndex]).formula} at ${degC(r.fillTemperatureK)} (${bar(sat.pressurePa)}): the gas cannot be delivered as vapour. Add it earlier, at lower cylinder pressure, or use a premix.`,
      })
    }
  })

  // ---- condensation at the lowest temperature, every state at constant density
  const Tcold = Math.min(r.minimumTemperatureK, r.fillTemperatureK)
  let worstCaution: { state: StateView; ratio: number } | null = null
  for (const state of states) {
    const screen = condensationScreen(comps, state, V, Tcold)
    if (screen.noGasState) {
      warnings.push({
        code: 'CONDENSATION',
        severity: 'block',
        caution: CAUTIONS.condensation,
        step: state.step ?? undefined,
        message: `${stepName(state)}: at ${degC(Tcold)} the ${r.input.model} model finds no gas-only state at this density — condensation.`,
      })
      continue
    }
    const over = screen.ratios.filter((q) => q.ratio >= 1)
    const targetOver = over.filter((q) => targetIndex(q.i))
    const dewTarget = screen.ratios.filter((q) => targetIndex(q.i)).reduce((s, q) => s + q.ratio, 0)
    if (targetOver.length > 0 || dewTarget >= 1) {
      const detail = screen.ratios
        .filter((q) => targetIndex(q.i))
        .map((q) => `${gasFacts(comps[q.i]).formula} ${pct(q.ratio)} of its vapour pressure${q.estimated ? ' (estimated)' : ''}`)
        .join(', ')
      warnings.push({
        code: 'CONDENSATION',
        severity: 'block',
        caution: CAUTIONS.condensation,
        step: state.step ?? undefined,
        message: `${stepName(state)}: at ${degC(Tcold)} the cylinder would be at ${bar(screen.pressurePa)} (constant density) and ${detail}; dew screen Σ xᵢp/p_sat = ${dewTarget.toFixed(2)} ≥ 1 — condensation.`,
      })
    } else if (over.length > 0) {
      warnings.push({
        code: 'IMPURITY_CONDENSATION',
        severity: 'caution',
        caution: CAUTIONS.condensation,
        step: state.step ?? undefined,
        message: `${stepName(state)}: impurity ${over.map((q) => gasFacts(comps[q.i]).formula).join(', ')} would be above its vapour pressure at ${degC(Tcold)}; check the parent gas's dryness or raise the minimum temperature.`,
      })
    } else if (dewTarget >= RULES.condensationCautionRatio.value) {
      if (!worstCaution || dewTarget > worstCaution.ratio) worstCaution = { state, ratio: dewTarget }
    }
  }
  if (worstCaution) {
    warnings.push({
      code: 'NEAR_CONDENSATION',
      severity: 'caution',
      caution: CAUTIONS.condensation,
      step: worstCaution.state.step ?? undefined,
      message: `${stepName(worstCaution.state)}: at ${degC(Tcold)} the dew screen reaches ${worstCaution.ratio.toFixed(2)} (less than 10 % margin).`,
    })
  }
  const minimumSafeTemperatureK = minimumSafeTemperature(
    comps,
    final,
    V,
    Math.max(r.fillTemperatureK, r.referenceTemperatureK, r.maximumTemperatureK),
    targetIndex,
  )

  // ---- oxygen
  const o2 = comps.indexOf('oxygen')
  const clean = r.input.cylinder.oxygenClean
  const o2Limit = RULES.oxygenEnrichedFraction.value
  if (o2 >= 0) {
    let maxO2 = 0
    stepSources.forEach((src, k) => {
      if (src.a[o2] > o2Limit) {
        maxO2 = Math.max(maxO2, src.a[o2])
        if (!clean)
          warnings.push({
            code: 'OXYGEN_NOT_CLEAN',
            severity: 'block',
            caution: CAUTIONS.oxygen,
            step: k,
            message: `Step ${k + 1} adds ${src.label} with ${pct(src.a[o2])} O2 (> 23.5 %, ${RULES.oxygenEnrichedFraction.source}) into a cylinder not marked oxygen-clean.`,
          })
      }
    })
    for (const state of states) {
      if (state.x[o2] > o2Limit) {
        maxO2 = Math.max(maxO2, state.x[o2])
        if (!clean)
          warnings.push({
            code: 'OXYGEN_NOT_CLEAN',
            severity: 'block',
            caution: CAUTIONS.oxygen,
            step: state.step ?? undefined,
            message: `${stepName(state)} the cylinder holds ${pct(state.x[o2])} O2 (> 23.5 %, ${RULES.oxygenEnrichedFraction.source}) but is not marked oxygen-clean.`,
          })
      }
    }
    if (maxO2 > RULES.oxygenServiceFraction.value) {
      warnings.push({
        code: 'OXYGEN_SERVICE',
        severity: 'caution',
        caution: CAUTIONS.oxygen,
        message: `Up to ${pct(maxO2)} O2 in the cylinder or an addition: above 40 %, cylinder, valve and manifold must be designed for oxygen service (${RULES.oxygenServiceFraction.source}); open valves slowly and cap the fill rate.`,
      })
    } else if (maxO2 > o2Limit && clean) {
      warnings.push({
        code: 'OXYGEN_ENRICHED',
        severity: 'caution',
        caution: CAUTIONS.oxygen,
        message: `Up to ${pct(maxO2)} O2 in the cylinder or an addition (> 23.5 %): oxygen-clean equipment only.`,
      })
    }
  }

  // ---- flammability of every state, fuel–oxidiser states and sequencing
  const flammableSteps: number[] = []
  for (const state of states) {
    const fuel = fuelFraction(comps, state.x)
    const ox = oxygenEquivalent(comps, state.x)
    if (fuel <= 0) continue
    if (ox < REACTIVE_PRESENCE_FRACTION) {
      const index = iso10156FlammabilityIndex(comps, state.x)
      if (index !== null && index > 1 && state !== final && state.step !== null) flammableSteps.push(state.step)
      continue
    }
    const lfl = lflMixFraction(comps, state.x)
    if (lfl === null || fuel >= lfl) {
      warnings.push({
        code: 'FUEL_OXIDISER_FLAMMABLE_STATE',
        severity: 'block',
        caution: CAUTIONS.fuelOxidiser,
        step: state.step ?? undefined,
        message: `${stepName(state)} the cylinder holds ${pct(fuel)} fuel with ${pct(ox)} oxygen equivalent: ${lfl === null ? 'no lower flammability limit known for a fuel' : `at or above the fuel's lower flammability limit in air (${pct(lfl)}, Le Chatelier)`}.`,
      })
    } else if (fuel >= RULES.fuelLflCautionShare.value * lfl) {
      warnings.push({
        code: 'FUEL_OXIDISER_NEAR_LFL',
        severity: 'caution',
        caution: CAUTIONS.fuelOxidiser,
        step: state.step ?? undefined,
        message: `${stepName(state)}: ${pct(fuel)} fuel with ${pct(ox)} oxygen equivalent is ${pct(fuel / lfl)} of the lower flammability limit in air at 1 atm; limits widen with pressure — feasibility review needed.`,
      })
    }
  }
  if (flammableSteps.length > 0) {
    warnings.push({
      code: 'FLAMMABLE_INTERMEDIATE',
      severity: 'caution',
      caution: CAUTIONS.flammable,
      step: flammableSteps[0],
      message: `The cylinder holds a flammable mixture (ISO 10156 calculation) after step(s) ${flammableSteps.map((k) => k + 1).join(', ')}.`,
    })
  }
  // sequencing: what each addition meets, along the mixing line from the state before to the state after
  const prevOf = (k: number): StateView | null => {
    const idx = states.findIndex((s) => s.step === k)
    return idx > 0 ? states[idx - 1] : null
  }
  stepSources.forEach((src, k) => {
    const before = prevOf(k)
    if (!before) return
    const after = states.find((s) => s.step === k)!
    const fuelSrc = fuelFraction(comps, src.a)
    const oxSrc = oxygenEquivalent(comps, src.a)
    const fuelBefore = fuelFraction(comps, before.x)
    const oxBefore = oxygenEquivalent(comps, before.x)
    const meets = (fuelSrc > 0 && oxBefore >= REACTIVE_PRESENCE_FRACTION) || (oxSrc >= REACTIVE_PRESENCE_FRACTION && fuelBefore > 0)
    if (!meets) return
    const srcFlammable = fuelSrc > 0 && oxSrc < REACTIVE_PRESENCE_FRACTION && (iso10156FlammabilityIndex(comps, src.a) ?? 2) > 1
    const beforeFlammable = fuelBefore > 0 && oxBefore < REACTIVE_PRESENCE_FRACTION && (iso10156FlammabilityIndex(comps, before.x) ?? 2) > 1
    const srcOxidising = (oxidisingPower(comps, src.a) ?? 0) > RULES.oxygenEnrichedFraction.value
    const beforeOxidising = (oxidisingPower(comps, before.x) ?? 0) > RULES.oxygenEnrichedFraction.value
    if ((srcOxidising && beforeFlammable) || (srcFlammable && beforeOxidising)) {
      warnings.push({
        code: 'FUEL_OXIDISER_SEQUENCE',
        severity: 'block',
        caution: CAUTIONS.fuelOxidiser,
        step: k,
        message: `Step ${k + 1} adds ${srcFlammable ? 'a flammable gas into an oxidising' : 'an oxidising gas into a flammable'} cylinder content: concentrated fuel and oxidiser would meet. Use premixes and an inert buffer.`,
      })
      return
    }
    // mixing line: cylinder contents pass through (1 − s)·before + s·after-addition share
    const nSrc = after.moles - before.moles
    let worst = 0
    for (let j = 1; j <= 40; j++) {
      const added = (nSrc * j) / 40
      const tot = before.moles + added
      const x = comps.map((_, i) => (before.x[i] * before.moles + src.a[i] * added) / tot)
      if (oxygenEquivalent(comps, x) < REACTIVE_PRESENCE_FRACTION) continue
      const lfl = lflMixFraction(comps, x)
      const f = fuelFraction(comps, x)
      if (f <= 0) continue
      worst = Math.max(worst, lfl === null ? Infinity : f / lfl)
    }
    if (worst >= 1) {
      warnings.push({
        code: 'FUEL_OXIDISER_SEQUENCE',
        severity: 'block',
        caution: CAUTIONS.fuelOxidiser,
        step: k,
        message: `While step ${k + 1} is added, the cylinder contents pass through a composition at or above the fuel's lower flammability limit with oxidiser present. Reorder, add an inert buffer first or use premixes.`,
      })
    } else {
      const prevSrc = k > 0 ? stepSources[k - 1] : null
      const prevReactive = prevSrc && (fuelSrc > 0 ? oxygenEquivalent(comps, prevSrc.a) >= REACTIVE_PRESENCE_FRACTION : fuelFraction(comps, prevSrc.a) > 0)
      warnings.push({
        code: prevReactive ? 'FUEL_OXIDISER_NO_BUFFER' : 'FUEL_OXIDISER_MIXTURE',
        severity: 'caution',
        caution: CAUTIONS.fuelOxidiser,
        step: k,
        message: prevReactive
          ? `Step ${k + 1} follows the ${fuelSrc > 0 ? 'oxidiser' : 'fuel'} addition with no inert gas between them; add an inert buffer.`
          : `Step ${k + 1} brings fuel and oxidiser together (highest point of the mixing line: ${pct(worst)} of the LFL in air). Oxidant–fuel mixtures need a signed feasibility review.`,
      })
    }
  })

  // ---- incompatible components
  const present = (x: readonly number[]): string[] => comps.filter((_, i) => x[i] > 0)
  const mainGases = new Set<string>()
  for (const src of stepSources)
    src.a.forEach((ai, i) => {
      if (ai >= REACTIVE_PRESENCE_FRACTION || i === src.mainIndex) mainGases.add(comps[i])
    })
  comps.forEach((id, i) => {
    if (r.target[i] > 0) mainGases.add(id)
  })
  if (r.residual)
    r.residual.a.forEach((ai, i) => {
      if (ai >= REACTIVE_PRESENCE_FRACTION) mainGases.add(comps[i])
    })
  for (const pair of incompatibilities(present(final.x))) {
    const major = mainGases.has(pair.gasA) && mainGases.has(pair.gasB)
    warnings.push({
      code: major ? 'INCOMPATIBLE_COMPONENTS' : 'INCOMPATIBLE_IMPURITY',
      severity: major ? 'block' : 'caution',
      caution: CAUTIONS.incompatible,
      message: `${gasFacts(pair.gasA).formula} and ${gasFacts(pair.gasB).formula}${major ? '' : ' (at impurity level)'}: ${pair.reason}`,
    })
  }

  // ---- cylinder test date
  const due = r.input.cylinder.nextTestDate
  if (due && input.asOfDate) {
    if (input.asOfDate > due) {
      warnings.push({
        code: 'CYLINDER_TEST_OVERDUE',
        severity: 'block',
        caution: CAUTIONS.testDate,
        message: `The cylinder's periodic test was due on ${due} (plan date ${input.asOfDate}).`,
      })
    }
  } else if (!due) {
    warnings.push({
      code: 'CYLINDER_TEST_DATE_UNKNOWN',
      severity: 'caution',
      caution: CAUTIONS.testDate,
      message: 'No periodic-test date known for this plan (no cylinder chosen, or none recorded): check the cylinder’s test marking before filling.',
    })
  }

  // ---- classification of the finished mixture
  const index = iso10156FlammabilityIndex(comps, final.x)
  const fuelFinal = fuelFraction(comps, final.x)
  const oxFinal = oxygenEquivalent(comps, final.x)
  const notes: string[] = []
  let flammable: boolean | null
  if (fuelFinal <= 0) flammable = false
  else if (oxFinal < REACTIVE_PRESENCE_FRACTION) {
    flammable = index === null ? null : index > 1
    notes.push(`ISO 10156 calculation (fuel + inert): Σ A'ᵢ/Tciᵢ = ${index === null ? 'n/a' : index.toFixed(3)}; Tci and K values unverified (from memory).`)
  } else {
    const lfl = lflMixFraction(comps, final.x)
    flammable = lfl === null ? null : fuelFinal >= lfl
    notes.push(
      'Mixture contains fuel and oxidiser: ISO 10156 calculation does not apply; compared with the Le Chatelier LFL in air instead — testing or expert assessment needed.',
    )
  }
  const op = oxidisingPower(comps, final.x)
  const oxidising = op !== null && op > RULES.oxygenEnrichedFraction.value && fuelFinal <= 0
  const lc50 = lc50MixPpm(comps, final.x)
  const toxic = lc50 !== null && lc50 <= 5000
  const division: Classification['division'] = toxic ? '2.3' : flammable ? '2.1' : '2.2'
  const subsidiary: string[] = []
  if (oxidising) subsidiary.push('5.1')
  if (toxic && flammable) subsidiary.push('2.1')
  if (lc50 !== null)
    notes.push(`LC50 of the mixture by additivity, 1/Σ(xᵢ/LC50ᵢ) = ${formatLc50Ppm(lc50)} (ADR 2.2.2.1.5; LC50 values from memory, unverified).`)
  if (flammable) {
    warnings.push({
      code: 'FLAMMABLE_MIXTURE',
      severity: 'caution',
      caution: CAUTIONS.flammable,
      message: `The finished mixture is flammable${index !== null ? ` (ISO 10156 Σ = ${index.toFixed(2)} > 1)` : ''}: Division 2.1 outlet, labels and handling.`,
    })
  } else if (flammable === null) {
    warnings.push({
      code: 'FLAMMABILITY_UNKNOWN',
      severity: 'caution',
      caution: CAUTIONS.flammable,
      message: 'Flammability of the finished mixture could not be calculated (missing Tci or LFL); treat as flammable until tested.',
    })
  }
  if (oxidising) {
    warnings.push({
      code: 'OXIDISING_MIXTURE',
      severity: 'caution',
      caution: CAUTIONS.oxygen,
      message: `Oxidising power ${pct(op!)} > 23.5 % (ISO 10156): oxidising gas, subsidiary hazard 5.1.`,
    })
  }
  const toxicComponents = comps.filter((id, i) => final.x[i] > 0 && gasFacts(id).lc50PpmV !== null)
  if (toxicComponents.length > 0) {
    warnings.push({
      code: toxic ? 'TOXIC_MIXTURE' : 'TOXIC_COMPONENT',
      severity: 'caution',
      caution: CAUTIONS.toxic,
      message: toxic
        ? `LC50 of the mixture ${Math.round(lc50!)} ppm ≤ 5000 ppm: toxic gas, Division 2.3.${lc50! <= 200 ? ' LC50 ≤ 200 ppm: no pressure-relief device on the cylinder (ADR P200 (2)).' : ''}`
        : `Contains toxic ${toxicComponents.map((id) => gasFacts(id).formula).join(', ')} (mixture LC50 ${formatLc50Ppm(lc50!)} > 5000 ppm, not Division 2.3). The pure parent gas is handled as toxic.`,
    })
  }
  return {
    warnings,
    pressureChecks,
    classification: { flammable, flammabilityIndex: index, oxidisingPower: op, oxidising, lc50MixPpm: lc50, toxic, division, subsidiary, notes },
    minimumSafeTemperatureK,
  }
}

/**
 * An additivity LC50 above 1 000 000 ppm (100 %) means even the undiluted mixture is below the lethal
 * concentration: say so instead of printing an impossible concentration.
 */
export function formatLc50Ppm(lc50Ppm: number): string {
  return lc50Ppm > 1_000_000 ? 'above 1 000 000 ppm (the mixture itself is below the LC50)' : `${Math.round(lc50Ppm)} ppm`
}
