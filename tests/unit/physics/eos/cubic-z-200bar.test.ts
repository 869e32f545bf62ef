/** Cubic Z at cylinder pressure against the domain brief's calculated table (status: calc, not published). */
import { describe, it } from 'vitest'
import { stateFromTP } from '../../../../shared/physics/index.ts'
import table from '../../../fixtures/physics/domain-brief-cubic-z-200bar.json' with { type: 'json' }
import { expectClose } from '../../../support/expect-close.ts'

describe(`cubic Z at 15 °C — ${table.source.citation} (${table.source.status})`, () => {
  for (const c of table.cases) {
    for (const model of ['van-der-waals', 'srk', 'peng-robinson'] as const) {
      it(`${c.label}, ${model}: Z = ${c[model]}`, () => {
        const z = stateFromTP(model, { gasIds: c.gasIds, x: c.x }, table.temperatureK, c.pressurePa).compressibility
        expectClose(z, c[model], table.tolerance, { model, mixture: c.label, T: table.temperatureK, p: c.pressurePa })
      })
    }
  }
})
