// Fault tier: one production build, a private cluster these tests may stop and restart, the
// Stripe stand-in. Each test file starts (and kills) its own `next start` instances.
import type { TestProject } from 'vitest/node';
import type { ChildProcess } from 'node:child_process';
import { stopCluster } from '../../../scripts/lib/postgres.mjs';
import { startFakeStripe, stopService, waitForPort } from '../../../scripts/lib/services.mjs';
import { appEnv, ensureBuild, freshDatabase, WEBHOOK_SECRET } from '../../../scripts/load/app';
import { FAULTS_PGPORT, FAULTS_ROOT } from './cluster';

export const APP_PORTS = [Number(process.env.FAULTS_APP_PORT ?? 3901), Number(process.env.FAULTS_APP_PORT_2 ?? 3902)];
const STRIPE_PORT = Number(process.env.FAULTS_STRIPE_PORT ?? 3905);

let stripe: ChildProcess | undefined;

export default async function setup(project: TestProject) {
  ensureBuild((s) => process.stdout.write(`[faults] ${s}\n`));
  const url = await freshDatabase({ root: FAULTS_ROOT, port: FAULTS_PGPORT, database: process.env.FAULTS_DB_NAME ?? 'nw_faults' });
  const env = appEnv(url, { stripePort: STRIPE_PORT, smtpPort: Number(process.env.FAULTS_SMTP_PORT ?? 3903) });
  stripe = startFakeStripe({ port: STRIPE_PORT, webhookUrl: `http://127.0.0.1:${APP_PORTS[0]}/api/stripe/webhook`, webhookSecret: WEBHOOK_SECRET, quiet: true, delayMs: 0 });
  await waitForPort(STRIPE_PORT);
  project.provide('faultsEnv', env);
  project.provide('appPorts', APP_PORTS);
  project.provide('stripeUrl', `http://127.0.0.1:${STRIPE_PORT}`);
  return () => {
    if (stripe) stopService(stripe);
    // The private cluster is this tier's alone: nothing else needs it running afterwards.
    stopCluster({ root: FAULTS_ROOT });
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    faultsEnv: Record<string, string>;
    appPorts: number[];
    stripeUrl: string;
  }
}
