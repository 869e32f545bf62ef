import { expect, test } from '@playwright/test'
import { checkScreen, signIn, uniqueTag } from './support.ts'

/**
 * The shop manager: the accounts page, a new customer account for one of the demo customers (a too-short first
 * password refused first), the audit trail recording it, and the new person signing in to their own orders only.
 */
test('admin: accounts, a new customer account, the audit trail, the new account signs in', async ({ page }) => {
  test.setTimeout(90_000)
  const tag = uniqueTag().toLowerCase()
  const email = `wren.tallis.${tag}@brightwater-welding.test`
  const name = `Wren Tallis ${tag}`
  const password = `forge-row-${tag}`

  await signIn(page, 'admin')
  await expect(page.getByRole('heading', { level: 1, name: 'Shop overview' })).toBeVisible()
  await checkScreen(page, 'admin-01-home')

  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Accounts' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Accounts' })).toBeVisible()
  const accounts = page.getByRole('table', { name: /Accounts/ })
  await expect(accounts.getByRole('row').filter({ hasText: 'qa@demo.test' })).toBeVisible()
  await checkScreen(page, 'admin-02-accounts')

  // ---- a new account ----
  await page.getByRole('button', { name: 'New account' }).click()
  await expect(page.getByRole('heading', { name: 'New account', exact: true })).toBeVisible()
  await page.getByLabel('E-mail (sign-in name)').fill(email)
  await page.getByLabel('Name', { exact: true }).fill(name)
  await page.getByRole('checkbox', { name: /^customer/ }).check()
  await page.getByLabel('Customer company').selectOption({ label: 'Brightwater Welding Supply' })
  await page.getByLabel('First password').fill('short')
  await page.getByRole('button', { name: 'Create account' }).click()
  await expect(page.getByText('Use at least 10 characters')).toBeVisible()
  await expect(accounts.getByRole('row').filter({ hasText: email })).toHaveCount(0)
  await checkScreen(page, 'admin-03-new-account-refused')

  await page.getByLabel('First password').fill(password)
  const created = page.waitForResponse((r) => r.url().endsWith('/api/users') && r.request().method() === 'POST' && r.status() === 201)
  await page.getByRole('button', { name: 'Create account' }).click()
  const user = (await (await created).json()) as { id: number; email: string; roles: string[] }
  expect(user.email).toBe(email)
  expect(user.roles).toEqual(['customer'])

  const row = accounts.getByRole('row').filter({ hasText: email })
  await expect(row).toBeVisible()
  await expect(row).toContainText(name)
  await expect(row).toContainText('Brightwater Welding Supply')
  await expect(row).toContainText('customer')
  await expect(row).toContainText('Active')

  // ---- the audit trail shows who created which account ----
  const audit = page.getByRole('table', { name: 'Audit trail' })
  const entry = audit
    .getByRole('row')
    .filter({ hasText: 'user.created' })
    .filter({ hasText: new RegExp(`#${user.id}\\b`) })
  // on the page that made the change, without reloading (soft: the rest of the journey still runs)
  await expect.soft(entry, 'the audit trail on the accounts page shows the new account without a reload').toHaveCount(1, { timeout: 5_000 })
  await page.reload()
  await expect(entry).toHaveCount(1)
  await expect(entry).toContainText('admin@demo.test')
  await checkScreen(page, 'admin-04-account-created')

  // ---- the new person signs in and sees their company's orders, not another customer's ----
  await page.getByRole('button', { name: 'Sign out' }).click()
  await expect(page).toHaveURL(/\/sign-in/)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Your orders' })).toBeVisible()
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My orders' }).click()
  await expect(page.getByText('Shop restock M21').first()).toBeVisible()
  await expect(page.getByText('PO 4471-LEL')).toHaveCount(0)
  await expect(page.getByRole('link', { name: 'Accounts' })).toHaveCount(0)
  await checkScreen(page, 'admin-05-new-account-signed-in')
})
