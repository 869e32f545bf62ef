import { describe, expect, it } from 'vitest'
import { findIncompatibilities, PhysicsInputError } from '../../../shared/physics/index.ts'

const pairOf = (a: string, b: string) => (f: { a: string; b: string }) => (f.a === a && f.b === b) || (f.a === b && f.b === a)

describe('incompatible pairs (common practice; ISO 6142-1:2015 scope excludes reacting components)', () => {
  it('blocks NO with O2 and with air', () => {
    const findings = findIncompatibilities(['nitric-oxide', 'nitrogen', 'oxygen'])
    expect(findings.find(pairOf('nitric-oxide', 'oxygen'))?.severity).toBe('block')
    expect(findIncompatibilities(['nitric-oxide', 'air']).find(pairOf('nitric-oxide', 'air'))?.severity).toBe('block')
  })

  it('blocks NH3 with the acid gases HCl, SO2, H2S, Cl2, NO2 and with CO2', () => {
    for (const acid of ['hydrogen-chloride', 'sulfur-dioxide', 'hydrogen-sulfide', 'chlorine', 'nitrogen-dioxide', 'carbon-dioxide']) {
      expect(findIncompatibilities(['ammonia', acid]).find(pairOf('ammonia', acid))?.severity, acid).toBe('block')
    }
  })

  it('blocks H2S with SO2 and chlorine with any fuel', () => {
    expect(findIncompatibilities(['hydrogen-sulfide', 'sulfur-dioxide'])[0].severity).toBe('block')
    expect(findIncompatibilities(['chlorine', 'methane'])[0].severity).toBe('block')
    expect(findIncompatibilities(['chlorine', 'hydrogen'])[0].severity).toBe('block')
  })

  it('marks fuel with oxidiser as conditional (feasibility study), e.g. CH4 with O2 or with air', () => {
    expect(findIncompatibilities(['methane', 'oxygen', 'nitrogen'])).toEqual([expect.objectContaining({ severity: 'conditional' })])
    expect(findIncompatibilities(['hydrogen', 'air'])[0].severity).toBe('conditional')
  })

  it('finds nothing for inert blends and reports each pair once', () => {
    expect(findIncompatibilities(['argon', 'carbon-dioxide', 'helium', 'nitrogen'])).toEqual([])
    const findings = findIncompatibilities(['ammonia', 'chlorine'])
    expect(findings).toHaveLength(1)
    expect(findings[0].severity).toBe('block')
  })

  it('rejects unknown gases', () => {
    expect(() => findIncompatibilities(['nitrogen', 'unobtainium'])).toThrow(PhysicsInputError)
  })
})
