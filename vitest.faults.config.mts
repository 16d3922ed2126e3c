import { defineConfig } from 'vitest/config';
import path from 'node:path';

// `npm run test:faults`: the app under faults (PostgreSQL restarted, the app killed, two
// instances, webhooks replayed). Its own config so the default vitest run leaves it out.
export default defineConfig({
  resolve: { alias: { '@': import.meta.dirname, 'server-only': path.resolve(import.meta.dirname, 'tests/support/empty.ts') } },
  test: {
    name: 'faults',
    include: ['tests/faults/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/faults/support/global-setup.ts'],
    testTimeout: 180_000,
    hookTimeout: 300_000,
    fileParallelism: false,
  },
});
