import type { Cylinder } from '#shared/schemas/cylinder.ts'
import type { PlanCylinderRef } from '#shared/schemas/plan.ts'

/** An inventory cylinder (the cylinders API's shape) as a plan sees it. */
export function toPlanCylinder(c: Cylinder): PlanCylinderRef {
  return {
    id: c.id,
    serial: c.serial,
    waterVolumeL: c.waterVolumeL,
    servicePressureBar: c.servicePressureBar,
    testPressureBar: c.testPressureBar,
    material: c.material,
    valveOutlet: c.valveOutlet,
    oxygenClean: c.oxygenClean,
    nextTestDate: c.nextTestDate,
    residual:
      c.residual.kind === 'residual'
        ? {
            kind: 'residual',
            pressureBarGauge: c.residual.pressureBarGauge,
            composition: c.residual.composition.map((x) => ({ gas: x.gas, fraction: x.fraction })),
          }
        : { kind: 'evacuated' },
  }
}
