import { fromBar, fromCelsius, type ReadingTemperatureUnit, toCelsius } from '#shared/schemas/run.ts'
import type { DisplayUnits } from '#src/components/units-context.tsx'

/** The unit the temperature is typed and shown in. */
export function temperatureUnit(units: DisplayUnits): ReadingTemperatureUnit {
  return units.temperature === 'degF' ? 'F' : 'C'
}
export const temperatureSymbol = (units: DisplayUnits) => (units.temperature === 'degF' ? '°F' : '°C')

/**
 * Digits to show a pressure with: the gauge's resolution when the plan names one (a 0.1 bar gauge → 1 digit),
 * else a sensible default for the size of the number.
 */
export function pressureDigits(units: DisplayUnits, valueBar: number, resolutionBar: number | null): number {
  if (resolutionBar && resolutionBar > 0) {
    const res = fromBar(resolutionBar, units.pressure)
    return Math.min(3, Math.max(0, Math.ceil(-Math.log10(res) - 1e-9)))
  }
  const v = Math.abs(fromBar(valueBar, units.pressure))
  // near vacuum (an evacuated cylinder) small numbers need more digits
  if (v > 0 && v < 1) return 3
  if (units.pressure === 'kPa') return v >= 10 ? 0 : 2
  if (units.pressure === 'psi') return v >= 100 ? 0 : 1
  return v >= 100 ? 1 : 2
}

export function formatPressure(units: DisplayUnits, valueBar: number, resolutionBar: number | null = null): string {
  return fromBar(valueBar, units.pressure).toFixed(pressureDigits(units, valueBar, resolutionBar))
}

export function formatTemperature(units: DisplayUnits, celsius: number): string {
  return fromCelsius(celsius, temperatureUnit(units)).toFixed(1)
}

/** A typed number ("12,5" or "12.5"); null when empty or not a number. */
export function parseTyped(text: string): number | null {
  const t = text.trim().replace(',', '.')
  if (!t || !/^-?(\d+\.?\d*|\.\d+)$/.test(t)) return null
  return Number(t)
}

export function typedCelsius(units: DisplayUnits, text: string): number | null {
  const v = parseTyped(text)
  return v === null ? null : toCelsius(v, temperatureUnit(units))
}
