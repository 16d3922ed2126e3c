import { defineConfig } from 'vitest/config';
import path from 'node:path';

const alias = {
  '@': import.meta.dirname,
  // The marker package throws outside React's server build; tests run server code directly.
  'server-only': path.resolve(import.meta.dirname, 'tests/support/empty.ts'),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts', 'lib/**/*.test.ts'], environment: 'node' },
      },
      {
        // Seeded simulations that check the statistics hold their stated level (tests/calibration/README.md).
        resolve: { alias },
        test: { name: 'calibration', include: ['tests/calibration/**/*.test.ts'], environment: 'node', testTimeout: 600_000 },
      },
      {
        resolve: { alias },
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          setupFiles: ['tests/support/integration-setup.ts'],
          // next-auth imports 'next/server' without an extension, which Node's ESM resolver refuses.
          server: { deps: { inline: ['next-auth'] } },
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/e2e-global-setup.ts'],
          // Some e2e files seed through server code that reaches next-auth (see integration above).
          server: { deps: { inline: ['next-auth'] } },
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
