import { defineConfig } from 'vitest/config'

// Unit tests (tests/unit) and API tests (tests/api). End-to-end tests run with Playwright (tests/e2e).
export default defineConfig({
  test: {
    include: ['tests/unit/**/*.test.ts', 'tests/unit/**/*.test.tsx', 'tests/api/**/*.test.ts', 'tests/reliability/**/*.test.ts'],
    environment: 'node',
    execArgv: ['--import', 'tsx'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
})
