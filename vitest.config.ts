import { defineConfig } from 'vitest/config'

// Three projects: pure modules in plain node, the built server against real MariaDB, and Chromium.
// The api and browser projects reuse the one build made at the start of `npm test` (scripts/test.sh).
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          // One server at a time: every server's outbox worker delivers any due mail in the shared test
          // database to its own catcher, so parallel files would take each other's mail.
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          environment: 'node',
          testTimeout: 90_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
})
