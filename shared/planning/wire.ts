/**
 * Wire ↔ SI mapping for the planner. Requests arrive parsed by the zod schemas in
 * shared/schemas/fill-plan.ts; everything is converted to SI here, planned, and converted back to the
 * display units asked for (bar and °C by default; masses in kg, or g below 1 kg; amounts in mol).
 */
import { KG_PER_POUND, M3_PER_CUBIC_FOOT, PA_PER_BAR, PA_PER_PSI, STANDARD_ATMOSPHERE_PA, ZERO_CELSIUS_K } from '../physics/constants.ts'
import type {
  BatchRequest,
  BatchResponse,
  CompareModelsRequest,
  CompareModelsResponse,
  FillPlanCoreResponse,
  FillPlanRequest,
  FillPlanResponse,
  ReplanRequest,
  ReplanResponse,
} from '../schemas/fill-plan.ts'
import { planBatch } from './batch.ts'
import { compareModels } from './compare.ts'
import { PlanningInputError } from './errors.ts'
import { computeFillPlan } from './fill-plan.ts'
import { replanFromActuals } from './replan.ts'
import type { ComponentAmount, FillPlan, FillPlanInput, SourceInput } from './types.ts'

type PressureUnit = FillPlanRequest['finalPressure']['unit']
type TemperatureUnit = FillPlanRequest['fillTemperature']['unit']
type MassUnit = NonNullable<FillPlanRequest['scale']>['resolution']['unit']

const PA_PER_UNIT: Record<PressureUnit, number> = {
  Pa: 1,
  kPa: 1e3,
  MPa: 1e6,
  bar: PA_PER_BAR,
  mbar: PA_PER_BAR / 1000,
  psi: PA_PER_PSI,
  atm: STANDARD_ATMOSPHERE_PA,
}
const KG_PER_UNIT: Record<MassUnit, number> = { kg: 1, g: 1e-3, lb: KG_PER_POUND }
const M3_PER_UNIT = { L: 1e-3, m3: 1, ft3: M3_PER_CUBIC_FOOT } as const

export function pressureSpanToPa(q: { value: number; unit: PressureUnit }): number {
  return q.value * PA_PER_UNIT[q.unit]
}

/** Absolute pressure in Pa; a gauge value adds the local atmospheric pressure. */
export function pressureToPa(q: { value: number; unit: PressureUnit; reference: 'gauge' | 'absolute' }, atmosphericPa: number): number {
  return pressureSpanToPa(q) + (q.reference === 'gauge' ? atmosphericPa : 0)
}

export function temperatureToK(q: { value: number; unit: TemperatureUnit }): number {
  if (q.unit === 'K') return q.value
  if (q.unit === 'C') return q.value + ZERO_CELSIUS_K
  return ((q.value - 32) * 5) / 9 + ZERO_CELSIUS_K
}

function temperatureFromK(k: number, unit: TemperatureUnit): { value: number; unit: TemperatureUnit } {
  if (unit === 'K') return { value: k, unit }
  if (unit === 'C') return { value: k - ZERO_CELSIUS_K, unit }
  return { value: ((k - ZERO_CELSIUS_K) * 9) / 5 + 32, unit }
}

function components(list: readonly { gas: string; fraction: number; uncertainty?: number }[]): ComponentAmount[] {
  return list.map((c) => (c.uncertainty === undefined ? { gasId: c.gas, x: c.fraction } : { gasId: c.gas, x: c.fraction, u: c.uncertainty }))
}

function today(): string {
  return new Date().toISOString().slice(0, 10)
}

/** Map a parsed request to the SI input of the engine. */
export function inputFromRequest(req: FillPlanRequest): FillPlanInput {
  const atm = req.atmosphericPressure ? pressureToPa({ ...req.atmosphericPressure, reference: 'absolute' }, 0) : STANDARD_ATMOSPHERE_PA
  const balances = req.target.filter((t) => t.balance)
  if (balances.length > 1) throw new PlanningInputError('only one target component can be the balance gas', 'target')
  const residual = req.cylinder.residual
  const sources: SourceInput[] = req.sources.map((s, i) => ({
    id: s.id ?? (s.composition ? `premix-${i + 1}` : req.sources.filter((o) => !o.composition && o.gas === s.gas).length > 1 ? `${s.gas}-${i + 1}` : s.gas!),
    gasId: s.composition ? undefined : s.gas,
    purity: s.purity,
    impurities: s.impurities ? components(s.impurities) : undefined,
    composition: s.composition ? components(s.composition) : undefined,
  }))
  return {
    target: req.target.map((t) => ({ gasId: t.gas, x: t.fraction })),
    balanceGasId: balances[0]?.gas,
    finalPressurePa: pressureToPa(req.finalPressure, atm),
    referenceTemperatureK: temperatureToK(req.referenceTemperature),
    fillTemperatureK: temperatureToK(req.fillTemperature),
    atmosphericPressurePa: atm,
    cylinder: {
      waterVolumeM3: req.cylinder.waterVolume.value * M3_PER_UNIT[req.cylinder.waterVolume.unit],
      servicePressurePa: pressureToPa(req.cylinder.servicePressure, atm),
      testPressurePa: req.cylinder.testPressure ? pressureToPa(req.cylinder.testPressure, atm) : undefined,
      material: req.cylinder.material,
      oxygenClean: req.cylinder.oxygenClean ?? false,
      nextTestDate: req.cylinder.nextTestDate,
      plusRated: req.cylinder.plusRated,
      residual:
        !residual || residual.kind === 'evacuated'
          ? { kind: 'evacuated' }
          : {
              kind: 'residual',
              pressurePa: pressureToPa(residual.pressure, atm),
              temperatureK: residual.temperature ? temperatureToK(residual.temperature) : undefined,
              composition: components(residual.composition),
            },
    },
    sources,
    method: req.method,
    model: req.model,
    order: req.order,
    gauge: req.gauge
      ? { spanPa: pressureSpanToPa(req.gauge.span), accuracyClassPercent: req.gauge.accuracyClass, resolutionPa: pressureSpanToPa(req.gauge.resolution) }
      : undefined,
    scale: req.scale
      ? {
          resolutionKg: req.scale.resolution.value * KG_PER_UNIT[req.scale.resolution.unit],
          standardUncertaintyKg: req.scale.uncertainty ? req.scale.uncertainty.value * KG_PER_UNIT[req.scale.uncertainty.unit] : undefined,
        }
      : undefined,
    blendToleranceRelative: req.blendTolerancePercent !== undefined ? req.blendTolerancePercent / 100 : undefined,
    uncertaintyBudgetRelative: req.uncertaintyBudgetPercent !== undefined ? req.uncertaintyBudgetPercent / 100 : undefined,
    minimumTemperatureK: req.minimumTemperature ? temperatureToK(req.minimumTemperature) : undefined,
    maximumTemperatureK: req.maximumTemperature ? temperatureToK(req.maximumTemperature) : undefined,
    cylinderRules: req.cylinderRules,
    asOfDate: req.asOfDate ?? today(),
    temperatureUncertaintyK: req.temperatureUncertaintyK,
    proposePremix: req.proposePremix,
  }
}

/** Converters from SI to the display units of one request. */
export function displayConverters(req: Pick<FillPlanRequest, 'displayUnits'>, atmosphericPa: number) {
  const pUnit: PressureUnit = req.displayUnits?.pressure ?? 'bar'
  const tUnit: TemperatureUnit = req.displayUnits?.temperature ?? 'C'
  const mUnit = req.displayUnits?.mass
  return {
    abs: (pa: number) => ({ value: pa / PA_PER_UNIT[pUnit], unit: pUnit, reference: 'absolute' as const }),
    gauge: (paAbs: number) => ({ value: (paAbs - atmosphericPa) / PA_PER_UNIT[pUnit], unit: pUnit, reference: 'gauge' as const }),
    span: (pa: number) => ({ value: pa / PA_PER_UNIT[pUnit], unit: pUnit }),
    temperature: (k: number) => temperatureFromK(k, tUnit),
    mass: (kg: number) => {
      const unit: MassUnit = mUnit ?? (Math.abs(kg) < 1 ? 'g' : 'kg')
      return { value: kg / KG_PER_UNIT[unit], unit }
    },
    moles: (n: number) => ({ value: n, unit: 'mol' as const }),
  }
}

type Converters = ReturnType<typeof displayConverters>

function compositionOut(list: readonly ComponentAmount[]) {
  return list.map((c) => (c.u === undefined ? { gas: c.gasId, fraction: c.x } : { gas: c.gasId, fraction: c.x, uncertainty: c.u }))
}

/** Map an SI plan to the wire response (no premix proposal). */
export function planToResponse(plan: FillPlan, d: Converters): FillPlanCoreResponse {
  return {
    method: plan.method,
    model: plan.model,
    modelNotes: [...plan.modelNotes],
    finalPressure: d.abs(plan.finalPressurePa),
    finalGaugePressure: d.gauge(plan.finalPressurePa),
    referenceTemperature: d.temperature(plan.referenceTemperatureK),
    fillTemperature: d.temperature(plan.fillTemperatureK),
    atmosphericPressure: d.abs(plan.atmosphericPressurePa),
    totalMoles: d.moles(plan.totalMoles),
    totalMass: d.mass(plan.totalMassKg),
    initial: { moles: d.moles(plan.initial.moles), pressure: d.abs(plan.initial.pressurePa), composition: compositionOut(plan.initial.composition) },
    steps: plan.steps.map((s) => ({
      index: s.index,
      gas: s.label,
      source: s.sourceId,
      sourceComposition: compositionOut(s.sourceComposition),
      cumulativePressure: d.abs(s.cumulativePressurePa),
      cumulativeGaugePressure: d.gauge(s.cumulativePressurePa),
      pressureRise: d.span(s.pressureRisePa),
      massAdded: d.mass(s.massAddedKg),
      molesAdded: d.moles(s.molesAdded),
      cumulativeMass: d.mass(s.cumulativeMassKg),
      cumulativeMoles: d.moles(s.cumulativeMoles),
      compressibility: s.compressibility,
      toleranceWindow: {
        gaugePressureLow: d.gauge(s.window.pressureLowPa),
        gaugePressureHigh: d.gauge(s.window.pressureHighPa),
        cumulativeMassLow: d.mass(s.window.massLowKg),
        cumulativeMassHigh: d.mass(s.window.massHighKg),
      },
      temperatureTable: s.temperatureTable.map((row) => ({
        temperature: d.temperature(row.temperatureK),
        pressure: d.abs(row.pressurePa),
        gaugePressure: d.gauge(row.pressurePa),
      })),
      compositionAfter: compositionOut(s.compositionAfter),
    })),
    predictedComposition: plan.predictedComposition.map((p) => ({
      gas: p.gasId,
      fraction: p.x,
      uncertainty: p.u,
      expandedUncertainty: p.expandedU,
      coverageFactor: 2 as const,
      target: p.target,
      deviationRelative: p.deviationRelative,
    })),
    uncertaintyMethod: plan.uncertaintyMethod,
    uncertaintyBudget: plan.uncertaintyBudget.map((b) => ({ input: b.input, gas: b.gasId, contribution: b.contribution })),
    solution: { ...plan.solution },
    orderRules: [...plan.orderRules],
    pressureChecks: plan.pressureChecks.map((c) => ({
      label: c.label,
      temperature: d.temperature(c.temperatureK),
      gaugePressure: d.gauge(c.pressurePa),
      gaugeLimit: c.limitPa === null ? null : d.gauge(c.limitPa),
      rule: c.rule,
      pass: c.pass,
    })),
    classification: { ...plan.classification, subsidiary: [...plan.classification.subsidiary], notes: [...plan.classification.notes] },
    minimumSafeTemperature: plan.minimumSafeTemperatureK === null ? null : d.temperature(plan.minimumSafeTemperatureK),
    warnings: plan.warnings.map((w) => ({ ...w })),
    approvable: plan.approvable,
    assumptions: [...plan.assumptions],
  }
}

function fullResponse(plan: FillPlan, d: Converters): FillPlanResponse {
  const core = planToResponse(plan, d)
  if (!plan.premixProposal) return core
  return {
    ...core,
    premixProposal: {
      reason: plan.premixProposal.reason,
      stages: plan.premixProposal.stages.map((s) => ({ label: s.label, gas: s.gasId, reason: s.reason, plan: planToResponse(s.plan, d) })),
      productPlan: planToResponse(plan.premixProposal.productPlan, d),
    },
  }
}

/** Plan from a parsed request; the server route parses with FillPlanRequestSchema and calls this. */
export function fillPlanFromRequest(req: FillPlanRequest): FillPlanResponse {
  const input = inputFromRequest(req)
  return fullResponse(computeFillPlan(input), displayConverters(req, input.atmosphericPressurePa))
}

export function replanFromRequest(req: ReplanRequest): ReplanResponse {
  const input = inputFromRequest(req.plan)
  const atm = input.atmosphericPressurePa
  const d = displayConverters(req.plan, atm)
  const result = replanFromActuals(
    input,
    req.actuals.map((a) => ({
      stepIndex: a.stepIndex,
      pressurePa: a.pressure ? pressureToPa(a.pressure, atm) : undefined,
      temperatureK: a.temperature ? temperatureToK(a.temperature) : undefined,
      scaleMassKg: a.scaleMass ? a.scaleMass.value * KG_PER_UNIT[a.scaleMass.unit] : undefined,
    })),
  )
  return {
    status: result.status,
    verdict: result.verdict,
    completedSteps: result.completedSteps,
    inferredSteps: result.inferredSteps.map((s) => ({
      index: s.index,
      source: s.sourceId,
      plannedMoles: d.moles(s.plannedMoles),
      actualMoles: d.moles(s.actualMoles),
      deviationRelative: s.deviationRelative,
      measured: s.measured,
    })),
    composition: compositionOut(result.composition),
    moles: d.moles(result.moles),
    pressureAtFillTemperature: d.abs(result.pressureAtFillTemperaturePa),
    gaugePressureAtFillTemperature: d.gauge(result.pressureAtFillTemperaturePa),
    remainingPlan: result.remainingPlan ? planToResponse(result.remainingPlan, d) : null,
    options: result.options.map((o) => ({
      kind: o.kind,
      description: o.description,
      ...(o.finalPressurePa !== undefined ? { finalGaugePressure: d.gauge(o.finalPressurePa) } : {}),
      ...(o.ventToPressurePa !== undefined ? { ventToGaugePressure: d.gauge(o.ventToPressurePa) } : {}),
      ...(o.plan ? { plan: planToResponse(o.plan, d) } : {}),
    })),
    warnings: result.warnings.map((w) => ({ ...w })),
  }
}

export function compareModelsFromRequest(req: CompareModelsRequest): CompareModelsResponse {
  const input = inputFromRequest(req)
  const d = displayConverters(req, input.atmosphericPressurePa)
  const result = compareModels(input, req.models)
  return {
    reference: result.reference,
    referenceNote: result.referenceNote,
    entries: result.entries.map((e) => ({
      model: e.model,
      plan: e.plan ? planToResponse(e.plan, d) : null,
      error: e.error,
      realised: e.realised.map((q) => ({
        gas: q.gasId,
        target: q.target,
        planned: q.planned,
        realised: q.realised,
        deviation: q.deviation,
        deviationRelative: q.deviationRelative,
        toleranceUsed: q.toleranceUsed,
      })),
      realisedFinalGaugePressure: e.realisedFinalPressurePa === null ? null : d.gauge(e.realisedFinalPressurePa),
      worstDeviationRelative: e.worstDeviationRelative,
      withinTolerance: e.withinTolerance,
    })),
  }
}

export function planBatchFromRequest(req: BatchRequest): BatchResponse {
  const input = inputFromRequest(req.plan)
  const d = displayConverters(req.plan, input.atmosphericPressurePa)
  const batch = planBatch(input, req.cylinderCount)
  return {
    cylinderCount: batch.cylinderCount,
    plan: fullResponse(batch.plan, d),
    sources: batch.sources.map((s) => ({
      source: s.sourceId,
      gas: s.label,
      molesPerCylinder: d.moles(s.molesPerCylinder),
      massPerCylinder: d.mass(s.massPerCylinderKg),
      moles: d.moles(s.moles),
      mass: d.mass(s.massKg),
      standardVolume: { value: s.standardVolumeM3, unit: 'm3' as const, reference: batch.standardConditions },
    })),
    notes: [...batch.notes],
  }
}
