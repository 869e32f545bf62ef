import { getGas, isKnownGas, iso10156Flammability, iso10156OxidisingPower, mixtureLc50 } from '#shared/physics/index.ts'
import type { Hazard } from '#shared/schemas/quality.ts'

/** Name and formula of a gas id for people and paper (an id outside the library prints as itself). */
export function gasLabel(gasId: string): { gas: string; formula: string; name: string } {
  if (!isKnownGas(gasId)) return { gas: gasId, formula: gasId, name: gasId }
  const g = getGas(gasId)
  return { gas: gasId, formula: g.formula, name: g.name }
}

/** Oxygen below this amount fraction in the air we breathe is oxygen-deficient (common practice, no source). */
const OXYGEN_DEFICIENT_FRACTION = 0.195

const ALWAYS = [
  'Keep the cylinder upright and secured against falling; close the valve after use and when empty.',
  'Use a pressure regulator rated for the cylinder pressure and open the valve slowly.',
  'Keep the cylinder below 50 °C, away from heat and direct sunlight.',
]
const DEFER = 'Follow local codes, the cylinder markings and label, the safety data sheet and licensed practice; this certificate does not replace them.'

/**
 * The cylinder's hazard statement and the usual cautions, from the certified composition: ISO 10156 flammability
 * and oxidising power and the LC50 additivity rule of ADR 2.2.2.1.5, as computed by the physics core (whose
 * coefficients are marked there as recalled, unverified). Components outside the library are named as such.
 */
export function hazardFor(components: readonly { gas: string; fraction: number }[], fillPressureBarGauge: number): Hazard {
  const present = components.filter((c) => c.fraction > 0)
  const statement: string[] = [`Contains gas under pressure (${fillPressureBarGauge} bar gauge at 15 °C): may explode if heated.`]
  const cautions = [...ALWAYS]
  const unknown = present.filter((c) => !isKnownGas(c.gas)).map((c) => c.gas)
  const known = present.filter((c) => isKnownGas(c.gas))
  const flags = new Set(known.flatMap((c) => getGas(c.gas).hazards))

  let flammable = flags.has('flammable')
  let fuelAndOxidiser = false
  let oxidising = false
  let toxic = flags.has('toxic')
  let lc50: number | null = null
  try {
    const total = known.reduce((s, c) => s + c.fraction, 0)
    const mixture = { gasIds: known.map((c) => c.gas), x: known.map((c) => c.fraction / total) }
    const f = iso10156Flammability(mixture)
    fuelAndOxidiser = !f.methodApplicable
    flammable = f.methodApplicable ? f.flammable : flammable
    oxidising = iso10156OxidisingPower(mixture).oxidising
    const t = mixtureLc50(mixture)
    toxic = t.toxic
    lc50 = t.lc50PpmV
  } catch {
    // a composition the physics core refuses: fall back to the component flags (conservative: any flag counts)
    oxidising = flags.has('oxidiser')
  }

  if (fuelAndOxidiser) statement.push('Contains both fuel and oxidiser: flammability is decided by test or expert assessment, not by calculation.')
  else if (flammable) statement.push('Flammable gas mixture (ISO 10156 calculation).')
  if (oxidising) statement.push('Oxidising: may cause or intensify fire (more oxidising than air, ISO 10156).')
  if (toxic) statement.push(`Toxic if inhaled${lc50 !== null ? ` (LC50 of the mixture ${lc50 > 1_000_000 ? 'above 1 000 000 ppm' : `about ${Math.round(lc50)} ppm`} by volume)` : ''}.`)
  else if (flags.has('toxic')) statement.push('Contains a toxic component below the toxic-mixture threshold: avoid breathing the gas.')
  if (flags.has('corrosive')) statement.push('Contains a corrosive component.')
  const oxygen = known.filter((c) => c.gas === 'oxygen' || c.gas === 'air').reduce((s, c) => s + c.fraction * (c.gas === 'air' ? 0.2095 : 1), 0)
  if (!oxidising && oxygen < OXYGEN_DEFICIENT_FRACTION) statement.push('Can displace the oxygen in the air and cause asphyxiation without warning.')
  if (unknown.length) statement.push(`Components outside the gas library (${unknown.join(', ')}): see the safety data sheet.`)

  if (flammable || fuelAndOxidiser) cautions.push('Keep away from ignition sources; use in a well-ventilated area and check connections for leaks.')
  if (oxidising || flags.has('oxidiser'))
    cautions.push('Keep the valve, regulator and fittings free of oil and grease; use equipment cleaned for oxygen service.')
  if (toxic || flags.has('toxic')) cautions.push('Use only with the gas detection and extraction your local rules require; never vent into an occupied room.')
  if (flags.has('corrosive')) cautions.push('Use corrosion-resistant regulators and purge the lines with inert gas after use.')
  if (!oxidising && oxygen < OXYGEN_DEFICIENT_FRACTION) cautions.push('Use in a well-ventilated area; in confined spaces monitor the oxygen level.')
  cautions.push(DEFER)
  statement.push('Classification calculated from the certified composition; the label and the safety data sheet govern.')
  return { statement: statement.join(' '), cautions }
}
