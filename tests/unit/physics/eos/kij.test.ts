import { describe, expect, it } from 'vitest'
import {
  getGas,
  interactionParameter,
  KIJ_TABLES,
  PENG_ROBINSON,
  PENG_ROBINSON_KIJ,
  prepareCubic,
  prepareCubicModel,
  stateFromTP,
} from '../../../../shared/physics/index.ts'

describe(`binary interaction parameters — ${PENG_ROBINSON_KIJ.source}`, () => {
  it('returns the tabulated DECHEMA values for well-known pairs, in either order', () => {
    expect(interactionParameter('peng-robinson', 'methane', 'carbon-dioxide')).toBe(0.0978)
    expect(interactionParameter('peng-robinson', 'carbon-dioxide', 'methane')).toBe(0.0978)
    expect(interactionParameter('peng-robinson', 'nitrogen', 'carbon-dioxide')).toBe(-0.0122)
    expect(interactionParameter('peng-robinson', 'carbon-dioxide', 'ethane')).toBe(0.13)
  })

  it('is 0 for i = j, for untabulated pairs and for van der Waals', () => {
    expect(interactionParameter('peng-robinson', 'argon', 'argon')).toBe(0)
    expect(interactionParameter('peng-robinson', 'argon', 'carbon-dioxide')).toBe(0)
    expect(interactionParameter('van-der-waals', 'methane', 'carbon-dioxide')).toBe(0)
  })

  it('lists each pair at most once per table and never a pair it also excludes', () => {
    for (const table of Object.values(KIJ_TABLES)) {
      const keys = table.entries.map((e) => [e.a, e.b].sort().join('|'))
      expect(new Set(keys).size, table.model).toBe(keys.length)
      for (const x of table.excluded) expect(keys).not.toContain([x.a, x.b].sort().join('|'))
      for (const e of table.entries) expect(Math.abs(e.kij)).toBeLessThanOrEqual(0.25)
    }
  })

  it('changes a mixture result in the expected direction: k_ij > 0 weakens attraction, raising Z', () => {
    // CH4/CO2 50/50 at 300 K, 50 bar, Peng–Robinson with the DECHEMA k_ij = 0.0978 versus k_ij = 0
    const gasIds = ['methane', 'carbon-dioxide']
    const x = [0.5, 0.5]
    const withKij = prepareCubicModel('peng-robinson', { gasIds, x })
    const withoutKij = prepareCubic(
      PENG_ROBINSON,
      gasIds.map((id) => getGas(id)),
      x,
      null,
    )
    // a_mix = ΣΣ x_i x_j √(a_i a_j)(1 − k_ij): the cross term shrinks by exactly k_ij
    const cross = (withoutKij.attractionParameter(300) - withKij.attractionParameter(300)) / 0.0978
    const a1 = prepareCubic(PENG_ROBINSON, [getGas('methane')], [1]).attractionParameter(300)
    const a2 = prepareCubic(PENG_ROBINSON, [getGas('carbon-dioxide')], [1]).attractionParameter(300)
    expect(Math.abs(cross - 2 * 0.25 * Math.sqrt(a1 * a2)) / cross).toBeLessThan(1e-12)
    expect(withKij.compressibility(300, 50e5)).toBeGreaterThan(withoutKij.compressibility(300, 50e5))
    expect(stateFromTP('peng-robinson', { gasIds, x }, 300, 50e5).compressibility).toBe(withKij.compressibility(300, 50e5))
  })
})
