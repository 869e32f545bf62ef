/**
 * Inputs shared by the benchmark sections: the mixtures the equations of state are timed on and the fill-plan
 * requests the planner and POST /api/calc/fill-plan are timed with. All invented shop data.
 */
import { GERG_COMPONENT_IDS, type Mixture } from '../../shared/physics/index.ts'
import type { FillPlanRequest, ReplanRequest } from '../../shared/schemas/fill-plan.ts'

/** Nitrogen / argon / carbon dioxide, a welding-shield style mixture, at 15 °C and 200 bar. */
export const THREE_COMPONENT = {
  label: '3c',
  mixture: { gasIds: ['nitrogen', 'argon', 'carbon-dioxide'], x: [0.1, 0.72, 0.18] } satisfies Mixture,
  temperatureK: 288.15,
  pressurePa: 20e6,
} as const

/** The 21-component natural-gas check mixture of the GERG-2008 publication's worked example, at 400 K and 50 MPa. */
export const TWENTY_ONE_COMPONENT = {
  label: '21c',
  mixture: {
    gasIds: GERG_COMPONENT_IDS,
    x: [
      0.77824, 0.02, 0.06, 0.08, 0.03, 0.0015, 0.003, 0.0005, 0.00165, 0.00215, 0.00088, 0.00024, 0.00015, 0.00009, 0.004, 0.005, 0.002, 0.0001, 0.0025, 0.007,
      0.001,
    ],
  } satisfies Mixture,
  temperatureK: 400,
  pressurePa: 50e6,
} as const

/**
 * Minor components added one by one for the plan-growth series (2..8 components): all inside GERG-2008, so every
 * model can plan every size; nitrogen is the balance gas.
 */
const MINORS: readonly { gas: string; fraction: number; purity: number }[] = [
  { gas: 'carbon-dioxide', fraction: 0.08, purity: 0.99995 },
  { gas: 'argon', fraction: 0.15, purity: 0.99999 },
  { gas: 'methane', fraction: 0.05, purity: 0.99995 },
  { gas: 'carbon-monoxide', fraction: 0.04, purity: 0.99997 },
  { gas: 'helium', fraction: 0.05, purity: 0.99999 },
  { gas: 'ethane', fraction: 0.03, purity: 0.9995 },
  { gas: 'hydrogen', fraction: 0.03, purity: 0.99999 },
]
export const PLAN_COMPONENT_COUNTS = [2, 3, 4, 5, 6, 7, 8] as const

/** A partial-pressure plan request for a 50 L, 200 bar cylinder filled to 150 bar gauge with `components` gases. */
export function planRequest(components: number, model: FillPlanRequest['model'], method: FillPlanRequest['method'] = 'partial-pressure'): FillPlanRequest {
  if (components < 2 || components > MINORS.length + 1) throw new RangeError(`plan requests have 2..${MINORS.length + 1} components`)
  const minors = MINORS.slice(0, components - 1)
  const balance = 1 - minors.reduce((s, m) => s + m.fraction, 0)
  return {
    target: [...minors.map((m) => ({ gas: m.gas, fraction: m.fraction })), { gas: 'nitrogen', fraction: balance, balance: true }],
    finalPressure: { value: 150, unit: 'bar', reference: 'gauge' },
    referenceTemperature: { value: 15, unit: 'C' },
    fillTemperature: { value: 20, unit: 'C' },
    cylinder: {
      waterVolume: { value: 50, unit: 'L' },
      servicePressure: { value: 200, unit: 'bar', reference: 'gauge' },
      testPressure: { value: 300, unit: 'bar', reference: 'gauge' },
      material: 'steel',
      oxygenClean: false,
      nextTestDate: '2031-06-30',
      residual: { kind: 'evacuated' },
    },
    sources: [...minors.map((m) => ({ gas: m.gas, purity: m.purity })), { gas: 'nitrogen', purity: 0.999999 }],
    order: 'auto',
    model,
    method,
    gauge: { span: { value: 250, unit: 'bar' }, accuracyClass: 0.1, resolution: { value: 0.05, unit: 'bar' } },
    scale: { resolution: { value: 1, unit: 'g' } },
    blendTolerancePercent: 10,
    asOfDate: '2027-03-15',
  }
}

/**
 * A re-plan request: the first two steps of the 5-component plan were done and the second overshot its
 * cumulative pressure by `overshootBar` (read at the fill temperature).
 */
export function replanRequest(model: FillPlanRequest['model'], cumulativeGaugeBar: readonly number[], overshootBar = 0.4): ReplanRequest {
  const plan = planRequest(5, model)
  return {
    plan,
    actuals: cumulativeGaugeBar.map((bar, i) => ({
      stepIndex: i,
      pressure: { value: bar + (i === cumulativeGaugeBar.length - 1 ? overshootBar : 0), unit: 'bar', reference: 'gauge' },
      temperature: { value: 20, unit: 'C' },
    })),
  }
}

/** The 5-component request with a 1 % carbon monoxide step, too small to measure well on the gauge: the planner adds a premix proposal. */
export function premixPlanRequest(model: FillPlanRequest['model']): FillPlanRequest {
  const req = planRequest(5, model)
  const target = req.target.map((t) => (t.gas === 'carbon-monoxide' ? { ...t, fraction: 0.002 } : t))
  const balance = target.find((t) => t.balance)!
  balance.fraction = 1 - target.filter((t) => !t.balance).reduce((s, t) => s + t.fraction, 0)
  return { ...req, target }
}
