// Runs once per server process before it answers requests (Next.js instrumentation hook), not
// during `next build`. Two jobs:
// 1. The environment is parsed here, so a production server without its own secrets
//    (lib/env-schema.ts: the Stripe webhook secret has no fallback there) refuses to start
//    instead of failing on its first request — or, worse, verifying webhooks against a public
//    value. The job worker refuses the same way (it parses the environment before it listens).
// 2. Each request is stamped with the socket's address, which Next.js does not hand to route
//    handlers: see lib/peer-stamp.ts for why and how. The imports sit behind the runtime check
//    so the edge build never sees node:http.
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs' || process.env.NEXT_PHASE === 'phase-production-build') return;
  const { parseEnv } = await import('./lib/env-schema');
  try {
    parseEnv(process.env);
  } catch (err) {
    console.error(`[notchwise] not starting: ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  }
  const { installPeerStamp } = await import('./lib/peer-stamp');
  installPeerStamp();
}
