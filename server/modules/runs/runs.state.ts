/**
 * The state of a fill run as stored in FillRun.targets: the plan segments (the approved plan, then one per
 * confirmed re-plan, each with the /api/calc/fill-plan request it was computed from), the steps with their
 * targets in bar and °C, and a re-plan waiting for the technician's confirmation. Pure functions only.
 */
import { z } from 'zod'
import { CAUTIONS, RULES } from '#shared/planning/index.ts'
import { getGas } from '#shared/physics/index.ts'
import type { FillPlanCoreResponse, FillPlanRequest } from '#shared/schemas/fill-plan.ts'
import {
  KG_PER_MASS_UNIT,
  type PendingReplan,
  pressureAtTemperature,
  type ReadingOutcome,
  type ReadingPressureUnit,
  type ReadingTemperatureUnit,
  type RunStep,
  type StepCaution,
  type TemperatureRow,
  toBar,
  toCelsius,
} from '#shared/schemas/run.ts'

/** Rough vacuum that is enough before a %-level mixture is made again (DOMAIN §1.4: ~0.1–1 mbar). */
export const EVACUATED_LIMIT_BAR_ABS = 0.001

/**
 * Oxygen fill-rate hint shown on oxygen steps: a public breathing-apparatus manual recommends 27 bar/min
 * (DOMAIN §6.1); the shop's own limit applies where lower.
 */
export const OXYGEN_FILL_RATE_HINT = 'Raise the pressure slowly: about 25 bar per minute at most for oxygen, or your shop’s lower limit.'

const StoredStepSchema = z.object({
  kind: z.enum(['add', 'vent', 'evacuate']),
  segment: z.number().int(),
  /** index into the segment's plan steps; null for vent and evacuate steps */
  segmentStep: z.number().int().nullable(),
  /** the plan's source id of the step (for re-planning the remaining steps); null for vent steps */
  source: z.string().nullable(),
  gas: z.string(),
  label: z.string(),
  sourceComposition: z.array(z.object({ gas: z.string(), fraction: z.number() })),
  cumulativeAbsBar: z.number(),
  cumulativeGaugeBar: z.number(),
  pressureRiseBar: z.number().nullable(),
  massAddedKg: z.number().nullable(),
  cumulativeMassKg: z.number().nullable(),
  windowLowGaugeBar: z.number().nullable(),
  windowHighGaugeBar: z.number(),
  massLowKg: z.number().nullable(),
  massHighKg: z.number().nullable(),
  table: z.array(z.object({ temperatureC: z.number(), pressureAbsBar: z.number() })),
  compositionAfter: z.array(z.object({ gas: z.string(), fraction: z.number() })),
  planCautions: z.array(z.string()),
  note: z.string().nullable(),
})
export type StoredStep = z.infer<typeof StoredStepSchema>

const StoredSegmentSchema = z.object({
  origin: z.enum(['plan', 'continue', 'accept', 'top-up', 'vent', 'remake']),
  /** the planner request this segment's steps were computed from (residual = contents at its start) */
  request: z.custom<FillPlanRequest>((v) => typeof v === 'object' && v !== null),
  firstStep: z.number().int(),
  confirmedById: z.number().int().nullable(),
  confirmedAt: z.string().nullable(),
  verdict: z.string().nullable(),
})
export type StoredSegment = z.infer<typeof StoredSegmentSchema>

const StoredOptionSchema = z.object({
  kind: z.enum(['continue', 'accept', 'top-up', 'vent', 'remake']),
  /** request of the segment this option starts (absent for 'accept') */
  request: z.custom<FillPlanRequest>((v) => typeof v === 'object' && v !== null).nullable(),
  plan: z.custom<FillPlanCoreResponse>((v) => typeof v === 'object' && v !== null).nullable(),
  /** vent/evacuate limit, bar absolute at fill temperature */
  ventToAbsBar: z.number().nullable(),
})
export type StoredOption = z.infer<typeof StoredOptionSchema>

export const RunStateSchema = z.object({
  schema: z.literal(1),
  method: z.enum(['partial-pressure', 'gravimetric']),
  atmosphericBar: z.number(),
  fillTemperatureC: z.number(),
  referenceTemperatureC: z.number(),
  finalGaugeBar: z.number(),
  segments: z.array(StoredSegmentSchema),
  steps: z.array(StoredStepSchema),
  pending: z
    .object({
      view: z.custom<PendingReplan>((v) => typeof v === 'object' && v !== null),
      /** contents inferred by the re-plan (used as the residual of the next segment) */
      composition: z.array(z.object({ gas: z.string(), fraction: z.number() })),
      options: z.array(StoredOptionSchema),
    })
    .nullable(),
  /** run-level notes for the technician (e.g. residual gas the plan did not expect) */
  notices: z.array(z.string()),
})
export type RunState = z.infer<typeof RunStateSchema>

export function readState(targets: unknown): RunState {
  return RunStateSchema.parse(targets)
}

// ---- conversions from the planner's wire units ----------------------------------------------------------------

type WirePressure = { value: number; unit: string }
type WireTemperature = { value: number; unit: string }
type WireMass = { value: number; unit: string }

export const barOf = (p: WirePressure) => toBar(p.value, p.unit as ReadingPressureUnit)
export const celsiusOf = (t: WireTemperature) => toCelsius(t.value, t.unit as ReadingTemperatureUnit)
export const kgOf = (m: WireMass) => m.value * KG_PER_MASS_UNIT[m.unit as keyof typeof KG_PER_MASS_UNIT]

/** The steps of a computed plan as run steps of one segment; `note` goes on its first step. */
export function stepsFromPlan(plan: FillPlanCoreResponse, segment: number, note: string | null): StoredStep[] {
  const atm = barOf(plan.atmosphericPressure)
  return plan.steps.map((s, j) => ({
    kind: 'add' as const,
    segment,
    segmentStep: j,
    source: s.source,
    gas: s.gas,
    label: s.gas,
    sourceComposition: s.sourceComposition.map((c) => ({ gas: c.gas, fraction: c.fraction })),
    cumulativeAbsBar: barOf(s.cumulativePressure),
    cumulativeGaugeBar: barOf(s.cumulativePressure) - atm,
    pressureRiseBar: barOf(s.pressureRise),
    massAddedKg: kgOf(s.massAdded),
    cumulativeMassKg: kgOf(s.cumulativeMass),
    windowLowGaugeBar: barOf(s.toleranceWindow.gaugePressureLow),
    windowHighGaugeBar: barOf(s.toleranceWindow.gaugePressureHigh),
    massLowKg: kgOf(s.toleranceWindow.cumulativeMassLow),
    massHighKg: kgOf(s.toleranceWindow.cumulativeMassHigh),
    table: s.temperatureTable.map((r) => ({ temperatureC: celsiusOf(r.temperature), pressureAbsBar: barOf(r.pressure) })),
    compositionAfter: s.compositionAfter.map((c) => ({ gas: c.gas, fraction: c.fraction })),
    planCautions: plan.warnings.filter((w) => w.step === j && w.severity !== 'info').map((w) => w.caution ?? w.message),
    note: j === 0 ? note : null,
  }))
}

/** A step that vents the cylinder down to at most `limitAbsBar` (or evacuates it). */
export function ventStep(
  kind: 'vent' | 'evacuate',
  limitAbsBar: number,
  atmosphericBar: number,
  segment: number,
  contents: { gas: string; fraction: number }[],
  note: string,
): StoredStep {
  return {
    kind,
    segment,
    segmentStep: null,
    source: null,
    gas: 'vent',
    label: kind === 'vent' ? 'Vent' : 'Vent and evacuate',
    sourceComposition: [],
    cumulativeAbsBar: limitAbsBar,
    cumulativeGaugeBar: limitAbsBar - atmosphericBar,
    pressureRiseBar: null,
    massAddedKg: null,
    cumulativeMassKg: null,
    windowLowGaugeBar: null,
    windowHighGaugeBar: limitAbsBar - atmosphericBar,
    massLowKg: null,
    massHighKg: null,
    table: [],
    compositionAfter: contents,
    planCautions: [],
    note,
  }
}

// ---- outcome of a reading -----------------------------------------------------------------------------------

export interface Evaluation {
  outcome: ReadingOutcome
  /** the window at the measured temperature, bar absolute (null where open) */
  lowAbsBar: number | null
  highAbsBar: number
  /** target at the measured temperature, bar absolute */
  targetAbsBar: number
}

/**
 * Compares a reading with the step's tolerance window at the measured temperature. The window is planned at the
 * fill temperature; at another temperature the same amount of gas reads p(T)/p(T_fill) times higher or lower
 * (constant density), taken from the step's temperature table. Vent and evacuate steps, which have no table,
 * scale with the absolute temperature (ideal-gas ratio); the plan after them is recomputed from the reading.
 * Gravimetric plans compare the scale reading with the mass window when it is given.
 */
export function evaluateReading(
  step: StoredStep,
  state: Pick<RunState, 'method' | 'atmosphericBar' | 'fillTemperatureC'>,
  pressureAbsBar: number,
  temperatureC: number,
  scaleKg: number | null,
): Evaluation {
  const atm = state.atmosphericBar
  if (step.kind !== 'add') {
    const ratio = (temperatureC + 273.15) / (state.fillTemperatureC + 273.15)
    const highAbsBar = (step.windowHighGaugeBar + atm) * ratio
    return { outcome: pressureAbsBar <= highAbsBar ? 'on-target' : 'over', lowAbsBar: null, highAbsBar, targetAbsBar: highAbsBar }
  }
  const atT = pressureAtTemperature(tableRows(step), temperatureC)
  const ratio = atT ? atT.pressureBarAbs / step.cumulativeAbsBar : (temperatureC + 273.15) / (state.fillTemperatureC + 273.15)
  const lowAbsBar = step.windowLowGaugeBar === null ? null : (step.windowLowGaugeBar + atm) * ratio
  const highAbsBar = (step.windowHighGaugeBar + atm) * ratio
  const targetAbsBar = step.cumulativeAbsBar * ratio
  if (state.method === 'gravimetric' && scaleKg !== null && step.massLowKg !== null && step.massHighKg !== null) {
    const outcome = scaleKg < step.massLowKg ? 'under' : scaleKg > step.massHighKg ? 'over' : 'on-target'
    return { outcome, lowAbsBar, highAbsBar, targetAbsBar }
  }
  const outcome: ReadingOutcome = lowAbsBar !== null && pressureAbsBar < lowAbsBar ? 'under' : pressureAbsBar > highAbsBar ? 'over' : 'on-target'
  return { outcome, lowAbsBar, highAbsBar, targetAbsBar }
}

export function tableRows(step: StoredStep): TemperatureRow[] {
  const atm = step.cumulativeAbsBar - step.cumulativeGaugeBar
  return step.table.map((r) => ({
    temperature: { value: r.temperatureC, unit: 'C' as const },
    pressure: { value: r.pressureAbsBar, unit: 'bar' as const, reference: 'absolute' as const },
    gaugePressure: { value: r.pressureAbsBar - atm, unit: 'bar' as const, reference: 'gauge' as const },
  }))
}

// ---- cautions -----------------------------------------------------------------------------------------------

function facts(gasId: string): {
  name: string | null
  formula: string | null
  hazards: readonly string[]
  groups: readonly string[]
  lflPercent: number | null
} {
  try {
    const g = getGas(gasId)
    return { name: g.name, formula: g.formula, hazards: g.hazards, groups: g.groups, lflPercent: g.flammability?.lflPercent ?? null }
  } catch {
    return { name: null, formula: null, hazards: [], groups: [], lflPercent: null }
  }
}

/** The gas library's name of a gas id, or the label itself (a premix label). */
export function nameOf(gasOrLabel: string): string {
  return facts(gasOrLabel).name ?? gasOrLabel
}

/**
 * Whether a gas stream can burn: a flammable component at or above the planner's caution share of its lower
 * flammability limit (RULES.fuelLflCautionShare), so a ppm-level fuel premix in nitrogen does not cry wolf.
 */
function canBurn(composition: { gas: string; fraction: number }[]): boolean {
  return composition.some((c) => {
    const f = facts(c.gas)
    if (!f.hazards.includes('flammable') && !f.hazards.includes('pyrophoric')) return false
    if (f.lflPercent === null || f.hazards.includes('pyrophoric')) return c.fraction > 0
    return c.fraction * 100 >= RULES.fuelLflCautionShare.value * f.lflPercent
  })
}

export function formulaOf(gasId: string): string | null {
  return facts(gasId).formula
}

const O2 = 'oxygen'

/**
 * The cautions of one step, in plain words, from the gases involved (the gas library's hazard flags and groups)
 * and the plan's own findings for the step. High pressure is always said.
 */
export function stepCautions(step: StoredStep): StepCaution[] {
  const out: StepCaution[] = [{ kind: 'pressure', text: CAUTIONS.pressure }]
  const added = step.sourceComposition.filter((c) => c.fraction > 0).map((c) => c.gas)
  const contents = step.compositionAfter.filter((c) => c.fraction > 0)
  const hazardsIn = (ids: string[]) => new Set(ids.flatMap((id) => facts(id).hazards))
  const addedHazards = hazardsIn(added)
  const contentHazards = hazardsIn(contents.map((c) => c.gas))
  if (step.kind !== 'add') {
    out.push({
      kind: 'vent',
      text: 'Vent slowly through the vent line to a safe place outside, never into the room. Keep ignition sources away and stand clear of the outlet. Follow local codes and licensed practice.',
    })
    if (contentHazards.has('toxic')) out.push({ kind: 'toxic', text: CAUTIONS.toxic })
    if (canBurn(contents)) out.push({ kind: 'flammable', text: CAUTIONS.flammable })
    return out
  }
  const o2Added = step.sourceComposition.find((c) => c.gas === O2)?.fraction ?? 0
  const o2After = step.compositionAfter.find((c) => c.gas === O2)?.fraction ?? 0
  if (o2Added > RULES.oxygenEnrichedFraction.value || o2After > RULES.oxygenEnrichedFraction.value) {
    out.push({ kind: 'oxygen', text: `${CAUTIONS.oxygen} ${OXYGEN_FILL_RATE_HINT}` })
  }
  if (canBurn(step.sourceComposition)) out.push({ kind: 'flammable', text: CAUTIONS.flammable })
  if (addedHazards.has('toxic')) out.push({ kind: 'toxic', text: CAUTIONS.toxic })
  if (addedHazards.has('corrosive')) {
    out.push({
      kind: 'corrosive',
      text: 'Corrosive gas. Use a dry manifold of compatible metals, leak-test, wear face and hand protection. Follow local codes and licensed practice.',
    })
  }
  const groups = new Set(contents.flatMap((c) => facts(c.gas).groups))
  if (groups.has('fuel') && groups.has('oxidiser')) out.push({ kind: 'fuel-oxidiser', text: CAUTIONS.fuelOxidiser })
  for (const text of step.planCautions) out.push({ kind: 'plan', text })
  return out
}

/** Whether any step of a plan puts oxygen above the enriched-atmosphere line (needs an oxygen-clean cylinder). */
export function planNeedsOxygenClean(plan: FillPlanCoreResponse): boolean {
  const limit = RULES.oxygenEnrichedFraction.value
  return plan.steps.some(
    (s) => s.sourceComposition.some((c) => c.gas === O2 && c.fraction > limit) || s.compositionAfter.some((c) => c.gas === O2 && c.fraction > limit),
  )
}

// ---- view ---------------------------------------------------------------------------------------------------

export function toStepView(step: StoredStep, index: number, currentStep: number): RunStep {
  const bar = (value: number, reference: 'absolute' | 'gauge') => ({ value, unit: 'bar' as const, reference })
  const kgQ = (value: number | null) => (value === null ? null : { value, unit: 'kg' as const })
  return {
    index,
    kind: step.kind,
    gas: step.gas,
    label: step.kind === 'add' ? nameOf(step.label) : step.label,
    formula: step.kind === 'add' ? formulaOf(step.gas) : null,
    sourceComposition: step.sourceComposition.map((c) => ({ gas: c.gas, formula: formulaOf(c.gas), fraction: c.fraction })),
    cumulativePressure: bar(step.cumulativeAbsBar, 'absolute') as { value: number; unit: 'bar'; reference: 'absolute' },
    cumulativeGaugePressure: bar(step.cumulativeGaugeBar, 'gauge') as { value: number; unit: 'bar'; reference: 'gauge' },
    pressureRise: step.pressureRiseBar === null ? null : { value: step.pressureRiseBar, unit: 'bar' },
    massAdded: kgQ(step.massAddedKg),
    cumulativeMass: kgQ(step.cumulativeMassKg),
    toleranceWindow: {
      gaugePressureLow: step.windowLowGaugeBar === null ? null : { value: step.windowLowGaugeBar, unit: 'bar', reference: 'gauge' },
      gaugePressureHigh: { value: step.windowHighGaugeBar, unit: 'bar', reference: 'gauge' },
      cumulativeMassLow: kgQ(step.massLowKg),
      cumulativeMassHigh: kgQ(step.massHighKg),
    },
    temperatureTable: tableRows(step),
    compositionAfter: step.compositionAfter,
    cautions: stepCautions(step),
    state: index < currentStep ? 'done' : index === currentStep ? 'current' : 'pending',
    segment: step.segment,
    note: step.note,
  }
}
