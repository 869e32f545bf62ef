/**
 * Number formatting at the display edge. Everything below the components is SI; these helpers turn SI values
 * into the units the user picked, always with the unit and, for pressure, gauge or absolute.
 */

export type PressureDisplayUnit = 'bar' | 'psi' | 'kPa'
export type TemperatureDisplayUnit = 'degC' | 'degF'

const PA_PER: Record<PressureDisplayUnit, number> = { bar: 1e5, psi: (0.45359237 * 9.80665) / (0.0254 * 0.0254), kPa: 1e3 }

/** Digits after the point that suit a pressure unit at cylinder scale. */
export const PRESSURE_DECIMALS: Record<PressureDisplayUnit, number> = { bar: 2, psi: 1, kPa: 0 }

export function paToUnit(pa: number, unit: PressureDisplayUnit): number {
  return pa / PA_PER[unit]
}
export function unitToPa(value: number, unit: PressureDisplayUnit): number {
  return value * PA_PER[unit]
}
export function kelvinToUnit(k: number, unit: TemperatureDisplayUnit): number {
  return unit === 'degC' ? k - 273.15 : ((k - 273.15) * 9) / 5 + 32
}
export function unitToKelvin(value: number, unit: TemperatureDisplayUnit): number {
  return unit === 'degC' ? value + 273.15 : ((value - 32) * 5) / 9 + 273.15
}
export const TEMPERATURE_SYMBOL: Record<TemperatureDisplayUnit, string> = { degC: '°C', degF: '°F' }

/** A fixed number of decimals, with a proper minus sign; '—' for non-finite values. */
export function fmt(value: number | null | undefined, decimals = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'
  const s = value.toFixed(decimals)
  return s.startsWith('-') ? `−${s.slice(1)}` : s
}

/** Significant digits, for values spanning orders of magnitude. */
export function sig(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'
  const s = Math.abs(value) >= 1e-3 && Math.abs(value) < 1e7 ? String(Number(value.toPrecision(digits))) : value.toExponential(digits - 1)
  return s.startsWith('-') ? `−${s.slice(1)}` : s
}

/** A mole fraction as % or ppm, whichever reads better. */
export function fractionText(x: number, decimals = 3): string {
  if (!Number.isFinite(x)) return '—'
  if (x > 0 && x < 0.001) return `${fmt(x * 1e6, Math.max(0, decimals - 1))} ppm`
  return `${fmt(x * 100, decimals)} %`
}

/** Signed percentage, e.g. "+1.23 %". */
export function signedPct(value: number | null | undefined, decimals = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'
  return `${value >= 0 ? '+' : '−'}${Math.abs(value).toFixed(decimals)} %`
}
