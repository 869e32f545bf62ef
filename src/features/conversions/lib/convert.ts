import {
  amountFromStandardVolume,
  concentrations,
  cylinderContents,
  fractionFromMassConcentrationMgPerM3,
  gergCovers,
  expandPseudoComponents,
  M3_PER_CUBIC_FOOT,
  massFractionsFromMoleFractions,
  type Mixture,
  type ModelId,
  moleFractionsFromMassFractions,
  moleFractionsFromVolumeFractions,
  type PhysicsWarning,
  pureCompressibilities,
  REFERENCE_CONDITIONS,
  type ReferenceConditionId,
  standardVolume,
  volumeFractions,
} from '#shared/physics/index.ts'

export type Basis = 'mole' | 'mass' | 'volume' | 'mg/m3'
export type FractionUnit = 'percent' | 'ppm' | 'ppb'
export const FRACTION_SCALE: Record<FractionUnit, number> = { percent: 1e-2, ppm: 1e-6, ppb: 1e-9 }
export const FRACTION_LABEL: Record<FractionUnit, string> = { percent: '%', ppm: 'ppm', ppb: 'ppb' }
export const BASIS_LABEL: Record<Basis, string> = {
  mole: 'Amount (mole) fraction',
  mass: 'Mass fraction',
  volume: 'Volume fraction at the stated conditions',
  'mg/m3': 'Mass concentration, mg/m³ at the stated conditions',
}

/** The model used for compression factors: GERG-2008 where it covers every gas, else Peng–Robinson. */
export function bestModel(gasIds: readonly string[]): ModelId {
  try {
    return gergCovers(expandPseudoComponents({ gasIds, x: gasIds.map(() => 1 / gasIds.length) }).gasIds) ? 'gerg-2008' : 'peng-robinson'
  } catch {
    return 'peng-robinson'
  }
}

/**
 * Mole fractions from values given on another basis (ISO 14912). For mg/m³ the last row is the balance gas and
 * its value is ignored; the conversion is the ideal-gas one (γ = x·M·p/(R·T)), as usually quoted.
 */
export function toMoleFractions(
  gasIds: string[],
  values: number[],
  basis: Basis,
  unit: FractionUnit,
  model: ModelId,
  temperatureK: number,
  pressurePa: number,
): Mixture {
  if (basis === 'mg/m3') {
    const minor = gasIds.slice(0, -1).map((id, i) => fractionFromMassConcentrationMgPerM3(id, values[i], temperatureK, pressurePa))
    const balance = 1 - minor.reduce((s, x) => s + x, 0)
    return { gasIds, x: [...minor, balance] }
  }
  const f = values.map((v) => v * FRACTION_SCALE[unit])
  if (basis === 'mole') return { gasIds, x: f }
  if (basis === 'mass') return moleFractionsFromMassFractions(gasIds, f)
  const z = pureCompressibilities(model, gasIds, temperatureK, pressurePa).compressibilities
  return { gasIds, x: moleFractionsFromVolumeFractions(f, z) }
}

export interface CompositionTable {
  mole: number[]
  mass: number[]
  volume: number[] | null
  massConcentrationMgPerM3: number[]
  molarConcentrationMolPerM3: number[]
  warnings: PhysicsWarning[]
}

/** Every composition quantity of ISO 14912 for one mixture at stated conditions. */
export function compositionTable(mixture: Mixture, model: ModelId, temperatureK: number, pressurePa: number): CompositionTable {
  const mass = massFractionsFromMoleFractions(mixture)
  let volume: number[] | null = null
  const warnings: PhysicsWarning[] = []
  try {
    const v = volumeFractions(model, mixture, temperatureK, pressurePa)
    volume = [...v.volumeFractions]
    warnings.push(...v.warnings)
  } catch (err) {
    warnings.push({ code: 'volume-fraction', severity: 'caution', message: err instanceof Error ? err.message : String(err) })
  }
  const c = concentrations(model, mixture, temperatureK, pressurePa)
  warnings.push(...c.warnings.filter((w) => w.severity !== 'info'))
  return {
    mole: [...mixture.x],
    mass,
    volume,
    massConcentrationMgPerM3: c.massConcentrationsKgPerM3.map((g) => g * 1e6),
    molarConcentrationMolPerM3: [...c.molarConcentrationsMolPerM3],
    warnings,
  }
}

export const STANDARD_REFERENCES: ReferenceConditionId[] = ['0C-101325', '15C-101325', '20C-101325', '70F-14.696psia']

export interface AmountEquivalents {
  amountMol: number
  massKg: number
  volumes: { id: ReferenceConditionId; label: string; m3: number; ft3: number }[]
}

export type AmountInput = { kind: 'mol' | 'kg'; value: number } | { kind: 'std'; value: number; referenceId: ReferenceConditionId; unit: 'm3' | 'ft3' }

/** One amount of a mixture expressed as mol, kg and standard volumes at every trade reference (real-gas corrected). */
export function amountEquivalents(mixture: Mixture, model: ModelId, input: AmountInput, molarMassKgPerMol: number): AmountEquivalents {
  const amountMol =
    input.kind === 'std'
      ? amountFromStandardVolume(input.unit === 'ft3' ? input.value * M3_PER_CUBIC_FOOT : input.value, input.referenceId, model, mixture)
      : input.kind === 'kg'
        ? input.value / molarMassKgPerMol
        : input.value
  return {
    amountMol,
    massKg: amountMol * molarMassKgPerMol,
    volumes: STANDARD_REFERENCES.map((id) => {
      const v = standardVolume(amountMol, id, model, mixture).volumeM3
      return { id, label: REFERENCE_CONDITIONS.find((r) => r.id === id)!.label, m3: v, ft3: v / M3_PER_CUBIC_FOOT }
    }),
  }
}

/** Contents of a cylinder at (T, p) as an amount, with its equivalents. */
export function cylinderEquivalents(mixture: Mixture, model: ModelId, waterVolumeM3: number, temperatureK: number, pressurePa: number) {
  const c = cylinderContents(model, mixture, waterVolumeM3, temperatureK, pressurePa)
  return {
    compressibility: c.compressibility,
    warnings: c.warnings,
    ...amountEquivalents(mixture, model, { kind: 'mol', value: c.amountMol }, c.massKg / c.amountMol),
  }
}
