import { type Gas, GASES, getGas } from '#shared/physics/index.ts'
import type { GasDto, GasList, ModelIdWire } from '#shared/schemas/gas.ts'

const VAPOUR_EQUATION = {
  'dippr-101': 'DIPPR equation 101: ln(p/Pa) = c1 + c2/T + c3·ln(T) + c4·T^c5, T in K',
  antoine: 'Antoine: log10(p/Pa) = a − b/(T + c), T in K',
} as const

/** The equations of state that evaluate a gas: a pseudo-component (air) is covered when all its constituents are. */
function modelsFor(gas: Gas): ModelIdWire[] {
  const constituents = gas.composition ? gas.composition.map((c) => getGas(c.gasId)) : [gas]
  const gerg = constituents.every((g) => g.gerg2008)
  return gerg ? ['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008'] : ['ideal', 'van-der-waals', 'srk', 'peng-robinson']
}

/** The wire shape of one library entry: SI values turned into the units people read, each with its unit. */
export function toGasDto(gas: Gas): GasDto {
  const vp = gas.vapourPressure
  return {
    id: gas.id,
    name: gas.name,
    formula: gas.formula,
    casNumber: gas.casNumber,
    molarMass: { value: gas.molarMassGPerMol, unit: 'g/mol' },
    criticalTemperature: { value: gas.criticalTemperatureK, unit: 'K' },
    criticalPressure: { value: gas.criticalPressurePa / 1e6, unit: 'MPa' },
    acentricFactor: gas.acentricFactor,
    normalBoilingPoint: { value: gas.normalBoilingPointK, unit: 'K', sublimation: gas.normalBoilingPointIsSublimation },
    vapourPressure: vp
      ? {
          correlation: vp.kind,
          equation: VAPOUR_EQUATION[vp.kind],
          coefficients: vp.kind === 'dippr-101' ? { c1: vp.c1, c2: vp.c2, c3: vp.c3, c4: vp.c4, c5: vp.c5 } : { a: vp.a, b: vp.b, c: vp.c },
          validFrom: { value: vp.minTemperatureK, unit: 'K' },
          validTo: { value: vp.maxTemperatureK, unit: 'K' },
        }
      : null,
    flammability: gas.flammability
      ? {
          lowerLimit: { value: gas.flammability.lflPercent, unit: '% vol in air' },
          upperLimit: { value: gas.flammability.uflPercent, unit: '% vol in air' },
        }
      : null,
    iso10156: gas.iso10156
      ? {
          tci: gas.iso10156.tciPercent !== undefined ? { value: gas.iso10156.tciPercent, unit: '% vol' } : null,
          kEquivalent: gas.iso10156.kEquivalent ?? null,
          ci: gas.iso10156.ci ?? null,
          status: gas.iso10156.status,
          confidence: gas.iso10156.confidence,
        }
      : null,
    toxicity: gas.toxicity
      ? { lc50: { value: gas.toxicity.lc50PpmV, unit: 'ppm V (1 h, rat)' }, status: gas.toxicity.status, source: gas.toxicity.source }
      : null,
    hazards: [...gas.hazards],
    groups: [...gas.groups],
    gerg2008: gas.gerg2008,
    models: modelsFor(gas),
    composition: gas.composition ? gas.composition.map((c) => ({ gas: c.gasId, fraction: c.x })) : null,
    notes: [...gas.notes],
    sources: Object.fromEntries(Object.entries(gas.sources).filter((e): e is [string, string] => typeof e[1] === 'string')),
  }
}

const ATOMIC_WEIGHTS = 'IUPAC 2005/2007 atomic weights as used by ISO 6976:2016 Table A.2 and GERG-2008 (H 1.00794, C 12.0107, N 14.0067, O 15.9994, S 32.065)'

let cached: GasList | null = null

/** The whole library (computed once: the table is constant). */
export function listGases(): GasList {
  cached ??= { items: GASES.map(toGasDto), atomicWeights: ATOMIC_WEIGHTS }
  return cached
}
