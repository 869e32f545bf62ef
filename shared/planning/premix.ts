/**
 * Multi-stage dilution. When an addition is too small for the gauge or scale to measure well
 * (rise below 10 resolution steps, or its component's expanded uncertainty over budget), the component
 * is first made as a premix in the balance gas, and the product is planned with the premix as a source.
 * The premix concentration is the largest "nice" value (1-2-5 series) for which the premix addition in
 * the product is measurable; a premix that is itself not measurable gets its own premix (up to 4 stages).
 */
import { PlanningInputError } from './errors.ts'
import { gasFacts } from './gas-model.ts'
import { buildPlan, principalComponent } from './plan-core.ts'
import { resolveInput } from './resolve.ts'
import type { FillPlan, FillPlanInput, PremixProposal, PremixStage, SourceInput } from './types.ts'

export const MAX_PREMIX_STAGES = 4

/** Codes that make a step a candidate for a premix. */
const UNMEASURABLE = new Set(['STEP_NOT_MEASURABLE', 'UNCERTAINTY_OVER_BUDGET'])

/** 1-2-5 series from 0.5 down to `floor` (amount fractions). */
function niceLadder(floor: number): number[] {
  const out: number[] = []
  for (let exp = 0; exp > -12; exp--) {
    for (const m of [5, 2, 1]) {
      const v = m * 10 ** (exp - 1)
      if (v > 0.5 + 1e-12) continue
      if (v < floor) return out
      out.push(Number(v.toPrecision(6)))
    }
  }
  return out
}

function formatFraction(x: number): string {
  if (x >= 0.01) return `${Number((x * 100).toPrecision(3))} %`
  return `${Number((x * 1e6).toPrecision(3))} ppm`
}

interface Unmeasurable {
  readonly gasId: string
  readonly sourceIndex: number
  readonly reason: string
}

/** Pure-gas steps of a plan whose principal component cannot be measured well enough. */
function unmeasurableSteps(input: FillPlanInput, plan: FillPlan, asOfDate?: string): Unmeasurable[] {
  if (!plan.warnings.some((w) => UNMEASURABLE.has(w.code))) return []
  const r = resolveInput(input)
  const built = buildPlan(r, asOfDate)
  const finalAmounts = r.components.map(
    (_, i) => (r.residual ? r.residual.a[i] * built.residualMoles : 0) + r.sources.reduce((s, src, A) => s + src.a[i] * built.amounts[A], 0),
  )
  const out: Unmeasurable[] = []
  for (const w of plan.warnings) {
    if (!UNMEASURABLE.has(w.code) || w.step === undefined) continue
    const src = built.stepSources[w.step]
    if (src?.kind !== 'pure') continue
    const principal = principalComponent(src, built.amounts[r.sources.indexOf(src)], finalAmounts, r)
    if (principal < 0) continue
    const gasId = r.components[principal]
    if (out.some((u) => u.gasId === gasId)) continue
    out.push({ gasId, sourceIndex: src.inputIndex, reason: w.message })
  }
  return out
}

function planOrNull(input: FillPlanInput, asOfDate?: string): FillPlan | null {
  try {
    return buildPlan(resolveInput(input), asOfDate).plan
  } catch (error) {
    if (error instanceof PlanningInputError) return null
    throw error
  }
}

/**
 * Propose premixes for the unmeasurable steps of `plan`; null when every step is measurable or no
 * premix helps.
 */
export function proposePremix(input: FillPlanInput, plan: FillPlan, asOfDate?: string, depth = 0): PremixProposal | null {
  if (depth >= MAX_PREMIX_STAGES) return null
  const bad = unmeasurableSteps(input, plan, asOfDate)
  if (bad.length === 0) return null
  const r = resolveInput(input)
  const balanceGasId = r.components[r.balanceIndex]
  const balanceSource =
    input.sources.find((s) => !s.composition && s.gasId === balanceGasId) ??
    input.sources.find((s) => !s.composition && s.gasId && expandsTo(s.gasId, balanceGasId))
  if (!balanceSource) return null
  const stages: PremixStage[] = []
  let product: FillPlanInput = input
  const reasons: string[] = []
  for (const item of bad) {
    const targetX = r.target[r.components.indexOf(item.gasId)]
    const pure = input.sources[item.sourceIndex]
    const formula = gasFacts(item.gasId).formula
    const balanceFormula = gasFacts(balanceSource.gasId!).formula
    // the largest premix fraction whose addition in the product is measurable
    let chosen: { c: number; premixPlan: FillPlan; proposal: PremixProposal | null; productInput: FillPlanInput } | null = null
    for (const c of niceLadder(targetX * 2)) {
      if (c <= targetX) break
      const label = `${formula} ${formatFraction(c)} in ${balanceFormula}`
      const premixInput: FillPlanInput = {
        ...input,
        target: [
          { gasId: item.gasId, x: c },
          { gasId: balanceSource.gasId!, x: 1 - c },
        ],
        balanceGasId: balanceSource.gasId,
        sources: [pure, balanceSource],
        cylinder: { ...input.cylinder, residual: { kind: 'evacuated' } },
        order: 'auto',
        proposePremix: false,
      }
      const premixPlan = planOrNull(premixInput, asOfDate)
      if (!premixPlan) continue
      // judge the product with the premix's nominal composition (default certificate uncertainty):
      // the premix itself is made measurable by its own stages below
      const nominal: SourceInput = {
        id: label,
        composition: [
          { gasId: item.gasId, x: c },
          { gasId: balanceSource.gasId!, x: 1 - c },
        ],
      }
      const trialInput: FillPlanInput = { ...product, sources: product.sources.map((s) => (s === pure ? nominal : s)), proposePremix: false }
      const trial = planOrNull(trialInput, asOfDate)
      if (!trial) continue
      const step = trial.steps.findIndex((s) => s.sourceId === label)
      if (trial.warnings.some((w) => UNMEASURABLE.has(w.code) && w.step === step)) continue
      const proposal = proposePremix(premixInput, premixPlan, asOfDate, depth + 1)
      const made = proposal ? proposal.productPlan : premixPlan
      const premixSource: SourceInput = {
        id: label,
        composition: made.predictedComposition.filter((p) => p.x > 0).map((p) => ({ gasId: p.gasId, x: p.x, u: p.u })),
      }
      const productInput: FillPlanInput = { ...product, sources: product.sources.map((s) => (s === pure ? premixSource : s)), proposePremix: false }
      if (!planOrNull(productInput, asOfDate)) continue
      chosen = { c, premixPlan, proposal, productInput }
      break
    }
    if (!chosen) continue
    if (chosen.proposal)
      stages.push(...chosen.proposal.stages, {
        label: `${formula} ${formatFraction(chosen.c)} in ${balanceFormula}`,
        gasId: item.gasId,
        reason: item.reason,
        plan: chosen.proposal.productPlan,
      })
    else stages.push({ label: `${formula} ${formatFraction(chosen.c)} in ${balanceFormula}`, gasId: item.gasId, reason: item.reason, plan: chosen.premixPlan })
    reasons.push(`${formula} at ${formatFraction(targetX)}: ${item.reason}`)
    product = chosen.productInput
  }
  if (stages.length === 0) return null
  const productPlan = buildPlan(resolveInput(product), asOfDate).plan
  const stillBad = [...stages.map((st) => ({ label: st.label, plan: st.plan })), { label: 'the product', plan: productPlan }]
    .filter((st) => st.plan.warnings.some((w) => UNMEASURABLE.has(w.code)))
    .map((st) => st.label)
  const rest =
    stillBad.length > 0
      ? ` Even so, ${stillBad.join(', ')} still has a step over the measurement limits with this gauge or scale: use a lower-range or more accurate instrument for the small additions.`
      : ''
  return {
    reason: `Premix proposed because ${reasons.join(' ')}${rest}`,
    stages,
    productPlan,
  }
}

function expandsTo(gasId: string, constituent: string): boolean {
  const parts = gasFacts(gasId).composition
  return parts !== null && [...parts].sort((p, q) => q.x - p.x)[0].gasId === constituent
}
