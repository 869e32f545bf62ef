/**
 * GERG-2008 density-solve benchmark. Run: npx tsx bench/gerg-2008.bench.ts
 * Prints ns per gergDensity call for
 *  - a 3-component mixture (nitrogen 0.10 / argon 0.72 / carbon dioxide 0.18) at 288.15 K, 200 bar,
 *  - the 21-component NIST check mixture at 400 K, 50 MPa,
 * each (a) at a fixed temperature (temperature terms cached, the usual case when a plan step is
 * solved at one temperature) and (b) with the temperature changing on every call (cache miss),
 * plus prepareGergMixture + solve.
 * Budget (Fillwright brief): ≤ 6 µs per 3-component solve.
 */
import { GERG_COMPONENT_IDS, gergDensity, prepareGergMixture, type GergMixture } from '../shared/physics/eos/gerg-2008/index.ts'

const CHECK_X = [
  0.77824, 0.02, 0.06, 0.08, 0.03, 0.0015, 0.003, 0.0005, 0.00165, 0.00215, 0.00088, 0.00024, 0.00015, 0.00009, 0.004, 0.005, 0.002, 0.0001, 0.0025, 0.007,
  0.001,
]

interface Case {
  name: string
  ids: readonly string[]
  x: readonly number[]
  temperatureK: number
  pressurePa: number
}

const cases: Case[] = [
  {
    name: '3-comp N2/Ar/CO2 0.10/0.72/0.18, 288.15 K, 20 MPa',
    ids: ['nitrogen', 'argon', 'carbon-dioxide'],
    x: [0.1, 0.72, 0.18],
    temperatureK: 288.15,
    pressurePa: 20e6,
  },
  {
    name: '21-comp NIST check gas, 400 K, 50 MPa',
    ids: GERG_COMPONENT_IDS,
    x: CHECK_X,
    temperatureK: 400,
    pressurePa: 50e6,
  },
]

let sink = 0

function time(label: string, runs: number, fn: (k: number) => void): number {
  for (let k = 0; k < Math.min(runs, 20000); k++) fn(k) // warm up
  let best = Number.POSITIVE_INFINITY
  for (let rep = 0; rep < 5; rep++) {
    const t0 = process.hrtime.bigint()
    for (let k = 0; k < runs; k++) fn(k)
    const ns = Number(process.hrtime.bigint() - t0) / runs
    if (ns < best) best = ns
  }
  console.log(`  ${label.padEnd(44)} ${best.toFixed(0).padStart(7)} ns`)
  return best
}

for (const c of cases) {
  const m: GergMixture = prepareGergMixture(c.ids, c.x)
  const solve = gergDensity(m, c.temperatureK, c.pressurePa)
  console.log(
    `${c.name}: ρ = ${solve.molarDensityMolPerM3.toFixed(6)} mol/m³, Z = ${solve.compressibility.toFixed(9)}, ` +
      `${solve.iterations} evaluations, ${m.gasIds.length} active components`,
  )
  const runs = c.ids.length > 3 ? 100_000 : 300_000
  time('density solve, same T (cached T terms)', runs, () => {
    sink += gergDensity(m, c.temperatureK, c.pressurePa).molarDensityMolPerM3
  })
  time('density solve, T changes every call', runs, (k) => {
    sink += gergDensity(m, c.temperatureK + (k & 1) * 1e-3, c.pressurePa).molarDensityMolPerM3
  })
  time('prepareGergMixture + density solve', runs / 10, () => {
    sink += gergDensity(prepareGergMixture(c.ids, c.x), c.temperatureK, c.pressurePa).molarDensityMolPerM3
  })
}
if (sink === 42) console.log(sink)
