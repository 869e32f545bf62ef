import { evaluateState, partialPressures, PhysicsInputError, prepareModel, STANDARD_ATMOSPHERE_PA, toKelvin, toPa } from '#shared/physics/index.ts'
import { PlanningInputError } from '#shared/planning/index.ts'
import type { PressureUnit, StateRequest, StateResponse, TemperatureUnit } from '#shared/schemas/calc.ts'

type PhysicsPressureUnit = 'Pa' | 'kPa' | 'MPa' | 'bar' | 'psi' | 'atm'

/** The wire allows mbar, which the physics units do not name: express it in bar. */
function pressureForPhysics(value: number, unit: PressureUnit): { value: number; unit: PhysicsPressureUnit } {
  return unit === 'mbar' ? { value: value / 1000, unit: 'bar' } : { value, unit }
}

function temperatureForPhysics(unit: TemperatureUnit): 'K' | 'degC' | 'degF' {
  return unit === 'C' ? 'degC' : unit === 'F' ? 'degF' : unit
}

/**
 * The engines name list items as "mixture[2].gas"; the API (zod) names them "mixture.2.gas", so the client maps
 * every kind of error onto the same form field.
 */
export function toWireField(field: string): string {
  return field.replace(/\[(\d+)\]/g, '.$1')
}

export function rethrowWithWireField(err: unknown): never {
  if (err instanceof PhysicsInputError) throw new PhysicsInputError(err.message, toWireField(err.field))
  if (err instanceof PlanningInputError) throw new PlanningInputError(err.message, toWireField(err.field), err.status)
  throw err
}

/** SI temperature and absolute pressure of a state request (400 naming the field when impossible). */
export function stateConditions(req: Pick<StateRequest, 'temperature' | 'pressure' | 'atmosphericPressure'>) {
  const atmosphericPressurePa = req.atmosphericPressure
    ? toPa(
        { ...pressureForPhysics(req.atmosphericPressure.value, req.atmosphericPressure.unit), reference: 'absolute' },
        STANDARD_ATMOSPHERE_PA,
        'atmosphericPressure',
      )
    : STANDARD_ATMOSPHERE_PA
  const temperatureK = toKelvin({ value: req.temperature.value, unit: temperatureForPhysics(req.temperature.unit) }, 'temperature')
  const pressurePa = toPa(
    { ...pressureForPhysics(req.pressure.value, req.pressure.unit), reference: req.pressure.reference },
    atmosphericPressurePa,
    'pressure',
  )
  return { temperatureK, pressurePa, atmosphericPressurePa }
}

/**
 * State of a mixture at (T, p) with one equation of state: Z, molar volume, density, molar mass, Dalton partial
 * pressures (with the real-gas caveat) and every warning the core raised. All numbers are recomputed here.
 */
export function computeState(req: StateRequest): StateResponse {
  try {
    const { temperatureK, pressurePa } = stateConditions(req)
    const mixture = { gasIds: req.mixture.map((r) => r.gas), x: req.mixture.map((r) => r.fraction) }
    const options = { allowCubicFallback: req.allowCubicFallback ?? false }
    const prepared = prepareModel(req.model, mixture, options)
    const state = evaluateState(prepared, temperatureK, pressurePa)
    const dalton = partialPressures(req.model, mixture, temperatureK, pressurePa, options)
    const rho = state.molarDensityMolPerM3
    // the Dalton result repeats the state's warnings and adds the mixing-law caveat
    const seen = new Set<string>()
    const warnings = [...state.warnings, ...dalton.warnings].filter((w) => {
      const key = `${w.code}|${w.message}`
      if (seen.has(key)) return false
      seen.add(key)
      return true
    })
    return {
      model: state.model,
      requestedModel: req.model,
      compressibility: state.compressibility,
      molarVolume: { value: 1000 / rho, unit: 'L/mol' },
      density: { value: rho * state.molarMassKgPerMol, unit: 'kg/m³' },
      molarDensity: { value: rho / 1000, unit: 'mol/L' },
      molarMass: { value: state.molarMassKgPerMol * 1000, unit: 'g/mol' },
      temperature: { value: temperatureK, unit: 'K' },
      absolutePressure: { value: pressurePa / 1e5, unit: 'bar' },
      partialPressures: prepared.mixture.gasIds.map((gas, i) => ({ gas, value: dalton.partialPressuresPa[i] / 1e5, unit: 'bar' as const })),
      warnings: warnings.map((w) => ({ code: w.code, severity: w.severity, message: w.message })),
    }
  } catch (err) {
    rethrowWithWireField(err)
  }
}
