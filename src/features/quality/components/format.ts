import { COMPOSITION_UNIT_LABEL, type CompositionUnit, formatSignificant, formatWithUncertainty, fromMoleFraction } from '#shared/schemas/quality.ts'

/** a mole fraction in a unit, e.g. "2.000 % mol/mol" */
export function fractionText(x: number, unit: CompositionUnit, significant = 4): string {
  return `${formatSignificant(fromMoleFraction(x, unit), significant)} ${COMPOSITION_UNIT_LABEL[unit]}`
}

/** "2.030 ± 0.020 % mol/mol (k = 2)" */
export function certifiedText(x: number, expandedU: number, k: number, unit: CompositionUnit): string {
  const t = formatWithUncertainty(x, expandedU, unit)
  return `${t.value} ± ${t.uncertainty} ${COMPOSITION_UNIT_LABEL[unit]} (k = ${k})`
}

export function signedPercent(relative: number): string {
  return `${relative >= 0 ? '+' : '−'}${Math.abs(relative * 100).toFixed(2)} %`
}

export function dateTimeText(iso: string | null): string {
  if (!iso) return '—'
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })
}
