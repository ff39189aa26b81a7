import { defineConfig } from 'vitest/config'

// Three projects: pure code (unit + published reference values), API routes against the real
// PostgreSQL, and the built app in headless Chromium. `npm test` runs them all.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          sequence: { groupOrder: 0 },
          include: ['tests/unit/**/*.test.ts', 'tests/reference/**/*.test.ts'],
          environment: 'node',
          // The engine's consistency checks simulate enough flashes to compare estimators.
          testTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'server',
          // Groups run one after another: the server suite restarts PostgreSQL, which the browser suite shares.
          sequence: { groupOrder: 1 },
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-server.ts'],
          setupFiles: ['tests/support/clean-database.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'e2e',
          sequence: { groupOrder: 2 },
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-e2e.ts'],
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
})
