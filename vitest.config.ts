import { configDefaults, defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    // Integration and browser files each start their own server (and Chromium): two at a time suits 2 cores.
    maxWorkers: 2,
    minWorkers: 1,
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
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          exclude: [...configDefaults.exclude, 'tests/integration/adversarial.test.ts'],
          globalSetup: ['tests/integration/helpers/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        // The adversarial suite times /api/health while hostile requests run: `npm test` runs it on its own,
        // after the other projects, so other test files' servers do not share its two cores.
        test: {
          name: 'hostile',
          include: ['tests/integration/adversarial.test.ts'],
          globalSetup: ['tests/integration/helpers/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/integration/helpers/global-setup.ts'],
          testTimeout: 120_000,
          hookTimeout: 120_000,
          // Browser tests run one file at a time in a single fork.
          poolOptions: { forks: { singleFork: true } },
        },
      },
    ],
  },
});
