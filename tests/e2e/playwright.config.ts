import { defineConfig } from '@playwright/test'

/**
 * End-to-end tests in Debian's Chromium (/usr/bin/chromium; never a downloaded browser) against the built
 * app, started on a fresh database with the local fakes on their own ports.
 */
const PORT = Number(process.env.E2E_PORT ?? 3310)
export const E2E_INBOX_PORT = Number(process.env.E2E_INBOX_PORT ?? 2780)

export default defineConfig({
  testDir: '.',
  testMatch: /.*\.spec\.ts$/,
  outputDir: '../../test-results/e2e',
  timeout: 60_000,
  expect: { timeout: 10_000 },
  retries: process.env.CI ? 1 : 0,
  workers: 1,
  reporter: [['list']],
  use: {
    baseURL: `http://127.0.0.1:${PORT}`,
    browserName: 'chromium',
    bypassCSP: false,
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    },
    screenshot: 'only-on-failure',
    trace: process.env.CI ? 'retain-on-failure' : 'off',
    viewport: { width: 1366, height: 900 },
  },
  webServer: {
    command: `rm -f tests/.tmp/e2e.sqlite* && node --import tsx server/index.ts`,
    cwd: '../..',
    url: `http://127.0.0.1:${PORT}/api/health`,
    reuseExistingServer: false,
    timeout: 120_000,
    stdout: 'ignore',
    stderr: 'pipe',
    env: {
      NODE_ENV: 'production',
      PORT: String(PORT),
      DATABASE_PATH: 'tests/.tmp/e2e.sqlite',
      LOG_LEVEL: 'warn',
      DEMO_PASSWORD: 'fillwright-demo',
      PUBLIC_URL: `http://127.0.0.1:${PORT}`,
      SMTP_PORT: '2725',
      FAKE_SMTP_PORT: '2725',
      FAKE_SMTP_WEB_PORT: String(E2E_INBOX_PORT),
      FAKE_PAYMENTS_PORT: '12311',
      STRIPE_API_PORT: '12311',
      UPLOAD_DIR: 'tests/.tmp/e2e-uploads',
    },
  },
})
