// End-to-end tier: the built app on its own port. `npm test` starts it once for every tier
// (E2E_BASE_URL set); running this project alone builds and starts it here.
import type { TestProject } from 'vitest/node';
import type { ChildProcess } from 'node:child_process';
import { prepareTestDatabase, testEnv, buildTestApp, startTestApp, stopTestApp } from '../../scripts/lib/test-env.mjs';

let children: ChildProcess[] = [];

export default async function setup(project: TestProject) {
  let base = process.env.E2E_BASE_URL;
  let mailApi = process.env.MAIL_API_URL;
  let databaseUrl = process.env.DATABASE_URL;
  if (!base) {
    databaseUrl = await prepareTestDatabase({ fresh: false });
    const env = testEnv(databaseUrl);
    buildTestApp(env);
    children = await startTestApp(env);
    base = env.E2E_BASE_URL;
    mailApi = env.MAIL_API_URL;
  }
  project.provide('appUrl', base);
  project.provide('mailApiUrl', mailApi ?? '');
  project.provide('databaseUrl', databaseUrl ?? '');
  return () => stopTestApp(children);
}

declare module 'vitest' {
  export interface ProvidedContext {
    mailApiUrl: string;
  }
}
