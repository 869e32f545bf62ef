import {
  expandPseudoComponents,
  getGas,
  getReferenceCondition,
  iso10156Flammability,
  iso10156OxidisingPower,
  isKnownGas,
  leChatelierLflPercent,
  type Mixture,
  type ModelId,
  mixtureLc50,
  PA_PER_BAR,
  PhysicsInputError,
  type PreparedModel,
  prepareModel,
  pureGas,
  STANDARD_ATMOSPHERE_PA,
  stateFromTP,
  ZERO_CELSIUS_K,
} from '../physics/index.ts'
import { type GasUse, type LinePricing, toMoleFraction } from './line-pricing.ts'
import type { OrderLineInput } from './order.ts'
import { certificationClassPct, HAZARD_LABEL, type HazardSurchargeKey, type PriceBook, type PriceEntry, rentalClassLitres, SHOP_CURRENCY } from './pricing.ts'

/**
 * Pricing a quote: what one cylinder of a specified mixture holds, what that gas costs, plus rental,
 * certification and hazardous-material surcharges from the price book. The same function runs in the quote
 * screen (live, as the user types) and on the server (which recomputes and stores; the browser's number is
 * only a preview).
 *
 * Gas use per cylinder: the settled state of the order, 15 °C and the fill pressure (bar gauge + one standard
 * atmosphere), gives the molar density ρ of the mixture from GERG-2008 (Peng–Robinson where GERG-2008 does not
 * cover a gas); n = ρ·V with V the water volume; component i gets n_i = x_i·n. Each component is priced
 * per kg (m_i = n_i·M_i) or per standard cubic metre at 15 °C, 101.325 kPa, real-gas corrected with Z of the
 * pure component there (V_i = n_i / ρ_i(15 °C, 101.325 kPa)).
 */

/** Temperature at which fill pressures are settled and quoted (ADR practice: 15 °C). */
export const QUOTE_TEMPERATURE_C = 15
export const QUOTE_TEMPERATURE_K = ZERO_CELSIUS_K + QUOTE_TEMPERATURE_C
/** Gauge → absolute: the fill pressure is bar gauge; one standard atmosphere (101.325 kPa) is added. */
export const GAUGE_OFFSET_PA = STANDARD_ATMOSPHERE_PA
/** Reference condition of every standard volume on a quote. */
export const QUOTE_REFERENCE_ID = '15C-101325' as const
export const QUOTE_REFERENCE_LABEL = getReferenceCondition(QUOTE_REFERENCE_ID).label
/** Preferred equation of state; Peng–Robinson replaces it for mixtures it does not cover. */
export const QUOTE_MODEL: ModelId = 'gerg-2008'

export { type GasUse, GasUseSchema, type LinePricing, LinePricingSchema, toMoleFraction } from './line-pricing.ts'

/** True when a gas id can carry a gas price (a gas of the library). */
export function isPriceableGas(id: string): boolean {
  return isKnownGas(id)
}

export interface QuoteProblem {
  /** path in the order input, e.g. "lines.0.components.1.gas" */
  field: string
  message: string
}

export type LineQuoteResult = { ok: true; pricing: LinePricing } | { ok: false; problems: QuoteProblem[] }

export interface OrderQuote {
  lines: LineQuoteResult[]
  /** null while any line cannot be priced */
  totalMinor: number | null
  problems: QuoteProblem[]
}

// ---- the price book, indexed --------------------------------------------------------------------------------

export interface PriceIndex {
  currency: string
  gas: ReadonlyMap<string, PriceEntry>
  /** rental classes, smallest first */
  rental: readonly { litres: number; entry: PriceEntry }[]
  /** certification classes, loosest (largest uncertainty) first */
  certification: readonly { pct: number; entry: PriceEntry }[]
  surcharge: ReadonlyMap<string, PriceEntry>
}

export function indexPriceBook(book: PriceBook): PriceIndex {
  const gas = new Map<string, PriceEntry>()
  const surcharge = new Map<string, PriceEntry>()
  const rental: { litres: number; entry: PriceEntry }[] = []
  const certification: { pct: number; entry: PriceEntry }[] = []
  for (const e of book.entries) {
    if (e.kind === 'gas') gas.set(e.key, e)
    else if (e.kind === 'surcharge') surcharge.set(e.key, e)
    else if (e.kind === 'rental') rental.push({ litres: rentalClassLitres(e.key), entry: e })
    else certification.push({ pct: certificationClassPct(e.key), entry: e })
  }
  rental.sort((a, b) => a.litres - b.litres)
  certification.sort((a, b) => b.pct - a.pct)
  return { currency: book.currency || SHOP_CURRENCY, gas, rental, certification, surcharge }
}

// ---- mixture facts -----------------------------------------------------------------------------------------

/** The line's full composition: minor components in order, then the balance gas with the rest. */
export function lineMixture(line: Pick<OrderLineInput, 'components' | 'balanceGas'>): Mixture {
  const gasIds = line.components.map((c) => c.gas)
  const x = line.components.map((c) => toMoleFraction(c.amount, c.unit))
  const minor = x.reduce((s, v) => s + v, 0)
  return { gasIds: [...gasIds, line.balanceGas], x: [...x, 1 - minor] }
}

export interface MixtureHazards {
  /** surcharge keys that apply */
  hazards: HazardSurchargeKey[]
  cautions: string[]
}

/** O2 content above which equipment and cylinders need oxygen service (OSHA 29 CFR 1910.146 enriched-atmosphere limit). */
const OXYGEN_ENRICHED_FRACTION = 0.235

/**
 * Which surcharges apply and which cautions the quote prints, from the finished mixture:
 * flammable — ISO 10156 sum > 1 for fuel + inert; with an oxidiser present, fuel content at or above the
 * Le Chatelier LFL of the fuel part; oxidising — ISO 10156 oxidising power > 0.235; toxic — LC50 of the mixture
 * ≤ 5000 ppm (ADR 2.2.2.1.5); reactive — a toxic or corrosive component in a mixture that is not toxic for
 * transport. Decision support for pricing and paperwork: defer to local codes and licensed practice.
 */
export function mixtureHazards(mixture: Mixture): MixtureHazards {
  const hazards: HazardSurchargeKey[] = []
  const cautions: string[] = []
  const expanded = expandPseudoComponents(mixture)
  let fuelFraction = 0
  let oxygenFraction = 0
  const toxicNames: string[] = []
  const corrosiveNames: string[] = []
  const fuelNames: string[] = []
  for (let i = 0; i < expanded.gasIds.length; i++) {
    const gas = getGas(expanded.gasIds[i])
    if (!(expanded.x[i] > 0)) continue
    if (gas.hazards.includes('flammable')) {
      fuelFraction += expanded.x[i]
      fuelNames.push(gas.formula)
    }
    if (gas.id === 'oxygen') oxygenFraction += expanded.x[i]
    if (gas.hazards.includes('toxic')) toxicNames.push(gas.formula)
    if (gas.hazards.includes('corrosive')) corrosiveNames.push(gas.formula)
  }
  const flam = iso10156Flammability(mixture)
  let flammable = flam.flammable
  if (!flam.methodApplicable) {
    const lfl = leChatelierLflPercent(mixture)
    flammable = lfl !== null && fuelFraction * 100 >= lfl
  }
  const oxidising = iso10156OxidisingPower(mixture).oxidising
  const toxic = mixtureLc50(mixture).toxic
  if (flammable) hazards.push('flammable')
  if (oxidising) hazards.push('oxidising')
  if (toxic) hazards.push('toxic')
  else if (toxicNames.length > 0 || corrosiveNames.length > 0) hazards.push('reactive')

  cautions.push(
    'High-pressure gas cylinder: secure it upright, keep the valve protection on in transport, open valves slowly, and use a regulator rated for the cylinder pressure.',
  )
  if (toxic) cautions.push(`Toxic gas mixture (${toxicNames.join(', ')}): use only with extraction or in a gas cabinet, with gas detection, by trained people.`)
  else if (toxicNames.length > 0)
    cautions.push(`Contains ${toxicNames.join(', ')}, toxic at higher concentrations: vent exhaust gas safely and leak-test connections.`)
  if (corrosiveNames.length > 0)
    cautions.push(`Contains ${corrosiveNames.join(', ')}, corrosive when wet: keep regulators and lines dry and of compatible materials.`)
  if (flammable) cautions.push(`Flammable mixture (${fuelNames.join(', ')}): keep away from ignition sources, and use equipment suited to flammable gas.`)
  else if (fuelNames.length > 0 && !flam.methodApplicable) {
    cautions.push(
      `Holds fuel (${fuelNames.join(', ')}) and oxidiser: prepared below the lower flammability limit under the shop's oxidant–fuel procedure; never add fuel to it.`,
    )
  }
  if (oxidising || oxygenFraction > OXYGEN_ENRICHED_FRACTION) {
    cautions.push('Oxygen-enriched mixture: use oxygen-clean equipment, no oil or grease, and keep it away from combustible materials.')
  }
  cautions.push('Follow local codes, the cylinder markings and the safety data sheet; licensed practice takes precedence over this note.')
  return { hazards, cautions }
}

// ---- pricing -------------------------------------------------------------------------------------------------

const referenceMolarVolume = new Map<string, number>()

/** Real-gas molar volume (m³/mol) of a pure gas at 15 °C, 101.325 kPa; cached per gas. */
function pureReferenceMolarVolumeM3(gasId: string): number {
  const hit = referenceMolarVolume.get(gasId)
  if (hit !== undefined) return hit
  const ref = getReferenceCondition(QUOTE_REFERENCE_ID)
  const prepared: PreparedModel = prepareModel(QUOTE_MODEL, pureGas(gasId), { allowCubicFallback: true })
  const v = 1 / prepared.densityMolPerM3(ref.temperatureK, ref.pressurePa)
  referenceMolarVolume.set(gasId, v)
  return v
}

function physicsField(field: string, prefix: string, line: Pick<OrderLineInput, 'components'>): string {
  const m = /^mixture\[(\d+)\]\.(gas|fraction)$/.exec(field)
  if (m) {
    const i = Number(m[1])
    if (i >= line.components.length) return `${prefix}balanceGas`
    return `${prefix}components.${i}.${m[2] === 'gas' ? 'gas' : 'amount'}`
  }
  if (field === 'pressure') return `${prefix}finalPressureBarGauge`
  if (field === 'waterVolume') return `${prefix}waterVolumeL`
  return `${prefix}components`
}

/**
 * Prices one cylinder line. `prefix` is prepended to problem fields (e.g. "lines.0.").
 * Never throws for bad input: problems name the field to fix.
 */
export function quoteLine(line: OrderLineInput, index: PriceIndex, rentalDays: number, prefix = ''): LineQuoteResult {
  const problems: QuoteProblem[] = []
  const mixture = lineMixture(line)
  const pressurePa = line.finalPressureBarGauge * PA_PER_BAR + GAUGE_OFFSET_PA
  let state: ReturnType<typeof stateFromTP>
  try {
    state = stateFromTP(QUOTE_MODEL, mixture, QUOTE_TEMPERATURE_K, pressurePa, { allowCubicFallback: true })
  } catch (err) {
    if (err instanceof PhysicsInputError) return { ok: false, problems: [{ field: physicsField(err.field, prefix, line), message: err.message }] }
    const message = err instanceof Error ? err.message : String(err)
    return { ok: false, problems: [{ field: `${prefix}finalPressureBarGauge`, message: `The gas state could not be computed: ${message}` }] }
  }
  const volumeM3 = line.waterVolumeL / 1000
  const amountMol = state.molarDensityMolPerM3 * volumeM3

  const gases: GasUse[] = []
  mixture.gasIds.forEach((gasId, i) => {
    const field = i < line.components.length ? `${prefix}components.${i}.gas` : `${prefix}balanceGas`
    const gas = getGas(gasId)
    const entry = index.gas.get(gasId)
    if (!entry) {
      problems.push({ field, message: `The price book has no price for ${gas.name} (${gas.formula}). Add it under Gases.` })
      return
    }
    const n = amountMol * mixture.x[i]
    const massKg = (n * gas.molarMassGPerMol) / 1000
    let standardVolumeM3: number
    try {
      standardVolumeM3 = n * pureReferenceMolarVolumeM3(gasId)
    } catch (err) {
      problems.push({ field, message: `Standard volume of ${gas.formula} could not be computed: ${err instanceof Error ? err.message : String(err)}` })
      return
    }
    const quantity = entry.unit === 'kg' ? massKg : standardVolumeM3
    gases.push({
      gas: gasId,
      formula: gas.formula,
      fraction: mixture.x[i],
      amountMol: n,
      massKg,
      standardVolumeM3,
      unit: entry.unit === 'kg' ? 'kg' : 'm3-15C',
      unitPriceMinor: entry.priceMinor,
      costMinor: Math.round(quantity * entry.priceMinor),
    })
  })

  let rental: LinePricing['rental'] = null
  if (rentalDays > 0) {
    const cls = index.rental.find((r) => r.litres >= line.waterVolumeL - 1e-9)
    if (!cls) {
      problems.push({
        field: `${prefix}waterVolumeL`,
        message: `The price book has no rental class for a ${line.waterVolumeL} L cylinder. Add one under Cylinder rental.`,
      })
    } else {
      rental = { key: cls.entry.key, days: rentalDays, unitPriceMinor: cls.entry.priceMinor, costMinor: cls.entry.priceMinor * rentalDays }
    }
  }

  const certClass = index.certification.find((c) => c.pct <= line.certificationUncertaintyPct + 1e-9)
  if (!certClass) {
    const tightest = index.certification.at(-1)
    problems.push({
      field: `${prefix}certificationUncertaintyPct`,
      message: tightest
        ? `No certification class as tight as ${line.certificationUncertaintyPct} %; the tightest in the price book is ${tightest.pct} %.`
        : 'The price book has no certification classes. Add them under Certification.',
    })
  }

  let hazards: MixtureHazards
  try {
    hazards = mixtureHazards(mixture)
  } catch (err) {
    if (err instanceof PhysicsInputError) return { ok: false, problems: [...problems, { field: physicsField(err.field, prefix, line), message: err.message }] }
    throw err
  }
  const surcharges: LinePricing['surcharges'] = []
  for (const key of hazards.hazards) {
    const entry = index.surcharge.get(key)
    if (!entry)
      problems.push({
        field: `${prefix}components`,
        message: `The price book has no surcharge for "${HAZARD_LABEL[key]}". Add it under Hazardous-material surcharges.`,
      })
    else surcharges.push({ key, label: entry.label, costMinor: entry.priceMinor })
  }

  if (problems.length > 0 || !certClass) return { ok: false, problems }

  const gasMinor = gases.reduce((s, g) => s + g.costMinor, 0)
  const perCylinderMinor = gasMinor + (rental?.costMinor ?? 0) + certClass.entry.priceMinor + surcharges.reduce((s, x) => s + x.costMinor, 0)
  return {
    ok: true,
    pricing: {
      currency: index.currency,
      model: state.model,
      temperatureC: QUOTE_TEMPERATURE_C,
      pressureBarAbsolute: pressurePa / PA_PER_BAR,
      compressibility: state.compressibility,
      amountMolPerCylinder: amountMol,
      massKgPerCylinder: amountMol * state.molarMassKgPerMol,
      referenceLabel: QUOTE_REFERENCE_LABEL,
      gases,
      gasMinor,
      rental,
      certification: { key: certClass.entry.key, label: certClass.entry.label, costMinor: certClass.entry.priceMinor },
      surcharges,
      perCylinderMinor,
      quantity: line.quantity,
      totalMinor: perCylinderMinor * line.quantity,
      hazards: hazards.hazards,
      cautions: hazards.cautions,
      notes: state.warnings.filter((w) => w.severity !== 'info').map((w) => w.message),
    },
  }
}

/** Prices every line of an order; the total is null while any line has a problem. */
export function quoteOrder(order: { lines: readonly OrderLineInput[]; rentalDays: number }, book: PriceBook | PriceIndex): OrderQuote {
  const index = 'entries' in book ? indexPriceBook(book) : book
  const lines = order.lines.map((line, i) => quoteLine(line, index, order.rentalDays, `lines.${i}.`))
  const problems = lines.flatMap((l) => (l.ok ? [] : l.problems))
  const totalMinor = problems.length > 0 ? null : lines.reduce((s, l) => s + (l.ok ? l.pricing.totalMinor : 0), 0)
  return { lines, totalMinor, problems }
}

/** "2 % CH4, bal. air" — a short name for a specification. */
export function describeMixture(line: Pick<OrderLineInput, 'components' | 'balanceGas'>): string {
  const formula = (id: string) => (isKnownGas(id) ? (id === 'air' ? 'air' : getGas(id).formula) : id)
  const parts = line.components.map((c) => `${formatAmount(c.amount)} ${c.unit === 'percent' ? '%' : c.unit} ${formula(c.gas)}`)
  const balance = `${line.components.length ? 'bal. ' : ''}${formula(line.balanceGas)}`
  return [...parts, balance].join(', ')
}

function formatAmount(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(6)))
}
