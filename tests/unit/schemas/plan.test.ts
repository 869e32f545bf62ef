import { describe, expect, it } from 'vitest'
import { standingCautions } from '#shared/schemas/plan-cautions.ts'
import { type PlanLineSpec, PlanOptionsSchema, PlanSetupError, planRequestFromLine } from '#shared/schemas/plan.ts'

const keys = (items: { gas: string; fraction: number }[]) => standingCautions(items).map((c) => c.key)

describe('standingCautions', () => {
  it('always warns of high pressure', () => {
    expect(keys([{ gas: 'argon', fraction: 1 }])).toEqual(['pressure'])
  })

  it('forming gas handled from pure hydrogen is flammable', () => {
    // LFL of H2 4.0 % (IEC 60079-20-1:2010); 5 % H2 and the pure H2 parent are far above a quarter of it
    expect(
      keys([
        { gas: 'hydrogen', fraction: 0.05 },
        { gas: 'nitrogen', fraction: 0.95 },
        { gas: 'hydrogen', fraction: 1 },
      ]),
    ).toContain('flammable')
  })

  it('50 ppm CO from a 1000 ppm premix is toxic but not a flammable concern', () => {
    // LFL of CO 10.9 % (IEC 60079-20-1:2010): 1000 ppm is below a quarter of it (25 % LFL: common practice, no source)
    const k = keys([
      { gas: 'carbon-monoxide', fraction: 50e-6 },
      { gas: 'nitrogen', fraction: 1 - 50e-6 },
      { gas: 'carbon-monoxide', fraction: 0.001 },
    ])
    expect(k).toContain('toxic')
    expect(k).not.toContain('flammable')
  })

  it('methane in air is fuel with oxidiser', () => {
    // 2.5 % CH4 in air (detector calibration gas, DOMAIN §7 row 8): above a quarter of the 4.4 % LFL, air supports combustion
    const k = keys([
      { gas: 'methane', fraction: 0.025 },
      { gas: 'air', fraction: 0.975 },
    ])
    expect(k).toContain('flammable')
    expect(k).toContain('fuelOxidiser')
  })

  it('oxygen above 23.5 % (OSHA 29 CFR 1910.146) earns the oxidiser caution; 21 % does not', () => {
    expect(
      keys([
        { gas: 'oxygen', fraction: 0.3 },
        { gas: 'nitrogen', fraction: 0.7 },
      ]),
    ).toContain('oxygen')
    expect(
      keys([
        { gas: 'oxygen', fraction: 0.21 },
        { gas: 'helium', fraction: 0.79 },
      ]),
    ).not.toContain('oxygen')
  })
})

const M21_LINE: PlanLineSpec = {
  id: 7,
  lineNo: 1,
  description: 'M21',
  components: [
    { gas: 'carbon-dioxide', fraction: 0.18, amount: 18, unit: 'percent' },
    { gas: 'argon', fraction: 0.82 },
  ],
  balanceGas: 'argon',
  blendTolerancePct: 10,
  certificationUncertaintyPct: 10,
  waterVolumeL: 50,
  valveOutlet: 'DIN 477 No. 10',
  quantity: 2,
  finalPressureBarGauge: 200,
  method: 'partial-pressure',
  order: { id: 1, number: 'FW-TEST-1', status: 'accepted', customer: 'Invented Customer', neededBy: null },
}
const CYLINDER = {
  id: 3,
  serial: 'TEST-50-1',
  waterVolumeL: 50,
  servicePressureBar: 200,
  testPressureBar: 300,
  material: 'steel',
  valveOutlet: 'DIN 477 No. 10',
  oxygenClean: false,
  nextTestDate: '2031-01-01',
  residual: { kind: 'evacuated' as const },
}

describe('planRequestFromLine', () => {
  it('states the line contract: gauge pressure settled at 15 °C, balance marked, tolerance carried', () => {
    const req = planRequestFromLine(M21_LINE, CYLINDER, PlanOptionsSchema.parse({ model: 'gerg-2008' }), '2026-12-01')
    expect(req.finalPressure).toEqual({ value: 200, unit: 'bar', reference: 'gauge' })
    expect(req.referenceTemperature).toEqual({ value: 15, unit: 'C' })
    expect(req.target.find((t) => t.gas === 'argon')?.balance).toBe(true)
    expect(req.blendTolerancePercent).toBe(10)
    expect(req.cylinder.testPressure).toEqual({ value: 300, unit: 'bar', reference: 'gauge' })
    expect(req.sources).toEqual([{ gas: 'carbon-dioxide' }, { gas: 'argon' }])
    expect(req.method).toBe('partial-pressure')
    expect(req.asOfDate).toBe('2026-12-01')
  })

  it('carries a recorded residue as a parent gas of the plan, even at 0 bar gauge', () => {
    const req = planRequestFromLine(
      M21_LINE,
      { ...CYLINDER, residual: { kind: 'residual', pressureBarGauge: 0, composition: [{ gas: 'argon', fraction: 1 }] } },
      PlanOptionsSchema.parse({ model: 'ideal' }),
    )
    expect(req.cylinder.residual).toEqual({
      kind: 'residual',
      pressure: { value: 0, unit: 'bar', reference: 'gauge' },
      composition: [{ gas: 'argon', fraction: 1 }],
    })
  })

  it('refuses a residue of unknown composition: never top up an unknown heel (DOMAIN §1.7)', () => {
    expect(() =>
      planRequestFromLine(
        M21_LINE,
        { ...CYLINDER, residual: { kind: 'residual', pressureBarGauge: 3, composition: [] } },
        PlanOptionsSchema.parse({ model: 'ideal' }),
      ),
    ).toThrow(PlanSetupError)
  })
})
