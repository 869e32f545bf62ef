/**
 * Known incompatible gas pairs for the fill planner: components that react with each other must not share a
 * cylinder (ISO 6142-1:2015 scope: the method is not for components that react with each other), and fuels with
 * oxidisers are allowed only under an oxidant–fuel feasibility study.
 */
import { getGas } from './gases.ts'

export type IncompatibilitySeverity = 'block' | 'conditional'

export interface IncompatiblePair {
  readonly a: string
  readonly b: string
  readonly severity: IncompatibilitySeverity
  readonly reason: string
  readonly source: string
}

const CP = 'common practice, no source (reaction chemistry of the pair)'

/** Explicit pairs. Group rules (chlorine with any fuel; any fuel with any oxidiser) are applied by findIncompatibilities. */
export const INCOMPATIBLE_PAIRS: readonly IncompatiblePair[] = Object.freeze([
  { a: 'nitric-oxide', b: 'oxygen', severity: 'block', reason: 'NO is oxidised to NO2 by oxygen', source: CP },
  { a: 'nitric-oxide', b: 'air', severity: 'block', reason: 'NO is oxidised to NO2 by the oxygen in air', source: CP },
  { a: 'ammonia', b: 'hydrogen-chloride', severity: 'block', reason: 'forms solid ammonium chloride', source: CP },
  { a: 'ammonia', b: 'sulfur-dioxide', severity: 'block', reason: 'forms ammonium sulfite salts', source: CP },
  { a: 'ammonia', b: 'hydrogen-sulfide', severity: 'block', reason: 'forms ammonium hydrosulfide', source: CP },
  { a: 'ammonia', b: 'chlorine', severity: 'block', reason: 'forms chloramines and explosive nitrogen trichloride', source: CP },
  { a: 'ammonia', b: 'nitrogen-dioxide', severity: 'block', reason: 'reacts to ammonium nitrate/nitrite', source: CP },
  { a: 'ammonia', b: 'carbon-dioxide', severity: 'block', reason: 'forms ammonium carbamate', source: CP },
  { a: 'hydrogen-sulfide', b: 'sulfur-dioxide', severity: 'block', reason: 'reacts to sulfur and water (Claus reaction)', source: CP },
  { a: 'chlorine', b: 'hydrogen', severity: 'block', reason: 'chlorine–hydrogen mixtures are explosive (light-initiated)', source: CP },
] satisfies IncompatiblePair[])

export type IncompatibilityFinding = IncompatiblePair

const FUEL_OXIDISER_RULE =
  'fuel with oxidiser: allowed only as dilute premixes under an oxidant–fuel feasibility study, with every ' +
  'intermediate cylinder state checked (EIGA Doc 139 / CGA P-58 / AIGA 058); defer to those codes and licensed practice'

const CHLORINE_FUEL_RULE = 'chlorine reacts with hydrogen, ammonia, hydrogen sulfide and hydrocarbons'

const key = (a: string, b: string): string => (a < b ? `${a}|${b}` : `${b}|${a}`)

/**
 * Incompatible pairs among the given gas ids: explicit pairs first, then the group rules. One finding per pair,
 * the most severe. Unknown ids throw PhysicsInputError (field 'gas').
 * @example findIncompatibilities(['nitric-oxide', 'nitrogen', 'oxygen'])[0].severity // 'block'
 */
export function findIncompatibilities(gasIds: readonly string[]): IncompatibilityFinding[] {
  const gases = gasIds.map((id) => getGas(id))
  const found = new Map<string, IncompatibilityFinding>()
  const add = (finding: IncompatibilityFinding): void => {
    const k = key(finding.a, finding.b)
    const existing = found.get(k)
    if (existing === undefined || (existing.severity === 'conditional' && finding.severity === 'block')) found.set(k, finding)
  }
  const present = new Set(gasIds)
  for (const pair of INCOMPATIBLE_PAIRS) if (present.has(pair.a) && present.has(pair.b)) add(pair)
  for (let i = 0; i < gases.length; i++) {
    for (let j = i + 1; j < gases.length; j++) {
      const g = gases[i]
      const h = gases[j]
      if (g.id === h.id) continue
      const chlorineWithFuel = (g.id === 'chlorine' && h.groups.includes('fuel')) || (h.id === 'chlorine' && g.groups.includes('fuel'))
      if (chlorineWithFuel) {
        add({ a: g.id, b: h.id, severity: 'block', reason: CHLORINE_FUEL_RULE, source: CP })
        continue
      }
      const fuelOxidiser = (g.groups.includes('fuel') && h.groups.includes('oxidiser')) || (h.groups.includes('fuel') && g.groups.includes('oxidiser'))
      if (fuelOxidiser) {
        add({
          a: g.id,
          b: h.id,
          severity: 'conditional',
          reason: FUEL_OXIDISER_RULE,
          source: 'EIGA Doc 139 / CGA P-58 principles; numeric limits not available here (common practice)',
        })
      }
    }
  }
  return [...found.values()]
}
