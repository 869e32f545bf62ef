import { describe, it } from 'vitest'
import { idealGasMolarVolumeM3PerMol, prepareModel, stateFromTP } from '../../../../shared/physics/index.ts'
import codata from '../../../fixtures/physics/codata-2018-ideal-molar-volume.json' with { type: 'json' }
import { expectClose } from '../../../support/expect-close.ts'

describe(`ideal-gas molar volume — ${codata.source.citation}`, () => {
  for (const c of codata.cases) {
    it(`${c.temperatureK} K, ${c.pressurePa} Pa → ${c.molarVolumeM3PerMol} m³/mol`, () => {
      expectClose(idealGasMolarVolumeM3PerMol(c.temperatureK, c.pressurePa), c.molarVolumeM3PerMol, codata.tolerance, c)
      const state = stateFromTP('ideal', { gasIds: ['argon'], x: [1] }, c.temperatureK, c.pressurePa)
      expectClose(1 / state.molarDensityMolPerM3, c.molarVolumeM3PerMol, codata.tolerance, { ...c, via: 'stateFromTP' })
      const p = prepareModel('ideal', { gasIds: ['argon'], x: [1] }).pressurePa(c.temperatureK, 1 / c.molarVolumeM3PerMol)
      expectClose(p, c.pressurePa, codata.tolerance, { ...c, via: 'pressurePa' })
    })
  }
})
