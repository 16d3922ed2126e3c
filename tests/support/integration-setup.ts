import { inject, vi } from 'vitest';

process.env.DATABASE_URL = inject('databaseUrl');
process.env.AUTH_SECRET ??= 'integration-tests-secret-0123456789abcdef';
process.env.BCRYPT_COST = '4';
process.env.SMTP_PORT ??= '2025';
// Route tests start many respondents on one link with no client address; the file about this limit sets its own.
process.env.RATE_LIMIT_STARTS_PER_LINK_ADDRESS ??= '100000';

/**
 * Route handlers and actions read the signed-in user through lib/server/session. Tests call
 * them directly and say who is signed in with `signInAs(user)` from ./factories (null =
 * signed out); the real Auth.js cookie path is covered by the end-to-end tier.
 */
vi.mock('@/lib/server/team/session', () => ({
  currentUser: async () => (globalThis as { __testUser?: unknown }).__testUser ?? null,
}));
