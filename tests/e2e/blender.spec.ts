import { expect, type Page, test } from '@playwright/test'
import type { OrderDetail, OrderInput } from '#shared/schemas/order.ts'
import { Api, checkScreen, customerByCode, moveOrder, pdfTextOf, sendQuote, signIn, uniqueTag } from './support.ts'

/**
 * The blender at the workstation: the state calculator (Ar/CO2 82/18 at 200 bar under all five models, side by
 * side, with Z), the gas library search, then the plan of an accepted order line (steps, cautions and findings,
 * approval, fill sheet PDF) and a second line whose plan is blocked, with the reason next to the disabled button.
 */

const MODELS = ['Ideal gas', 'van der Waals', 'Soave–Redlich–Kwong', 'Peng–Robinson', 'GERG-2008']

function line(overrides: Partial<OrderInput['lines'][number]>): OrderInput['lines'][number] {
  return {
    description: '',
    components: [{ gas: 'carbon-dioxide', amount: 18, unit: 'percent' }],
    balanceGas: 'argon',
    blendTolerancePct: 10,
    certificationUncertaintyPct: 10,
    waterVolumeL: 50,
    valveOutlet: 'DIN 477 No. 10',
    quantity: 1,
    finalPressureBarGauge: 200,
    method: 'partial-pressure',
    ...overrides,
  }
}

/** An order the customer accepted, so its line waits in the blender's queue. */
async function acceptedOrder(sales: Api, customerCode: string, reference: string, orderLine: OrderInput['lines'][number]): Promise<OrderDetail> {
  const customer = await customerByCode(sales, customerCode)
  const quoted = await sendQuote(sales, { customerId: customer.id, reference, neededBy: null, rentalDays: 30, notes: '', lines: [orderLine] })
  return moveOrder(sales, quoted.id, 'accepted')
}

async function openLinePlan(page: Page, order: OrderDetail): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My queue' }).click()
  const queue = page.locator('section').filter({ has: page.getByRole('heading', { name: 'Orders needing a fill plan' }) })
  const entry = queue.getByRole('listitem').filter({ hasText: order.number })
  await expect(entry).toContainText('No plan')
  await entry.getByRole('link', { name: 'Plan line 1' }).click()
  await expect(page).toHaveURL(new RegExp(`/plans/new\\?orderLineId=${order.lines[0].id}$`))
  await expect(page.getByRole('heading', { level: 1, name: 'New fill plan' })).toBeVisible()
  await expect(page.getByText(`${order.number} line 1`)).toBeVisible()
}

test('blender: state calculator, gas library, a plan approved and printed, a blocked plan explained', async ({ page, baseURL }) => {
  test.setTimeout(180_000)
  const sales = await Api.as(baseURL as string, 'sales')
  const tag = uniqueTag()
  const welding = await acceptedOrder(sales, 'BRWS', `E2E welding ${tag}`, line({}))
  // hydrogen in air: fuel and oxidiser together inside the flammable range
  const hazardous = await acceptedOrder(
    sales,
    'BRWS',
    `E2E cutting trial ${tag}`,
    line({ components: [{ gas: 'hydrogen', amount: 10, unit: 'percent' }], balanceGas: 'air', finalPressureBarGauge: 150, valveOutlet: 'DIN 477 No. 1' }),
  )

  await signIn(page, 'blender')
  await expect(page.getByRole('heading', { level: 1, name: 'Blending bench' })).toBeVisible()
  await expect(page.getByText(welding.number).first()).toBeVisible()
  await checkScreen(page, 'blender-01-home')

  // ---- the state calculator ----
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'State calculator' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'State calculator' })).toBeVisible()
  await page.getByLabel('Gas 1', { exact: true }).selectOption('argon')
  await page.getByLabel('Amount of gas 1').fill('82')
  await page.getByLabel('Gas 2', { exact: true }).selectOption('carbon-dioxide')
  await page.getByLabel('Amount of gas 2').fill('18')
  await page.getByLabel('Gas temperature').fill('15')
  const pressure = page.getByLabel('Pressure', { exact: true })
  // an incomplete state shows no results, only what to fix
  await pressure.fill('')
  await expect(page.getByText('Fix the highlighted fields')).toBeVisible()
  await pressure.fill('200')
  await page.getByLabel('Gauge or absolute').selectOption('gauge')
  await expect(page.getByText('Evaluated at 15.0 °C and 201.01 bar absolute.', { exact: true })).toBeVisible()
  const results = page.getByRole('table', { name: 'Results of every equation of state at the given state' })
  await expect(results).toBeVisible()
  for (const model of MODELS) await expect(results.getByRole('columnheader', { name: model })).toBeVisible()
  const zRow = results.getByRole('row').filter({ has: page.getByRole('rowheader', { name: 'Compressibility factor Z' }) })
  const z = (await zRow.getByRole('cell').allTextContents()).map(Number)
  expect(z).toHaveLength(5)
  // the ideal gas has Z = 1 by definition; at 200 bar the real-gas models put this mixture a few per cent below it
  expect(z[0]).toBe(1)
  for (const value of z.slice(1)) {
    expect(value).toBeGreaterThan(0.8)
    expect(value).toBeLessThan(0.99)
  }
  // the models differ, and each one's difference from GERG-2008 is said beside it, in per cent of the GERG value
  expect(new Set(z.slice(1)).size).toBeGreaterThan(1)
  const deviationRow = results.getByRole('row').filter({ has: page.getByRole('rowheader', { name: 'Z compared with GERG-2008' }) })
  const deviations = await deviationRow.getByRole('cell').allTextContents()
  expect(deviations).toHaveLength(5)
  for (const i of [0, 1, 2, 3]) {
    const shown = Number(deviations[i].replace('−', '-').replace(/[^\d.+-]/g, ''))
    expect(shown).toBeCloseTo(((z[i] - z[4]) / z[4]) * 100, 1)
  }
  const cautions = page.getByRole('region', { name: 'Cautions' })
  await expect(cautions).toContainText('High pressure')
  await expect(cautions).toContainText('Follow local codes')
  await checkScreen(page, 'blender-02-calculator')

  // ---- the gas library ----
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Gas library' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Gas library' })).toBeVisible()
  const gasTable = page.getByRole('table', { name: /Gas library/ })
  const heading = page.getByRole('heading', { name: /^\d+ of \d+ gases$/ })
  await expect(heading).toBeVisible()
  const total = Number(((await heading.textContent()) ?? '').match(/of (\d+) gases/)?.[1])
  expect(total).toBeGreaterThan(10)
  await expect(gasTable.locator('tbody tr')).toHaveCount(total)
  await page.getByLabel('Search by name, formula, CAS number or hazard').fill('toxic')
  await expect.poll(() => gasTable.locator('tbody tr').count()).toBeLessThan(total)
  await expect(heading).toHaveText(`${await gasTable.locator('tbody tr').count()} of ${total} gases`)
  const toxicHazards = await gasTable.locator('tbody tr td:nth-of-type(5)').allTextContents()
  expect(toxicHazards.length).toBeGreaterThan(0)
  for (const h of toxicHazards) expect(h).toContain('toxic')
  await page.getByLabel('Search by name, formula, CAS number or hazard').fill('124-38-9')
  await expect(gasTable.locator('tbody tr')).toHaveCount(1)
  await gasTable.getByRole('button', { name: /Carbon dioxide/ }).click()
  await expect(page.getByRole('heading', { level: 2, name: /Carbon dioxide/ })).toBeVisible()
  // critical temperature of CO2: 304.13 K (published critical constants)
  await expect(gasTable.locator('tbody tr td').nth(1)).toHaveText(/^304\.1/)
  await expect(page.getByRole('heading', { level: 3, name: 'Sources' })).toBeVisible()
  await checkScreen(page, 'blender-03-gas-library')

  // ---- the plan of the welding-gas line: steps, cautions, approval, fill sheet ----
  await openLinePlan(page, welding)
  await expect(page.getByRole('table', { name: /Cumulative targets at the fill temperature/ })).toBeVisible()
  // with the default coldest temperature (−20 °C) the CO2 is screened for condensation, and the preview says so at the step
  await expect(page.getByText(/\d+ blocking findings?/)).toBeVisible()
  await expect(page.getByRole('list', { name: /^Findings for step \d+$/ }).first()).toContainText('condensation')
  await checkScreen(page, 'blender-04-plan-new-cold')
  // this shop stores and ships the welding gas indoors: never below 10 °C
  await page.getByLabel(/^Coldest the cylinder will get/).fill('10')
  await expect(page.getByText('No blocking finding')).toBeVisible()
  await checkScreen(page, 'blender-05-plan-new-indoors')
  await page.getByRole('button', { name: 'Save plan for approval' }).click()
  await expect(page).toHaveURL(/\/plans\/\d+$/)
  const planId = Number(new URL(page.url()).pathname.split('/').pop())
  await expect(page.getByRole('heading', { level: 1, name: `Fill plan ${welding.number} · line 1 · v1` })).toBeVisible()
  const steps = page.getByRole('table', { name: /Cumulative targets at the fill temperature/ })
  const stepRows = steps.locator('tbody tr').filter({ has: page.getByRole('rowheader') })
  expect(await stepRows.count()).toBeGreaterThanOrEqual(2)
  await expect(steps).toContainText('CO2')
  await expect(steps).toContainText('Ar')
  const planCautions = page.getByRole('region', { name: 'Cautions' })
  await expect(planCautions).toContainText('High pressure')
  await expect(planCautions).toContainText('Follow local codes')
  await expect(page.getByText('No blocking finding')).toBeVisible()
  await expect(page.getByText('Awaiting approval').first()).toBeVisible()
  await checkScreen(page, 'blender-06-plan-draft')

  const draftSheet = await pdfTextOf(await page.request.get(`/api/plans/${planId}/fill-sheet.pdf`))
  expect(draftSheet).toMatch(/not approved: do not fill from this sheet/i)

  await page.getByRole('button', { name: 'Approve for filling' }).click()
  await expect(page.getByText('Approved for filling').first()).toBeVisible()
  await expect(page.getByRole('button', { name: 'Approve for filling' })).toHaveCount(0)
  await checkScreen(page, 'blender-07-plan-approved')
  expect((await sales.get<OrderDetail>(`/api/orders/${welding.id}`)).status).toBe('planned')

  const sheetLink = page.getByRole('link', { name: 'Fill sheet (A4, PDF)' })
  const sheet = await pdfTextOf(await page.request.get((await sheetLink.getAttribute('href')) ?? ''))
  expect(sheet).toContain(welding.number)
  expect(sheet).not.toMatch(/do not fill from this sheet/i)
  expect(sheet).toMatch(/cautions/i)
  expect(sheet).toContain('Follow local codes')
  const letter = await page.request.get(`/api/plans/${planId}/fill-sheet.pdf?size=LETTER`)
  expect(await pdfTextOf(letter)).toContain(welding.number)

  // ---- the hydrogen-in-air line: blocked, and the reason stands next to the disabled button ----
  await openLinePlan(page, hazardous)
  await page.getByRole('button', { name: 'Save plan for approval' }).click()
  await expect(page).toHaveURL(/\/plans\/\d+$/)
  const blockedId = Number(new URL(page.url()).pathname.split('/').pop())
  await expect(page.getByRole('heading', { level: 1, name: `Fill plan ${hazardous.number} · line 1 · v1` })).toBeVisible()
  const approve = page.getByRole('button', { name: 'Approve for filling' })
  await expect(approve).toBeDisabled()
  const reason = page.getByText(/^Cannot be approved: /)
  await expect(reason).toBeVisible()
  await expect(approve).toHaveAccessibleDescription(/Cannot be approved: .+/)
  await expect(page.getByText(/\d+ blocking findings?/)).toBeVisible()
  await expect(page.getByRole('region', { name: 'Cautions' })).toContainText('Flammable')
  await checkScreen(page, 'blender-08-plan-blocked')
  const blockedSheet = await pdfTextOf(await page.request.get(`/api/plans/${blockedId}/fill-sheet.pdf`))
  expect(blockedSheet).toMatch(/not approved: do not fill from this sheet/i)
  expect(blockedSheet).toMatch(/a blocking finding stands/i)
  expect((await sales.get<OrderDetail>(`/api/orders/${hazardous.id}`)).status).toBe('accepted')
  await sales.dispose()
})
