import { expect, test } from '@playwright/test'
import { Api, checkScreen, co2Analysis, completedRun, customerByCode, filledOrder, pdfTextOf, signIn, waitForMail } from './support.ts'

/**
 * QA at the desk: a filled cylinder in the awaiting-analysis queue, the analysis entered and compared with the
 * specification, the certificate previewed, released with the password re-entered (a wrong one refused), and
 * the certificate PDF downloaded with its cautions.
 */
test('qa: analysis of a filled cylinder, release with the password, certificate PDF', async ({ page, baseURL }) => {
  test.setTimeout(120_000)
  // a cylinder of the demo food-gas order (30 % CO2 in N2, ±5 %, U 5 %), filled on target through the API
  const filled = await completedRun(
    baseURL as string,
    { customer: 'Corvel Fresh Foods', description: /CO2/ },
    { waterVolumeL: 50, servicePressureBar: 200, testPressureBar: 300, material: 'steel', valveOutlet: 'DIN 477 No. 10', oxygenClean: false },
  )

  await signIn(page, 'qa')
  await expect(page.getByRole('heading', { level: 1, name: 'Analysis & release' })).toBeVisible()
  await checkScreen(page, 'qa-01-home')

  // ---- the awaiting-analysis queue ----
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Analysis & release' }).click()
  await expect(page).toHaveURL(/\/quality$/)
  const awaiting = page.getByRole('list', { name: 'Cylinders awaiting analysis' })
  const item = awaiting.getByRole('listitem').filter({ hasText: filled.serial })
  await expect(item).toBeVisible()
  await expect(item).toContainText(filled.orderNumber)
  await expect(item).toContainText('Not analysed yet')
  await checkScreen(page, 'qa-02-queue')

  // ---- the cylinder's workspace ----
  await item.getByRole('link', { name: filled.serial }).click()
  await expect(page).toHaveURL(new RegExp(`/quality/runs/${filled.runId}$`))
  await expect(page.getByRole('heading', { level: 1, name: `Cylinder ${filled.serial}` })).toBeVisible()
  // the hazard statement and cautions the certificate will print, on screen without a click
  const hazard = page.getByRole('region', { name: 'Hazard statement and cautions' })
  await expect(hazard).toBeVisible()
  await expect(hazard).toContainText('may explode if heated')
  await expect(hazard).toContainText('Follow local codes')
  const release = page.getByRole('form', { name: 'Release the certificate' })
  await expect(release.getByRole('button', { name: 'Sign and release certificate' })).toBeDisabled()
  await expect(release).toContainText('Enter the analysis first.')
  await checkScreen(page, 'qa-03-run-before-analysis')

  // ---- enter the analysis ----
  const analysis = page.getByRole('form', { name: 'Analysis results' })
  await analysis.getByLabel('Analysed value, CO2').fill('30.4')
  await expect(analysis.getByLabel('Unit', { exact: true })).toHaveValue('percent')
  await analysis.getByLabel('Expanded uncertainty U (±, same unit)').fill('0.6')
  await expect(analysis.getByLabel('Coverage factor k')).toHaveValue('2')
  await analysis.getByLabel('Instrument', { exact: true }).fill('NDIR bench analyser 2')
  await analysis.getByLabel('Analytical method').fill('NDIR, two-point bracketing')
  await analysis.getByRole('button', { name: 'Save and compare' }).click()
  await expect(page.getByText('Within specification').first()).toBeVisible()
  const comparison = page.getByRole('table', { name: /Analysed values compared with the specification/ })
  const co2 = comparison.getByRole('row').filter({ has: page.getByRole('rowheader', { name: /CO2/ }) })
  // (30.4 − 30) / 30 = +1.33 % of the ±5 % tolerance
  await expect(co2).toContainText('1.33')
  await expect(co2).toContainText('within ±5 %')
  await checkScreen(page, 'qa-04-analysis-within')

  // the draft certificate as it would be released now
  const preview = await page.request.get((await release.getByRole('link', { name: /Preview the certificate/ }).getAttribute('href')) ?? '')
  const previewText = await pdfTextOf(preview)
  expect(previewText).toContain('DRAFT')
  expect(previewText).toContain(filled.serial)

  // ---- release: a wrong password is refused, the right one signs ----
  const password = release.getByLabel('Your password (signature)')
  await password.fill('not-my-password')
  await release.getByRole('button', { name: 'Sign and release certificate' }).click()
  await expect(release.getByRole('alert').filter({ hasText: 'not your password' })).toBeVisible()
  await expect(password).toHaveValue('')
  await checkScreen(page, 'qa-05-release-refused')
  const qaApi = await Api.as(baseURL as string, 'qa')
  expect((await qaApi.get<{ certificates: unknown[] }>(`/api/quality/runs/${filled.runId}`)).certificates).toHaveLength(0)

  await password.fill('fillwright-demo')
  await release.getByRole('button', { name: 'Sign and release certificate' }).click()
  const notice = page.getByRole('status').filter({ hasText: 'Released' })
  await expect(notice).toBeVisible()
  await expect(notice).toContainText('revision 1, signed')
  await expect(notice).toContainText('e-mailed to the customer')
  const certificateNumber = ((await notice.locator('strong').first().textContent()) ?? '').trim()
  expect(certificateNumber.length).toBeGreaterThan(3)
  await checkScreen(page, 'qa-06-released')

  // ---- the certificate PDF ----
  const href = (await notice.getByRole('link', { name: 'Download the PDF' }).getAttribute('href')) ?? ''
  expect(href).toMatch(/^\/api\/certificates\/\d+\/pdf/)
  const text = await pdfTextOf(await page.request.get(href))
  expect(text).toContain(certificateNumber)
  expect(text).toContain(filled.serial)
  expect(text).not.toContain('DRAFT')
  expect(text).toContain('30.4')
  expect(text).toContain('Ruth Ashdown')
  // the cautions on paper, deferring to local codes and licensed practice
  expect(text).toContain('Hazard statement and cautions')
  expect(text).toContain('may explode if heated')
  expect(text).toContain('Follow local codes, the cylinder markings and label, the safety data sheet and licensed practice')

  // the customer's contact got it by e-mail
  const sales = await Api.as(baseURL as string, 'sales')
  const corvel = await customerByCode(sales, 'CRVF')
  await sales.dispose()
  const mail = await waitForMail(
    (m) => m.to.includes(corvel.contactEmail) && m.subject.includes(certificateNumber),
    `certificate ${certificateNumber} for ${corvel.contactEmail}`,
  )
  expect(mail.attachments.some((a) => a.contentType === 'application/pdf')).toBe(true)

  // ---- gone from the queue, listed with the certificates ----
  await page.getByRole('link', { name: 'Back to the queue' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Analysis & release' })).toBeVisible()
  await expect(page.getByRole('list', { name: 'Cylinders awaiting analysis' }).getByText(filled.serial)).toHaveCount(0)
  await expect(page.getByRole('list', { name: 'Analyses ready to release' }).getByText(filled.serial)).toHaveCount(0)
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Certificates' }).click()
  await expect(page.getByText(certificateNumber).first()).toBeVisible()
  await checkScreen(page, 'qa-07-certificates')
  await qaApi.dispose()
})

/**
 * The release conditions QA is offered come from the plan (the lowest condensation-free temperature). For a lean
 * CO2 mixture that temperature is very low; the proposed conditions must still be ones the release accepts.
 */
test('qa: a lean CO2 calibration cylinder is released with the conditions the desk proposes', async ({ page, baseURL }) => {
  test.setTimeout(120_000)
  const filled = await filledOrder(baseURL as string, 'DNMR', 4)
  await signIn(page, 'qa')
  await page.goto(`/quality/runs/${filled.runId}`)
  await expect(page.getByRole('heading', { level: 1, name: `Cylinder ${filled.serial}` })).toBeVisible()
  const analysis = page.getByRole('form', { name: 'Analysis results' })
  const entered = co2Analysis(4).results[0]
  await analysis.getByLabel('Analysed value, CO2').fill(String(entered.value))
  await analysis.getByLabel('Expanded uncertainty U (±, same unit)').fill(String(entered.expandedUncertainty))
  await analysis.getByLabel('Instrument', { exact: true }).fill(entered.instrument)
  await analysis.getByLabel('Analytical method').fill(entered.method)
  await analysis.getByRole('button', { name: 'Save and compare' }).click()
  await expect(page.getByText('Within specification').first()).toBeVisible()

  const release = page.getByRole('form', { name: 'Release the certificate' })
  const storageFrom = release.getByLabel('Store and use from (°C)')
  const proposed = Number(await storageFrom.inputValue())
  await release.getByLabel('Your password (signature)').fill('fillwright-demo')
  await release.getByRole('button', { name: 'Sign and release certificate' }).click()
  await checkScreen(page, 'qa-08-lean-co2-release')
  await expect(page.getByRole('status').filter({ hasText: 'Released' }), `released with the proposed lower storage temperature ${proposed} °C`).toBeVisible()
})
