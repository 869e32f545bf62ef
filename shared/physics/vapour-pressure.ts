/**
 * Vapour pressure of pure gases from the library's correlations (Perry Table 2-8 DIPPR-101 or Poling Antoine),
 * and a corresponding-states estimate (Lee–Kesler) for temperatures the correlation does not cover.
 */
import { getGas, type VapourPressureCorrelation } from './gases.ts'
import { PhysicsInputError } from './types.ts'

function checkTemperature(temperatureK: number): void {
  if (!Number.isFinite(temperatureK) || temperatureK <= 0) {
    throw new PhysicsInputError(`Temperature must be a finite number above 0 K, got ${temperatureK}.`, 'temperature')
  }
}

/** Evaluates a correlation without range checks (Pa). */
export function evaluateVapourPressureCorrelation(correlation: VapourPressureCorrelation, temperatureK: number): number {
  if (correlation.kind === 'dippr-101') {
    const { c1, c2, c3, c4, c5 } = correlation
    return Math.exp(c1 + c2 / temperatureK + c3 * Math.log(temperatureK) + c4 * temperatureK ** c5)
  }
  return 10 ** (correlation.a - correlation.b / (temperatureK + correlation.c))
}

/**
 * Saturation (vapour) pressure of a pure gas in Pa from the library correlation.
 * Returns null outside the correlation's temperature range, at or above the critical temperature, or when the
 * library has no correlation for the gas (nitrogen dioxide). Reference: see the gas's `sources.vapourPressure`.
 * @throws PhysicsInputError for an unknown gas (field 'gas') or a temperature ≤ 0 K (field 'temperature')
 * @example vapourPressurePa('carbon-dioxide', 293.15) // ≈ 5.74e6 (Perry Table 2-8)
 */
export function vapourPressurePa(gasId: string, temperatureK: number): number | null {
  const gas = getGas(gasId)
  checkTemperature(temperatureK)
  const correlation = gas.vapourPressure
  if (correlation === null) return null
  if (temperatureK < correlation.minTemperatureK || temperatureK > correlation.maxTemperatureK) return null
  if (temperatureK >= gas.criticalTemperatureK) return null
  return evaluateVapourPressureCorrelation(correlation, temperatureK)
}

/**
 * Corresponding-states estimate of the vapour pressure (Pa) from Tc, Pc and ω:
 * ln(p/Pc) = f0(Tr) + ω·f1(Tr) (Lee & Kesler, AIChE J. 21 (1975) 510; form as given in Poling, Prausnitz &
 * O'Connell, 5th ed., eq. 7-4.1 — from memory). An estimate only: use where the correlation has no range.
 * Returns null for Tr < 0.3 or T ≥ Tc.
 * @example vapourPressureEstimatePa('carbon-dioxide', 293.15) // ≈ 5.72e6
 */
export function vapourPressureEstimatePa(gasId: string, temperatureK: number): number | null {
  const gas = getGas(gasId)
  checkTemperature(temperatureK)
  if (gas.composition !== undefined) return null
  const tr = temperatureK / gas.criticalTemperatureK
  if (tr < 0.3 || tr >= 1) return null
  const lnTr = Math.log(tr)
  const tr6 = tr ** 6
  const f0 = 5.92714 - 6.09648 / tr - 1.28862 * lnTr + 0.169347 * tr6
  const f1 = 15.2518 - 15.6875 / tr - 13.4721 * lnTr + 0.43577 * tr6
  return gas.criticalPressurePa * Math.exp(f0 + gas.acentricFactor * f1)
}
