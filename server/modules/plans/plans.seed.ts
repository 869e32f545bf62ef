import type { EntityManager } from '@mikro-orm/core'
import { expandPseudoComponents, gergCovers } from '#shared/physics/index.ts'
import type { FillPlanRequest } from '#shared/schemas/fill-plan.ts'
import { type PlanOptions, PlanOptionsSchema } from '#shared/schemas/plan.ts'
import { addSeedStep } from '../../seed/demo.ts'
import { type Order, type OrderLine, OrderLineSchema, OrderSchema } from '../orders/order.entity.ts'
import { UserSchema } from '../users/user.entity.ts'
import { FillPlanSchema } from './fill-plan.entity.ts'
import { computeStoredPlan } from './plans.service.ts'

/**
 * Demo fill plans: every line of the seeded orders that are already at 'planned' or 'filling' gets an approved plan
 * (computed with the real engine, one computation per line), so the runs seed can book cylinders for the demo
 * technician's "my fills today". Invented recipe choices of the demo shop: CO2-rich food gas is stored indoors
 * (not below 10 °C); ppm-level CO is made from the shop's 1000 ppm CO-in-N2 premix.
 */

const CO_PREMIX: NonNullable<PlanOptions['sources']>[number] = {
  id: 'CO 1000 ppm in N2 (premix lot KR-P17)',
  composition: [
    { gas: 'carbon-monoxide', fraction: 0.001, uncertainty: 0.000002 },
    { gas: 'nitrogen', fraction: 0.999, uncertainty: 0.000002 },
  ],
}

function demoOptions(line: OrderLine): PlanOptions {
  const gasIds = line.components.map((c) => c.gas)
  const model = gergCovers(expandPseudoComponents({ gasIds, x: line.components.map((c) => c.fraction) }).gasIds) ? 'gerg-2008' : 'peng-robinson'
  const options: PlanOptions = { model, fillTemperature: { value: 15, unit: 'C' }, minimumTemperature: { value: 10, unit: 'C' } }
  const co = line.components.find((c) => c.gas === 'carbon-monoxide')
  if (co && co.fraction < 0.001 && line.balanceGas === 'nitrogen') {
    options.sources = [CO_PREMIX, { gas: 'nitrogen' }]
  }
  return options
}

export async function seedPlans(em: EntityManager): Promise<void> {
  const blender = await em.findOne(UserSchema, { email: 'blender@demo.test' })
  if (!blender) return
  const orders = await em.find(OrderSchema, { status: { $in: ['planned', 'filling'] } }, { populate: ['customer'] as never, orderBy: { id: 'asc' } })
  for (const order of orders as (Order & { customer: { company: string } })[]) {
    const lines = await em.find(OrderLineSchema, { order: order.id }, { orderBy: { lineNo: 'asc' } })
    for (const line of lines) {
      if ((await em.count(FillPlanSchema, { orderLine: line.id })) > 0) continue
      const spec = {
        id: line.id,
        lineNo: line.lineNo,
        description: line.description,
        components: line.components.map((c) => ({ gas: c.gas, fraction: c.fraction })),
        balanceGas: line.balanceGas,
        blendTolerancePct: line.blendTolerancePct,
        certificationUncertaintyPct: line.certificationUncertaintyPct,
        waterVolumeL: line.waterVolumeL,
        valveOutlet: line.valveOutlet,
        quantity: line.quantity,
        finalPressureBarGauge: line.finalPressureBarGauge,
        method: line.method,
        order: { id: order.id, number: order.number, status: order.status, customer: order.customer.company, neededBy: order.neededBy ?? null },
      }
      const { request, result } = computeStoredPlan(spec, null, PlanOptionsSchema.parse(demoOptions(line)))
      const approved = result.approvable
      const createdAt = new Date(Date.now() - 2 * 86_400_000)
      em.create(FillPlanSchema, {
        orderLine: line.id as never,
        cylinder: null,
        planVersion: 1,
        status: approved ? 'approved' : 'draft',
        model: request.model,
        method: request.method,
        request: request satisfies FillPlanRequest as unknown as Record<string, unknown>,
        result: result as unknown as Record<string, unknown>,
        blocking: !approved,
        createdById: blender.id,
        approvedById: approved ? blender.id : null,
        approvedAt: approved ? createdAt : null,
        createdAt,
      })
    }
  }
  await em.flush()
}

addSeedStep(async (em) => seedPlans(em))
