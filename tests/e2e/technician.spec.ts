import { expect, type Locator, type Page, test } from '@playwright/test'
import type { RunDetail } from '#shared/schemas/run.ts'
import { Api, approvedPlan, bookRun, checkScreen, createCylinder, PHONE, signIn, TABLET } from './support.ts'

/**
 * The technician at the manifold, on the bench tablet and on a phone: "My fills today", a fill opened by scanning
 * its cylinder's barcode, a reading recorded with the big numeric input, the reading and the next step still there
 * after a reload, pause and resume, and the step's cautions on screen.
 */

/** A fresh cylinder booked for the demo technician today on the demo food-gas plan (CO2 in N2, 50 L). */
async function bookFreshFill(baseURL: string): Promise<{ runId: number; serial: string; barcode: string }> {
  const blender = await Api.as(baseURL, 'blender')
  const technician = await Api.as(baseURL, 'technician')
  try {
    const plan = await approvedPlan(blender, { customer: 'Corvel Fresh Foods', description: /CO2/ })
    const cylinder = await createCylinder(blender, {
      waterVolumeL: 50,
      servicePressureBar: 200,
      testPressureBar: 300,
      material: 'steel',
      valveOutlet: 'DIN 477 No. 10',
      oxygenClean: false,
    })
    const run = await bookRun(blender, plan.id, cylinder.id, technician.user.id)
    return { runId: run.id, serial: cylinder.serial, barcode: cylinder.barcode }
  } finally {
    await blender.dispose()
    await technician.dispose()
  }
}

async function expectTouchTarget(locator: Locator, what: string): Promise<void> {
  const box = await locator.boundingBox()
  expect(box, `${what} is on screen`).not.toBeNull()
  expect(box?.height ?? 0, `${what} is at least 48 px tall`).toBeGreaterThanOrEqual(48)
}

async function expectNoSideways(page: Page, where: string): Promise<void> {
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
  // soft: the journey goes on, and the test still fails at the end when something does
  expect.soft(overflow, `${where}: nothing runs off the side of the screen`).toBeLessThanOrEqual(0)
}

for (const device of [
  { name: 'tablet', viewport: TABLET },
  { name: 'phone', viewport: PHONE },
]) {
  test.describe(`technician on a ${device.name}`, () => {
    test.use({ viewport: device.viewport })

    test(`technician (${device.name}): scan, record, reload, pause and resume`, async ({ page, baseURL }) => {
      test.setTimeout(120_000)
      const fill = await bookFreshFill(baseURL as string)
      const shotName = (step: string) => `technician-${device.name}-${step}`

      await signIn(page, 'technician')
      await expect(page.getByRole('heading', { level: 1, name: 'Manifold' })).toBeVisible()
      await checkScreen(page, shotName('01-home'))

      // ---- my fills today ----
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My fills' }).click()
      await expect(page.getByRole('heading', { level: 1, name: 'My fills today' })).toBeVisible()
      const fills = page.getByRole('list', { name: 'My fills' })
      const mine = fills.getByRole('link').filter({ hasText: fill.serial })
      await expect(mine).toBeVisible()
      await expect(mine).toContainText('Not started')
      await checkScreen(page, shotName('02-my-fills'))
      await expectNoSideways(page, 'my fills')

      // ---- open the fill by typing its barcode into the scanner field, then Enter ----
      const scan = page.getByLabel('Scan or type a cylinder barcode')
      await expect(scan).toBeFocused()
      await expectTouchTarget(scan, 'the scanner field')
      await scan.pressSequentially(fill.barcode)
      await scan.press('Enter')
      await expect(page).toHaveURL(new RegExp(`/runs/${fill.runId}$`))
      await expect(page.getByRole('heading', { level: 1, name: fill.serial })).toBeVisible()

      const technician = await Api.as(baseURL as string, 'technician')
      const before = await technician.get<RunDetail>(`/api/runs/${fill.runId}`)
      expect(before.currentStep).toBe(0)
      expect(before.stepCount).toBeGreaterThan(1)
      const n = before.stepCount
      await expect(page.getByText(`Step 1 of ${n}`)).toBeVisible()

      // the step's cautions are on screen, in words, deferring to local codes and licensed practice
      const cautions = page.getByRole('list', { name: 'Cautions for this step' })
      await expect(cautions).toBeVisible()
      await expect(cautions.getByRole('listitem').first()).toContainText('Caution — High pressure')
      await expect(cautions).toContainText('Follow local codes')
      await expect(cautions).toContainText('licensed practice')

      // the target, huge, in bar gauge
      const step = page.getByRole('region', { name: new RegExp(before.steps[0].formula ?? before.steps[0].label) })
      await expect(step).toContainText('Fill to')
      const target = step.locator('[aria-live="polite"] span').first()
      const targetText = ((await target.textContent()) ?? '').trim()
      expect(Number(targetText)).toBeCloseTo(before.steps[0].cumulativeGaugePressure.value, 1)
      await expect(step).toContainText('bar g')
      await checkScreen(page, shotName('03-run-step-1'))
      await expectNoSideways(page, 'the fill screen')

      // ---- record a reading on the current step with the big numeric input ----
      const gauge = page.getByLabel(/^Gauge reading \(bar g\)/)
      await expect(gauge).toHaveAttribute('inputmode', 'decimal')
      await expectTouchTarget(gauge, 'the gauge reading input')
      const record = page.getByRole('button', { name: 'Record reading' })
      await expectTouchTarget(record, 'the Record reading button')
      await expectTouchTarget(page.getByRole('button', { name: 'Pause' }), 'the Pause button')
      await expect(page.getByLabel(/^Cylinder temperature/)).toHaveValue(before.fillTemperature.value.toFixed(1))
      await gauge.fill(targetText)
      await record.click()
      await expect(page.getByRole('status').filter({ hasText: 'In window' })).toContainText('step 1 is done')
      await expect(page.getByText(`Step 2 of ${n}`)).toBeVisible()
      await checkScreen(page, shotName('04-run-recorded'))

      // ---- reload: the reading is kept and the step has moved on ----
      await page.reload()
      await expect(page.getByRole('heading', { level: 1, name: fill.serial })).toBeVisible()
      await expect(page.getByText(`Step 2 of ${n}`)).toBeVisible()
      await expect(page.getByText(`1/${n} done`)).toBeVisible()
      await expect(page.getByRole('progressbar', { name: 'Steps done' })).toHaveAttribute('aria-valuenow', '1')
      await page.getByText('Readings (1)').click()
      const readingRow = page.getByRole('listitem').filter({ hasText: 'Step 1' }).filter({ hasText: 'In window' })
      await expect(readingRow).toBeVisible()
      await expect(readingRow).toContainText(`${targetText} bar g`)
      await expect(cautions).toBeVisible()
      await checkScreen(page, shotName('05-run-after-reload'))
      const after = await technician.get<RunDetail>(`/api/runs/${fill.runId}`)
      expect(after.currentStep).toBe(1)
      expect(after.readings).toHaveLength(1)
      expect(after.readings[0].outcome).toBe('on-target')

      // ---- pause, reload, resume ----
      await page.getByRole('button', { name: 'Pause' }).click()
      await expect(page.getByText('Paused', { exact: true })).toBeVisible()
      await expect(page.getByRole('button', { name: 'Record reading' })).toHaveCount(0)
      await page.reload()
      await expect(page.getByText('Paused', { exact: true })).toBeVisible()
      await expect(page.getByText('Nothing is lost: every reading is saved.', { exact: false })).toBeVisible()
      await checkScreen(page, shotName('06-run-paused'))
      const resume = page.getByRole('button', { name: 'Resume' })
      await expectTouchTarget(resume, 'the Resume button')
      await resume.click()
      await expect(page.getByRole('button', { name: 'Record reading' })).toBeVisible()
      await expect(page.getByText(`Step 2 of ${n}`)).toBeVisible()
      await expect(cautions).toBeVisible()
      await expect(cautions).toContainText('Follow local codes')
      await checkScreen(page, shotName('07-run-resumed'))
      expect((await technician.get<RunDetail>(`/api/runs/${fill.runId}`)).status).toBe('in-progress')

      // ---- back on the list the fill shows where it stands ----
      await page.getByRole('link', { name: 'My fills' }).first().click()
      await expect(fills.getByRole('link').filter({ hasText: fill.serial })).toContainText(`step 2/${n}`)
      await technician.dispose()
    })
  })
}
