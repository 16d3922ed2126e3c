// Integration tier: a migrated throw-away database (reused when `npm test` already made one).
import type { TestProject } from 'vitest/node';
import { prepareTestDatabase } from '../../scripts/lib/test-env.mjs';

export default async function setup(project: TestProject) {
  const url = process.env.DATABASE_URL ?? (await prepareTestDatabase({ fresh: false }));
  project.provide('databaseUrl', url);
  project.provide('appUrl', process.env.E2E_BASE_URL ?? '');
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    appUrl: string;
  }
}
