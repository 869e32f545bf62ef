import { createRequire } from 'node:module'
import { mkdirSync } from 'node:fs'
import { expect, type Page } from '@playwright/test'
import type { Role } from '#shared/schemas/auth.ts'

export const PASSWORD = 'fillwright-demo'
export const SHOTS = 'test-results/screenshots'
mkdirSync(SHOTS, { recursive: true })

export async function signIn(page: Page, role: Role): Promise<void> {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(`${role}@demo.test`)
  await page.getByLabel('Password').fill(PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible()
}

export async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true })
}

const require = createRequire(import.meta.url)
const AXE_SOURCE = require.resolve('axe-core/axe.min.js')

/**
 * Runs axe-core (WCAG 2.x A/AA rules) in the page and returns the violations. The page's CSP forbids
 * injected scripts, so the script is evaluated through the DevTools protocol instead.
 */
export async function axeViolations(page: Page): Promise<{ id: string; impact: string | null; help: string; nodes: number }[]> {
  const { readFileSync } = await import('node:fs')
  const src = readFileSync(AXE_SOURCE, 'utf8')
  const cdp = await page.context().newCDPSession(page)
  await cdp.send('Runtime.evaluate', { expression: src })
  const result = await cdp.send('Runtime.evaluate', {
    expression: `axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a','wcag2aa','wcag21a','wcag21aa','wcag22aa'] } }).then(r => JSON.stringify(r.violations.map(v => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.length }))))`,
    awaitPromise: true,
    returnByValue: true,
  })
  await cdp.detach()
  return JSON.parse(String(result.result.value)) as { id: string; impact: string | null; help: string; nodes: number }[]
}
