/**
 * Numbers that drive the planner's safety findings, each with its source. Gas properties (Tci, K, Ci,
 * LC50, LFL, vapour pressure) are not here: they live in the physics core's gas library with theirs.
 */
export interface RuleValue {
  readonly value: number
  readonly source: string
}

export const RULES = {
  /** amount fraction of O2 above which a cylinder, valve and manifold must be oxygen-clean */
  oxygenEnrichedFraction: {
    value: 0.235,
    source:
      'OSHA 29 CFR 1910.146(b), definition of "oxygen enriched atmosphere" (> 23.5 % by volume); applied to every cylinder state and every addition as the app rule of DOMAIN §6.1 (cleaning per CGA G-4.1)',
  },
  /** amount fraction of O2 above which equipment must be designed for oxygen service */
  oxygenServiceFraction: {
    value: 0.4,
    source: '46 CFR 197.326 (equipment for oxygen or mixtures over 40 % oxygen must be designed for that use)',
  },
  /** US: settled pressure at 70 °F must not exceed the service pressure */
  usServiceTemperatureK: { value: 294.261, source: '49 CFR 173.301a(c): 70 °F (21.1 °C)' },
  /** US: developed pressure at 131 °F (55 °C) must not exceed 5/4 of the service pressure */
  usHotTemperatureK: { value: 328.15, source: '49 CFR 173.301a(d): 131 °F (55 °C)' },
  usHotFactor: { value: 1.25, source: '49 CFR 173.301a(d): 5/4 × service pressure' },
  usPlusFactor: {
    value: 1.1,
    source: '49 CFR 173.302a(b): 3A/3AA/3AX/3AAX/3T marked "+" may be filled to 110 % of service pressure (non-liquefied, non-flammable, non-poisonous gases)',
  },
  /** EU: working pressure (settled at 15 °C) at most 2/3 of the test pressure */
  euReferenceTemperatureK: { value: 288.15, source: 'ADR 1.2.1 "working pressure": settled pressure at 15 °C (from memory)' },
  euWorkingToTestFactor: { value: 2 / 3, source: 'ADR P200 (3)(f): working pressure ≤ 2/3 of test pressure for compressed gases without a tabulated value' },
  /** EU: test pressure assumed when the cylinder's is not given (200 bar working / 300 bar test) */
  euDefaultTestFactor: { value: 1.5, source: 'common practice, no source (typical EU 200 bar working / 300 bar test)' },
  /** condensation screen: caution from this ratio of partial to vapour pressure on */
  condensationCautionRatio: { value: 0.9, source: 'common practice, no source (10 % margin below saturation)' },
  /** fuel + oxidiser state: caution from this share of the lower flammability limit on, block at 1 */
  fuelLflCautionShare: {
    value: 0.5,
    source: 'common practice, no source (flammability limits widen with pressure; EIGA Doc 139 / CGA P-58 ask for a margin below the LFL at filling pressure)',
  },
  /** a step is measurable when its pressure rise (or added mass) is at least this many resolution steps */
  measurableResolutionSteps: { value: 10, source: 'common practice, no source' },
} as const satisfies Record<string, RuleValue>

/** Plain-words cautions shown with findings. Each defers to local codes and licensed practice. */
export const CAUTIONS = {
  pressure:
    'High-pressure gas. Fill only a cylinder, valve and manifold rated for this pressure and within the cylinder markings. Follow local codes, the cylinder markings and licensed practice.',
  oxygen:
    'Oxygen-enriched gas. Use an oxygen-clean cylinder, valve and manifold; open valves slowly, fill slowly, keep oil and grease away. Follow local codes and licensed practice.',
  flammable: 'Flammable gas. Keep ignition sources away, bond and ground the manifold, ventilate and leak-test. Follow local codes and licensed practice.',
  fuelOxidiser:
    'Fuel and oxidiser in one cylinder can burn or explode. Use premixes and an inert buffer, check every step, and have the recipe feasibility-reviewed (EIGA Doc 139 / CGA P-58) before filling. Follow local codes and licensed practice.',
  toxic:
    'Toxic gas. Work in a ventilated enclosure with extraction and gas detection, keep breathing apparatus at hand, leak-test, vent through a scrubber. Follow local codes and licensed practice.',
  condensation:
    'A component may liquefy in the cylinder when cold; the gas delivered would then not match the certificate. Lower the fill pressure, raise the minimum temperature or change the recipe. Follow licensed practice.',
  incompatible: 'These components react with each other. Do not put them in one cylinder. Follow licensed practice.',
  testDate: 'Do not fill a cylinder past its periodic test date. Have it requalified first, as local regulations require.',
  measurement:
    'A step this small cannot be measured reliably with the chosen gauge or scale. Use a lower-range instrument or a premix. Follow licensed practice.',
} as const
