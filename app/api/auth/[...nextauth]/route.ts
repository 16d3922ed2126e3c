import { route } from '@/lib/server/http/route';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';
import { handlers } from '@/lib/server/team/auth';
import { clientAddress } from '@/lib/server/platform/client-address';
import { checkSignInLimits, revokeCurrentSessions } from '@/lib/server/team/sign-in-guard';

// Auth.js's own endpoints (sign-in, sign-out, session, CSRF), answered by its handlers; the
// wrapper adds only the request context and the one error shape for the rate limits below.
const reason = 'Auth.js sign-in and sign-out endpoints: they create the session, so none exists yet';

export const GET = route({ auth: 'public', reason }, async ({ req }) => handlers.GET(req));

/**
 * A credentials sign-in over HTTP passes the same limits as the sign-in form (per address, and
 * per account by e-mail alone); a sign-out voids the session on the server first.
 */
export const POST = route({ auth: 'public', reason, body: { types: ['application/x-www-form-urlencoded', 'application/json'], maxBytes: BODY_LIMITS.authForm } }, async ({ req }) => {
  const path = req.nextUrl.pathname;
  if (path.endsWith('/callback/credentials')) {
    const form = await req.clone().formData().catch(() => null);
    await checkSignInLimits(clientAddress(req.headers), String(form?.get('email') ?? ''));
  } else if (path.endsWith('/signout')) {
    await revokeCurrentSessions();
  }
  return handlers.POST(req);
});
