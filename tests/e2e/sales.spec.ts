import { expect, test } from '@playwright/test'
import { Api, checkScreen, customerByCode, moneyToMinor, signIn, uniqueTag, waitForMail } from './support.ts'

/**
 * The sales desk's day: the orders table (filter, sort, paging), a new quote priced as it is typed and sent to
 * the customer by e-mail, and the price book with its reference conditions.
 */
test('sales: orders table, a quote priced as it is typed and sent, the price book', async ({ page, baseURL }) => {
  test.setTimeout(120_000)
  await signIn(page, 'sales')
  await expect(page.getByRole('heading', { level: 1, name: 'Sales desk' })).toBeVisible()
  await checkScreen(page, 'sales-01-home')

  // ---- the orders table ----
  await page.getByRole('link', { name: 'Orders', exact: true }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Orders' })).toBeVisible()
  const table = page.getByRole('table')
  const rows = table.locator('tbody tr')
  await expect(rows.first()).toBeVisible()
  await checkScreen(page, 'sales-02-orders')

  // filter by one status: every row left carries it
  const statusFilter = page.getByRole('group', { name: 'Status' })
  await statusFilter.getByRole('button', { name: 'Quote sent', exact: true }).click()
  await expect(page).toHaveURL(/status=quoted/)
  await expect(statusFilter.getByRole('button', { name: 'Quote sent', exact: true })).toHaveAttribute('aria-pressed', 'true')
  await expect(table).toHaveAttribute('aria-busy', 'false')
  const quotedCount = await rows.count()
  expect(quotedCount).toBeGreaterThan(0)
  for (let i = 0; i < quotedCount; i++) await expect(rows.nth(i).locator('td').nth(6)).toHaveText('Quote sent')
  await checkScreen(page, 'sales-03-orders-quoted')
  await statusFilter.getByRole('button', { name: 'All', exact: true }).click()
  await expect(page).not.toHaveURL(/status=/)

  // sort by total, highest first, then lowest first
  const totals = async () => (await rows.locator('td:nth-child(8)').allTextContents()).map(moneyToMinor)
  await table.getByRole('button', { name: 'Total' }).click()
  await expect(page).toHaveURL(/sort=-total/)
  await expect(table.getByRole('columnheader', { name: 'Total' })).toHaveAttribute('aria-sort', 'descending')
  await expect(table).toHaveAttribute('aria-busy', 'false')
  const desc = await totals()
  expect(desc.length).toBeGreaterThan(1)
  expect(desc).toEqual([...desc].sort((a, b) => b - a))
  await table.getByRole('button', { name: 'Total' }).click()
  await expect(page).toHaveURL(/sort=total/)
  await expect(table.getByRole('columnheader', { name: 'Total' })).toHaveAttribute('aria-sort', 'ascending')
  await expect(table).toHaveAttribute('aria-busy', 'false')
  const asc = await totals()
  expect(asc).toEqual([...asc].sort((a, b) => a - b))
  expect(asc).toEqual([...desc].reverse())
  await checkScreen(page, 'sales-04-orders-by-total')

  // paging: the count says how many there are; a next page exists exactly when there are more than one page holds
  const range = page.getByText(/^\d+–\d+ of [\d,]+$/)
  const [, first, last, total] = (await range.textContent())?.match(/^(\d+)–(\d+) of ([\d,]+)$/) ?? []
  expect(Number(first)).toBe(1)
  expect(Number(last)).toBe(await rows.count())
  const next = page.getByRole('button', { name: 'Next page' })
  if (Number(total.replace(/,/g, '')) > Number(last)) {
    await next.click()
    await expect(range).toHaveText(new RegExp(`^${Number(last) + 1}–`))
    await checkScreen(page, 'sales-05-orders-page-2')
    await page.getByRole('button', { name: 'Previous page' }).click()
    await expect(range).toHaveText(/^1–/)
  } else {
    await expect(next).toBeDisabled()
    await expect(page.getByRole('button', { name: 'Previous page' })).toBeDisabled()
  }

  // ---- a new quote ----
  const api = await Api.as(baseURL as string, 'sales')
  const customer = await customerByCode(api, 'DNMR')
  await api.dispose()
  const reference = `E2E quote ${uniqueTag()}`
  await page.getByRole('link', { name: 'New specification' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'New specification' })).toBeVisible()
  const price = page.getByRole('region', { name: 'Price' })
  await expect(price).toContainText('Total so far')
  await checkScreen(page, 'sales-06-quote-empty')

  await page.getByLabel('Customer', { exact: true }).selectOption(String(customer.id))
  await page.getByLabel('Customer reference').fill(reference)
  await page.getByLabel('Mixture 1, component 1: gas').selectOption('carbon-dioxide')
  await page.getByLabel('Mixture 1, component 1: amount').fill('18')
  await page.getByLabel('Mixture 1, component 1: unit').selectOption('percent')
  await page.getByLabel('Balance gas').selectOption('argon')
  await page.getByLabel('Cylinder water volume, L').fill('50')
  await page.getByLabel(/^Fill pressure, bar gauge at 15 °C/).fill('200')
  await page.getByLabel('Blend tolerance, % relative').fill('10')
  await page.getByLabel('Certification uncertainty, % relative (k = 2)').fill('10')
  await page.getByLabel('Valve outlet').fill('DIN 477 No. 10')
  await page.getByLabel('Number of cylinders').fill('1')

  // one cylinder priced: "1 × €X = €X", and the big total says the same
  const lineTotal = price.getByText(/^\d+ × .+ = .+$/)
  await expect(lineTotal).toHaveText(/^1 × /)
  await expect(price).toContainText('Total, excl. VAT and transport')
  const [, one] = (await lineTotal.textContent())?.match(/^1 × (.+) = (.+)$/) ?? []
  const perCylinder = moneyToMinor(one)
  expect(perCylinder).toBeGreaterThan(0)
  const bigTotal = price.locator('p[aria-live="polite"]')
  expect(moneyToMinor((await bigTotal.textContent()) ?? '')).toBe(perCylinder)

  // typing a new quantity adds the price up at once
  await page.getByLabel('Number of cylinders').fill('3')
  await expect(lineTotal).toHaveText(/^3 × /)
  const [, each, sum] = (await lineTotal.textContent())?.match(/^3 × (.+) = (.+)$/) ?? []
  expect(moneyToMinor(each)).toBe(perCylinder)
  expect(moneyToMinor(sum)).toBe(3 * perCylinder)
  await expect.poll(async () => moneyToMinor((await bigTotal.textContent()) ?? '')).toBe(3 * perCylinder)
  await checkScreen(page, 'sales-07-quote-priced')

  // ---- send it ----
  await page.getByRole('button', { name: 'Save and send quote' }).click()
  await expect(page).toHaveURL(/\/orders\/\d+$/)
  const number = (await page.getByRole('heading', { level: 1 }).textContent())?.trim() ?? ''
  expect(number).toMatch(/^FW-\d{4}-\d{5}$/)
  await expect(page.getByText('Quote sent', { exact: true }).first()).toBeVisible()
  await expect(page.getByText(`ref. ${reference}`)).toBeVisible()
  // the server prices again when it saves: the same total
  const quoteCard = page.locator('dl').filter({ hasText: 'Total (excl. VAT, transport)' })
  expect(moneyToMinor((await quoteCard.locator('dd').first().textContent()) ?? '')).toBe(3 * perCylinder)
  await expect(quoteCard).not.toContainText('not yet')
  await checkScreen(page, 'sales-08-quote-sent')

  const mail = await waitForMail((m) => m.to.includes(customer.contactEmail) && m.subject.includes(number), `the quote ${number} for ${customer.contactEmail}`)
  expect(mail.subject).toContain(`Quote ${number}`)
  expect(mail.attachments.some((a) => a.contentType === 'application/pdf' && a.size > 1000)).toBe(true)

  // the quote PDF behind the link
  const pdf = await page.request.get(
    await page
      .getByRole('link', { name: 'Quote PDF' })
      .getAttribute('href')
      .then((h) => h ?? ''),
  )
  expect(pdf.status()).toBe(200)
  expect(pdf.headers()['content-type']).toContain('application/pdf')
  expect((await pdf.body()).subarray(0, 5).toString('latin1')).toBe('%PDF-')

  // the new order is in the table under its status
  await page.getByRole('link', { name: 'Orders', exact: true }).click()
  await page.getByLabel('Search number, company or reference').fill(number)
  await expect(page).toHaveURL(new RegExp(`q=${number}`))
  await expect(rows).toHaveCount(1)
  await expect(rows.first()).toContainText(reference)
  await expect(rows.first().locator('td').nth(6)).toHaveText('Quote sent')

  // ---- the price book ----
  await page.getByRole('link', { name: 'Price book' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Price book' })).toBeVisible()
  await expect(page.getByText('Gas per m³ is always at 15 °C, 101.325 kPa', { exact: false })).toBeVisible()
  const gasPrices = page.getByRole('table', { name: 'Gases' })
  await expect(gasPrices.getByRole('rowheader', { name: 'Ar (Argon)' })).toBeVisible()
  await expect(gasPrices.getByLabel('Label for Ar (Argon)')).toHaveValue('Argon 5.0')
  // the unit of a gas priced by volume states its reference conditions
  const argonUnit = gasPrices.getByLabel('Unit for Ar (Argon)')
  await expect(argonUnit).toHaveValue('m3-15C')
  await expect(argonUnit.locator('option:checked')).toHaveText('per m³ at 15 °C, 101.325 kPa')
  expect(moneyToMinor(await gasPrices.getByLabel('Price for Ar (Argon), EUR').inputValue())).toBeGreaterThan(0)
  await checkScreen(page, 'sales-09-price-book')
})
