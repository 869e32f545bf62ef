/**
 * Equation-of-state cost: ns per density solve ρ(T, p) through the physics core's public entry
 * (prepareModel(model, mixture).densityMolPerM3), for each model and two mixtures.
 *  - "per eval": fixed temperature, pressure cycling over 16 values (how the planner calls it within one plan);
 *  - "t varies": temperature and pressure both change on every call (no temperature-term reuse).
 */
import { MODEL_IDS, type ModelId, prepareModel } from '../../shared/physics/index.ts'
import { THREE_COMPONENT, TWENTY_ONE_COMPONENT } from '../lib/fixtures.ts'
import { measure } from '../lib/micro.ts'
import { type Report, round } from '../lib/report.ts'

export function modelKey(model: ModelId): string {
  return model === 'gerg-2008' ? 'gerg2008' : model.replaceAll('-', '_')
}

export function runPhysics(report: Report, options: { quick: boolean }): void {
  const section = 'equations of state (CPU ns per density solve, best of 9 batches)'
  const micro = options.quick ? { batchMs: 15, samples: 5, warmupMs: 50 } : {}
  for (const c of [THREE_COMPONENT, TWENTY_ONE_COMPONENT]) {
    const pressures = Float64Array.from({ length: 16 }, (_, k) => c.pressurePa * (0.4 + (0.6 * k) / 15))
    const temperatures = Float64Array.from({ length: 16 }, (_, k) => c.temperatureK - 5 + (10 * ((k * 7) % 16)) / 15)
    for (const model of MODEL_IDS) {
      const prepared = prepareModel(model, c.mixture)
      const fixedT = measure((i) => prepared.densityMolPerM3(c.temperatureK, pressures[i & 15]), micro)
      const varyT = measure((i) => prepared.densityMolPerM3(temperatures[i & 15], pressures[(i >> 4) & 15]), micro)
      const k = modelKey(model)
      report.add(section, `${k}_${c.label}_ns_per_eval`, round(fixedT.nsPerOp, 1), `${model}, ${c.mixture.gasIds.length} components, fixed T, p varies`)
      report.add(section, `${k}_${c.label}_ns_per_eval_t_varies`, round(varyT.nsPerOp, 1), `${model}, ${c.mixture.gasIds.length} components, T and p vary`)
    }
    const prep = measure(() => prepareModel('gerg-2008', c.mixture).densityMolPerM3(c.temperatureK, c.pressurePa), {
      ...micro,
      batchMs: options.quick ? 15 : 60,
    })
    report.add(
      section,
      `gerg2008_${c.label}_prepare_and_solve_us`,
      round(prep.nsPerOp / 1000, 2),
      `prepareModel('gerg-2008') + one solve, ${c.mixture.gasIds.length} components`,
    )
  }
  report.budget({ key: 'gerg2008_3c_density', label: 'GERG-2008 3-component density solve, ns', figure: 'gerg2008_3c_ns_per_eval', limit: 6000, kind: 'max' })
  report.budget({
    key: 'gerg2008_3c_density_t_varies',
    label: 'GERG-2008 3-component density solve with T changing, ns',
    figure: 'gerg2008_3c_ns_per_eval_t_varies',
    limit: 6000,
    kind: 'max',
  })
  for (const model of ['van-der-waals', 'srk', 'peng-robinson'] as const) {
    report.budget({
      key: `${modelKey(model)}_3c_density`,
      label: `${model} 3-component density solve, ns`,
      figure: `${modelKey(model)}_3c_ns_per_eval`,
      limit: 500,
      kind: 'below',
    })
    report.budget({
      key: `${modelKey(model)}_3c_density_t_varies`,
      label: `${model} 3-component density solve with T changing, ns`,
      figure: `${modelKey(model)}_3c_ns_per_eval_t_varies`,
      limit: 500,
      kind: 'below',
    })
  }
}
