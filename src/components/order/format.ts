import { PA_PER_BAR, PA_PER_PSI } from '#shared/physics/constants.ts'
import type { DisplayUnits } from '#src/components/units-context.tsx'

/** Pa per display unit; gauge pressures convert without an offset (both sides are relative to the same atmosphere). */
const PA_PER_UNIT: Record<DisplayUnits['pressure'], number> = { bar: PA_PER_BAR, psi: PA_PER_PSI, kPa: 1000 }

/** A gauge pressure stored in bar, shown in the user's display unit: "200 bar g", "2901 psig", "20000 kPa g". */
export function formatGaugePressure(barGauge: number, units: DisplayUnits): string {
  const u = units.pressure
  const v = barGaugeToDisplay(barGauge, u)
  const digits = u === 'psi' ? 0 : u === 'kPa' ? 0 : barGauge < 10 ? 2 : 1
  const text = v.toLocaleString('en-GB', { maximumFractionDigits: digits })
  return u === 'psi' ? `${text} psig` : `${text} ${u} gauge`
}

/** bar gauge → the display unit's gauge value (for inputs). */
export function barGaugeToDisplay(barGauge: number, unitName: DisplayUnits['pressure']): number {
  return (barGauge * PA_PER_BAR) / PA_PER_UNIT[unitName]
}

/** The display unit's gauge value → bar gauge (for inputs). */
export function displayToBarGauge(value: number, unitName: DisplayUnits['pressure']): number {
  return (value * PA_PER_UNIT[unitName]) / PA_PER_BAR
}

export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—'
  const d = new Date(iso.length === 10 ? `${iso}T00:00:00Z` : iso)
  return d.toLocaleDateString('en-GB', { day: '2-digit', month: 'short', year: 'numeric', timeZone: iso.length === 10 ? 'UTC' : undefined })
}

export function formatDateTime(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { day: '2-digit', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' })
}
