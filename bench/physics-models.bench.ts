/**
 * Speed of one state evaluation, Z(T, p) (density root), per model, for a 3-component welding-type mixture and the
 * 21-component GERG-2008 check mixture. Run: npx tsx bench/physics-models.bench.ts
 * Goal for the cubic models: < 500 ns per evaluation after prepareModel.
 * Two cases: T fixed while p varies (a(T) cached, the planner's usual loop) and T varying on every call.
 */
import { GERG_COMPONENT_IDS, type Mixture, type ModelId, prepareModel } from '../shared/physics/index.ts'

const MIXTURES: Record<string, Mixture> = {
  'N2/Ar/CO2 (3)': { gasIds: ['nitrogen', 'argon', 'carbon-dioxide'], x: [0.1, 0.72, 0.18] },
  'GERG check (21)': {
    gasIds: [...GERG_COMPONENT_IDS],
    x: [
      0.77824, 0.02, 0.06, 0.08, 0.03, 0.0015, 0.003, 0.0005, 0.00165, 0.00215, 0.00088, 0.00024, 0.00015, 0.00009, 0.004, 0.005, 0.002, 0.0001, 0.0025, 0.007,
      0.001,
    ],
  },
}

const MODELS: readonly ModelId[] = ['ideal', 'van-der-waals', 'srk', 'peng-robinson', 'gerg-2008']

function nsPerCall(run: (i: number) => number, calls: number): number {
  let sink = 0
  for (let i = 0; i < Math.min(calls, 20_000); i++) sink += run(i) // warm-up
  let best = Number.POSITIVE_INFINITY
  for (let rep = 0; rep < 5; rep++) {
    const start = process.hrtime.bigint()
    for (let i = 0; i < calls; i++) sink += run(i)
    const elapsed = Number(process.hrtime.bigint() - start)
    best = Math.min(best, elapsed / calls)
  }
  if (!Number.isFinite(sink)) throw new Error('non-finite result in benchmark')
  return best
}

const rows: string[][] = [['mixture', 'model', 'ns/eval (T fixed)', 'ns/eval (T varies)']]
for (const [label, mixture] of Object.entries(MIXTURES)) {
  for (const model of MODELS) {
    const prepared = prepareModel(model, mixture)
    const calls = model === 'gerg-2008' ? 20_000 : 1_000_000
    const fixedT = nsPerCall((i) => prepared.compressibility(288.15, 1e6 + (i % 1000) * 2.5e4), calls)
    const varyT = nsPerCall((i) => prepared.compressibility(263.15 + (i % 100) * 0.5, 1e6 + (i % 1000) * 2.5e4), calls)
    rows.push([label, model, fixedT.toFixed(0), varyT.toFixed(0)])
  }
}
const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)))
for (const r of rows) console.log(r.map((cell, c) => cell.padEnd(widths[c])).join('  '))
console.log(`node ${process.version}; best of 5 runs after warm-up`)
