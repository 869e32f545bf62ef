import type { EntityManager } from '@mikro-orm/core'
import type { SessionUser } from '#shared/schemas/auth.ts'
import { localIsoDate } from '#shared/schemas/cylinder.ts'
import { FillPlanRequestSchema, FillPlanResponseSchema } from '#shared/schemas/fill-plan.ts'
import { addSeedStep } from '../../seed/demo.ts'
import { CylinderSchema } from '../cylinders/cylinder.entity.ts'
import type { Order, OrderLine } from '../orders/order.entity.ts'
import { FillPlanSchema } from '../plans/fill-plan.entity.ts'
import { UserSchema } from '../users/user.entity.ts'
import { FillReadingSchema, FillRunSchema } from './fill-run.entity.ts'
import { createRunsForPlan } from './runs.service.ts'
import { barOf, celsiusOf, planNeedsOxygenClean, readState } from './runs.state.ts'

/** Most demo runs booked per plan, so the inventory keeps free cylinders for trying things out. */
const RUNS_PER_PLAN = 2

/**
 * Demo fill runs: for each approved plan of an order at 'planned' or 'filling' whose line has no runs yet, books up
 * to two free cylinders that fit the plan for the demo technician today. On an order already at the manifold the
 * first run has its first step recorded on target and the second is finished, waiting for QA. Seeds nothing when no plan is approved (the plans seed runs first).
 */
export async function seedRuns(em: EntityManager): Promise<void> {
  const plans = await em.find(
    FillPlanSchema,
    { status: 'approved', blocking: false },
    { populate: ['orderLine', 'orderLine.order'] as never, orderBy: { id: 'asc' } },
  )
  if (plans.length === 0) return
  const tech = await em.findOne(UserSchema, { email: 'technician@demo.test' })
  const blender = await em.findOne(UserSchema, { email: 'blender@demo.test' })
  if (!tech || !blender) return
  const actor: SessionUser = { id: blender.id, email: blender.email, name: blender.name, roles: ['blender'], customerId: null }
  const today = localIsoDate()
  for (const plan of plans) {
    const line = plan.orderLine as OrderLine & { order: Order }
    if (line.order.status !== 'planned' && line.order.status !== 'filling') continue
    if ((await em.count(FillRunSchema, { plan: { orderLine: line.id } })) > 0) continue
    const request = FillPlanRequestSchema.safeParse(plan.request)
    const result = FillPlanResponseSchema.safeParse(plan.result)
    if (!request.success || !result.success || result.data.steps.length === 0) continue
    const volume = request.data.cylinder.waterVolume
    const volumeL = volume.unit === 'L' ? volume.value : volume.unit === 'm3' ? volume.value * 1000 : null
    if (volumeL === null) continue
    const finalGaugeBar = barOf(result.data.finalGaugePressure)
    const candidates = await em.find(
      CylinderSchema,
      {
        status: 'available',
        nextTestDate: { $gte: today },
        waterVolumeL: volumeL,
        servicePressureBar: { $gte: finalGaugeBar },
        ...(planNeedsOxygenClean(result.data) ? { oxygenClean: true } : {}),
      },
      { orderBy: { id: 'asc' } },
    )
    const planResidual = request.data.cylinder.residual?.kind ?? 'evacuated'
    const fitting = candidates.filter((c) => (c.residual?.kind ?? 'evacuated') === planResidual).slice(0, Math.min(RUNS_PER_PLAN, line.quantity))
    if (fitting.length === 0) continue
    const runs = await createRunsForPlan(
      em,
      actor,
      plan.id,
      fitting.map((c) => c.id),
      tech.id,
      today,
    )
    if (line.order.status === 'filling' && runs[0]) {
      // one fill already under way: its first step recorded on target at the fill temperature
      const run = await em.findOneOrFail(FillRunSchema, { id: runs[0].id }, { populate: ['cylinder'] as never })
      const state = readState(run.targets)
      const step = state.steps[0]
      em.create(FillReadingSchema, {
        run,
        stepIndex: 0,
        gas: step.gas,
        pressureBarAbs: step.cumulativeAbsBar,
        pressureBarGauge: step.cumulativeGaugeBar,
        temperatureC: celsiusOf(result.data.fillTemperature),
        scaleKg: null,
        outcome: 'on-target',
        supersedes: null,
        recordedById: tech.id,
        clientRequestId: `demo-seed-run-${run.id}-0`,
      })
      run.status = 'in-progress'
      run.startedAt = new Date()
      run.currentStep = 1
      run.cylinder.status = 'filling'
    }
    if (line.order.status === 'filling' && runs[1]) {
      // a second cylinder of that order finished earlier today: every step recorded on target, waiting for QA
      const run = await em.findOneOrFail(FillRunSchema, { id: runs[1].id }, { populate: ['cylinder'] as never })
      const state = readState(run.targets)
      state.steps.forEach((step, stepIndex) => {
        em.create(FillReadingSchema, {
          run,
          stepIndex,
          gas: step.gas,
          pressureBarAbs: step.cumulativeAbsBar,
          pressureBarGauge: step.cumulativeGaugeBar,
          temperatureC: celsiusOf(result.data.fillTemperature),
          scaleKg: null,
          outcome: 'on-target',
          supersedes: null,
          recordedById: tech.id,
          clientRequestId: `demo-seed-run-${run.id}-${stepIndex}`,
        })
      })
      const finishedAt = new Date(Date.now() - 2 * 3600_000)
      run.status = 'completed'
      run.startedAt = new Date(finishedAt.getTime() - 40 * 60_000)
      run.completedAt = finishedAt
      run.currentStep = state.steps.length
      run.cylinder.status = 'awaiting-analysis'
    }
    await em.flush()
  }
}

addSeedStep(async (em) => seedRuns(em))
