import { expect, type Page, test } from '@playwright/test'
import type { OrderDetail } from '#shared/schemas/order.ts'
import {
  Api,
  checkScreen,
  co2InNitrogen,
  customerByCode,
  invoicedOrder,
  moneyToMinor,
  PHONE,
  pdfTextOf,
  sendQuote,
  shot,
  signIn,
  uniqueTag,
} from './support.ts'

/**
 * The customer (Alderbank Environmental Laboratory, the demo customer account) on a laptop and on a phone: their
 * orders, a quote accepted, their certificates and invoices, and an open invoice paid on the payment provider's
 * page (the local fake) until it shows Paid after the provider's webhook. Each test makes its own quote and its own
 * order taken through the whole shop to an invoice.
 */

async function expectNoSideways(page: Page, where: string): Promise<void> {
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
  // soft: the journey goes on, and the test still fails at the end when something does
  expect.soft(overflow, `${where}: nothing runs off the side of the screen`).toBeLessThanOrEqual(0)
}

for (const device of [
  { name: 'laptop', viewport: { width: 1366, height: 900 } },
  { name: 'phone', viewport: PHONE },
]) {
  test.describe(`customer on a ${device.name}`, () => {
    test.use({ viewport: device.viewport })

    test(`customer (${device.name}): orders, accept a quote, certificates, invoices, pay`, async ({ page, baseURL }) => {
      test.setTimeout(150_000)
      const name = (step: string) => `customer-${device.name}-${step}`

      // ---- what the shop did for this customer (through the API) ----
      const sales = await Api.as(baseURL as string, 'sales')
      const alderbank = await customerByCode(sales, 'ALDB')
      const reference = `E2E answer ${uniqueTag()}`
      const quote = await sendQuote(sales, co2InNitrogen(alderbank.id, reference, 12, 2))
      expect(quote.status).toBe('quoted')
      const done = await invoicedOrder(baseURL as string, 'ALDB', device.name === 'phone' ? 6 : 8)
      expect(done.invoice.status).toBe('open')

      await signIn(page, 'customer')
      await expect(page.getByRole('heading', { level: 1, name: 'Your orders' })).toBeVisible()
      await checkScreen(page, name('01-home'))
      await expectNoSideways(page, 'home')

      // ---- my orders: the quote waits for an answer ----
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My orders' }).click()
      await expect(page).toHaveURL(/\/portal$/)
      const waiting = page.getByRole('region', { name: /Quotes for you to answer/ })
      const card = waiting.getByRole('link').filter({ hasText: reference })
      await expect(card).toBeVisible()
      await expect(card).toContainText('Quote waiting for your answer')
      await expect(card).toContainText('Quote sent')
      await checkScreen(page, name('02-orders'))
      await expectNoSideways(page, 'my orders')

      // ---- accept it ----
      await card.click()
      await expect(page).toHaveURL(new RegExp(`/portal/orders/${quote.id}$`))
      const answer = page.locator('section').filter({ has: page.getByRole('heading', { name: 'Your answer' }) })
      await expect(answer).toContainText('Quote total')
      expect(quote.totalMinor).toBeGreaterThan(0)
      expect(moneyToMinor((await answer.locator('strong').first().textContent()) ?? '')).toBe(quote.totalMinor)
      const quotePdf = await page.request.get((await page.getByRole('link', { name: 'Download the quote (PDF)' }).getAttribute('href')) ?? '')
      expect(await pdfTextOf(quotePdf)).toContain(quote.number)
      await checkScreen(page, name('03-quote'))
      await expectNoSideways(page, 'the quote')
      await page.getByRole('button', { name: 'Accept quote' }).click()
      await expect(page.getByRole('button', { name: 'Accept quote' })).toHaveCount(0)
      await expect(page.getByText('Accepted', { exact: true }).first()).toBeVisible()
      await checkScreen(page, name('04-quote-accepted'))
      expect((await sales.get<OrderDetail>(`/api/orders/${quote.id}`)).status).toBe('accepted')

      // ---- my certificates ----
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My certificates' }).click()
      await expect(page.getByRole('heading', { level: 1, name: 'Your certificates' })).toBeVisible()
      const download = page.getByRole('link', { name: `Download ${done.certificate.number} revision 1 (PDF, A4)` })
      await expect(download).toBeVisible()
      await checkScreen(page, name('05-certificates'))
      await expectNoSideways(page, 'my certificates')
      const certificate = await pdfTextOf(await page.request.get((await download.getAttribute('href')) ?? ''))
      expect(certificate).toContain(done.certificate.number)
      expect(certificate).toContain(done.serial)
      expect(certificate).toContain('Follow local codes')

      // ---- my invoices: pay the open one ----
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My invoices' }).click()
      await expect(page.getByRole('heading', { level: 1, name: 'Your invoices' })).toBeVisible()
      const row = page.getByRole('row').filter({ hasText: done.orderNumber })
      await expect(row).toContainText('Awaiting payment')
      expect(moneyToMinor((await row.locator('td').nth(1).textContent()) ?? '')).toBe(done.invoice.amountMinor)
      await checkScreen(page, name('06-invoices-open'))
      await expectNoSideways(page, 'my invoices')

      await row.getByRole('link', { name: /^Pay invoice/ }).click()
      await expect(page.getByRole('heading', { name: 'Test payment page' })).toBeVisible()
      await expect(page.getByText(done.invoice.number ?? 'FAKE-')).toBeVisible()
      await shot(page, name('07-payment-page'))
      await page.getByRole('button', { name: 'Pay with test card' }).click()

      await expect(page).toHaveURL(/\/portal\/invoices\?paid=/)
      await expect(page.getByRole('status').filter({ hasText: 'Your payment is being confirmed' })).toBeVisible()
      // the webhook marks it paid; the page looks again by itself
      await expect(row).toContainText('Paid', { timeout: 20_000 })
      await expect(row).not.toContainText('Awaiting payment')
      await expect(row.getByRole('link', { name: /^Pay invoice/ })).toHaveCount(0)
      await checkScreen(page, name('08-invoices-paid'))
      await expectNoSideways(page, 'my invoices after paying')
      expect((await sales.get<OrderDetail>(`/api/orders/${done.orderId}`)).status).toBe('paid')
      await sales.dispose()
    })
  })
}
