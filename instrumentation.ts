// Runs once when the Next.js server starts (not during `next build`): the environment is parsed
// here, so a production server without its own secrets (lib/env-schema.ts: the Stripe webhook
// secret has no fallback there) refuses to start instead of failing on its first request —
// or, worse, verifying webhooks against a public value. The job worker refuses the same way
// (it parses the environment before it listens).
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs' || process.env.NEXT_PHASE === 'phase-production-build') return;
  const { parseEnv } = await import('./lib/env-schema');
  try {
    parseEnv(process.env);
  } catch (err) {
    console.error(`[notchwise] not starting: ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  }
}
