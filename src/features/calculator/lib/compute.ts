import {
  evaluateState,
  M3_PER_CUBIC_FOOT,
  MODEL_IDS,
  type Mixture,
  type ModelId,
  PhysicsInputError,
  type PhysicsWarning,
  partialPressures,
  partialVolumes,
  type PreparedModel,
  prepareModel,
  type ReferenceConditionId,
  standardVolume,
} from '#shared/physics/index.ts'

/** Everything the state calculator computes in the browser, SI in and out. */
export interface CalculatorInput {
  mixture: Mixture
  temperatureK: number
  pressurePa: number
  waterVolumeM3: number
  referenceId: ReferenceConditionId
}

export interface ModelResult {
  model: ModelId
  ok: true
  compressibility: number
  densityKgPerM3: number
  molarVolumeM3PerMol: number
  amountMol: number
  massKg: number
  standardVolumeM3: number
  /** standard cubic feet at 70 °F, 14.696 psia */
  standardCubicFeet: number
  /** (Z − Z_GERG)/Z_GERG, null when GERG-2008 does not cover the mixture */
  zDeviationFromGerg: number | null
  /** (n − n_GERG)/n_GERG: how far this model's cylinder contents are from GERG-2008's */
  contentsDeviationFromGerg: number | null
  warnings: readonly PhysicsWarning[]
}
export interface ModelFailure {
  model: ModelId
  ok: false
  error: string
  field: string | null
}

export interface CalculatorResult {
  models: (ModelResult | ModelFailure)[]
  /** x_i·p, Pa, per mixture row */
  partialPressuresPa: number[]
  /** x_i·V, m³, per mixture row */
  partialVolumesM3: number[]
  mixingWarnings: PhysicsWarning[]
}

function failure(model: ModelId, err: unknown): ModelFailure {
  if (err instanceof PhysicsInputError) return { model, ok: false, error: err.message, field: err.field }
  return { model, ok: false, error: err instanceof Error ? err.message : String(err), field: null }
}

/** All five models side by side, each compared with GERG-2008 where GERG-2008 covers the mixture. */
export function computeCalculator(input: CalculatorInput): CalculatorResult {
  const { mixture, temperatureK: T, pressurePa: p, waterVolumeM3: V, referenceId } = input
  const raw = MODEL_IDS.map((model): ModelResult | ModelFailure => {
    try {
      const prepared = prepareModel(model, mixture)
      const state = evaluateState(prepared, T, p)
      const rho = state.molarDensityMolPerM3
      const amountMol = rho * V
      const std = standardVolume(amountMol, referenceId, model, mixture)
      const scf = standardVolume(amountMol, '70F-14.696psia', model, mixture).volumeM3 / M3_PER_CUBIC_FOOT
      return {
        model,
        ok: true,
        compressibility: state.compressibility,
        densityKgPerM3: rho * state.molarMassKgPerMol,
        molarVolumeM3PerMol: 1 / rho,
        amountMol,
        massKg: amountMol * state.molarMassKgPerMol,
        standardVolumeM3: std.volumeM3,
        standardCubicFeet: scf,
        zDeviationFromGerg: null,
        contentsDeviationFromGerg: null,
        warnings: state.warnings,
      }
    } catch (err) {
      return failure(model, err)
    }
  })
  const gerg = raw.find((r): r is ModelResult => r.ok && r.model === 'gerg-2008')
  const models = raw.map((r) =>
    r.ok && gerg
      ? {
          ...r,
          zDeviationFromGerg: (r.compressibility - gerg.compressibility) / gerg.compressibility,
          contentsDeviationFromGerg: (r.amountMol - gerg.amountMol) / gerg.amountMol,
        }
      : r,
  )
  // Dalton and Amagat with the real-gas caveat judged on the best model available (GERG-2008, else Peng–Robinson)
  const caveatModel: ModelId = gerg ? 'gerg-2008' : 'peng-robinson'
  let partialPressuresPa: number[] = []
  let partialVolumesM3: number[] = []
  let mixingWarnings: PhysicsWarning[] = []
  try {
    const pp = partialPressures(caveatModel, mixture, T, p)
    const pv = partialVolumes(caveatModel, mixture, V, T, p)
    partialPressuresPa = [...pp.partialPressuresPa]
    partialVolumesM3 = [...pv.partialVolumesM3]
    const seen = new Set<string>()
    mixingWarnings = [...pp.warnings, ...pv.warnings].filter((w) => w.code === 'real-gas-caveat' && !seen.has(w.message) && seen.add(w.message))
  } catch {
    partialPressuresPa = mixture.x.map((x) => x * p)
    partialVolumesM3 = mixture.x.map((x) => x * V)
  }
  return { models, partialPressuresPa, partialVolumesM3, mixingWarnings }
}

export interface ZCurvePoint {
  pressureBar: number
  [model: string]: number | null
}

/** Z against absolute pressure, 1 → 300 bar, at one temperature, for every model that can evaluate the mixture. */
export function zCurve(mixture: Mixture, temperatureK: number, maxBar = 300, stepBar = 10): ZCurvePoint[] {
  const prepared: Partial<Record<ModelId, PreparedModel>> = {}
  for (const model of MODEL_IDS) {
    try {
      prepared[model] = prepareModel(model, mixture)
    } catch {
      /* a model that does not cover the mixture draws no line */
    }
  }
  const points: ZCurvePoint[] = []
  for (let bar = 0; bar <= maxBar; bar += stepBar) {
    const pBar = bar === 0 ? 1 : bar
    const point: ZCurvePoint = { pressureBar: pBar }
    for (const model of MODEL_IDS) {
      const m = prepared[model]
      let z: number | null = null
      if (m) {
        try {
          z = m.compressibility(temperatureK, pBar * 1e5)
        } catch {
          z = null
        }
      }
      point[model] = z !== null && Number.isFinite(z) ? z : null
    }
    points.push(point)
  }
  return points
}
