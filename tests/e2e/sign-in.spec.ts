import { expect, test } from '@playwright/test'
import { ROLES } from '#shared/schemas/auth.ts'
import { axeViolations, shot, signIn } from './support.ts'

const HOME_HEADING: Record<(typeof ROLES)[number], string> = {
  admin: 'Shop overview',
  sales: 'Sales desk',
  blender: 'Blending bench',
  technician: 'Manifold',
  qa: 'Analysis & release',
  customer: 'Your orders',
}

test('the sign-in page is accessible and refuses a wrong password', async ({ page }) => {
  await page.goto('/')
  await expect(page).toHaveURL(/\/sign-in/)
  expect(await axeViolations(page)).toEqual([])
  await page.getByLabel('E-mail').fill('qa@demo.test')
  await page.getByLabel('Password').fill('not-the-password')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('alert')).toContainText('not right')
  await shot(page, 'sign-in-refused')
})

for (const role of ROLES) {
  test(`${role} signs in and sees their home queue`, async ({ page }) => {
    await signIn(page, role)
    await expect(page.getByRole('heading', { level: 1, name: HOME_HEADING[role] })).toBeVisible()
    await expect(page.getByTestId('signed-in-as')).toBeVisible()
    await shot(page, `home-${role}`)
    expect(await axeViolations(page)).toEqual([])
    await page.getByRole('button', { name: 'Sign out' }).click()
    await expect(page).toHaveURL(/\/sign-in/)
  })
}
