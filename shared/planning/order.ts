/**
 * Order of additions. 'as-given' follows the sources' order; 'auto' applies the rules of thumb of
 * the trade (stated on every plan) to the sources the material balance actually uses.
 */
import { gasFacts } from './gas-model.ts'
import { reactiveClass } from './hazard-groups.ts'
import type { ResolvedSource } from './resolve.ts'
import type { AdditionOrder } from './types.ts'

export interface OrderResult {
  /** indices into the resolved source list, in filling order */
  readonly order: number[]
  readonly rules: string[]
}

export const ORDER_RULES = {
  residual: 'Gas already in the cylinder (residual) is the starting state; it is counted as a parent gas.',
  liquefiableFirst:
    'Liquefiable parent gases (critical temperature above the fill temperature) go first, while the cylinder pressure is still below their vapour pressure (common practice, no source).',
  minorFirst: 'Smallest additions first, in ascending amount, at low cylinder pressure where the low-range reading is best (common practice, no source).',
  balanceLast: 'Balance gas last: it has the highest-pressure source and its jet mixes the cylinder (common practice, no source).',
  fuelOxidiser:
    'Fuel and oxidiser are never added one straight after the other: fuels first, then inert gas (the balance when it is inert), oxidisers last, so the oxidiser meets only fuel already diluted below its lower flammability limit (principle of EIGA Doc 139 / CGA P-58; common practice).',
  asGiven: 'Additions follow the order of the sources as given; no reordering applied.',
  unused: 'Sources the material balance does not need are left out.',
} as const

export function orderAdditions(
  mode: AdditionOrder,
  components: readonly string[],
  sources: readonly ResolvedSource[],
  amounts: readonly number[],
  balanceIndex: number,
  hasResidual: boolean,
  fillTemperatureK: number,
): OrderResult {
  const total = amounts.reduce((s, n) => s + n, 0)
  const used = sources.map((_, A) => A).filter((A) => amounts[A] > 1e-12 * total)
  const rules: string[] = []
  if (hasResidual) rules.push(ORDER_RULES.residual)
  if (used.length < sources.length) rules.push(ORDER_RULES.unused)
  if (mode === 'as-given') {
    rules.push(ORDER_RULES.asGiven)
    return { order: used, rules }
  }
  // the balance source: the used source richest in the balance gas, largest amount breaking ties
  const balanceSource = [...used].sort((p, q) => sources[q].a[balanceIndex] - sources[p].a[balanceIndex] || amounts[q] - amounts[p])[0]
  const liquefiable = (A: number): boolean => isLiquefiableSource(components, sources[A], fillTemperatureK)
  const ascending = (list: number[]): number[] => [...list].sort((p, q) => Number(liquefiable(q)) - Number(liquefiable(p)) || amounts[p] - amounts[q])
  const others = ascending(used.filter((A) => A !== balanceSource))
  const cls = (A: number) => reactiveClass(components, sources[A].a)
  const anyFuel = used.some((A) => cls(A) === 'fuel' || cls(A) === 'fuel+oxidiser')
  const anyOx = used.some((A) => cls(A) === 'oxidiser' || cls(A) === 'fuel+oxidiser')
  if (others.some(liquefiable)) rules.push(ORDER_RULES.liquefiableFirst)
  rules.push(ORDER_RULES.minorFirst)
  if (!(anyFuel && anyOx)) {
    rules.push(ORDER_RULES.balanceLast)
    return { order: [...others, balanceSource], rules }
  }
  rules.push(ORDER_RULES.fuelOxidiser)
  const fuels = others.filter((A) => cls(A) === 'fuel' || cls(A) === 'fuel+oxidiser')
  const oxidisers = others.filter((A) => cls(A) === 'oxidiser')
  const inerts = others.filter((A) => cls(A) === 'inert')
  const balanceClass = cls(balanceSource)
  if (balanceClass === 'inert') {
    return { order: [...fuels, ...inerts, balanceSource, ...oxidisers], rules }
  }
  if (balanceClass === 'fuel') {
    // oxidiser first into the empty cylinder, inert buffer, fuel balance last
    return { order: [...oxidisers, ...inerts, ...fuels, balanceSource], rules }
  }
  rules.push(ORDER_RULES.balanceLast)
  return { order: [...fuels, ...inerts, ...oxidisers, balanceSource], rules }
}

/** A pure source whose main gas can be liquid at the fill temperature (T below its critical temperature). */
export function isLiquefiableSource(components: readonly string[], source: ResolvedSource, fillTemperatureK: number): boolean {
  if (source.kind !== 'pure') return false
  const facts = gasFacts(components[source.mainIndex])
  return facts.composition === null && facts.criticalTemperatureK > fillTemperatureK
}
