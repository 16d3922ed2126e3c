import { route } from '@/lib/server/http/route';
import { BODY_LIMITS } from '@/lib/server/http/request-guard';
import { handlers } from '@/lib/server/team/auth';
import { clientIp, limit } from '@/lib/server/platform/rate-limit';

// Auth.js's own endpoints (sign-in, sign-out, session, CSRF), answered by its handlers; the
// wrapper adds only the request context and the one error shape for the rate limits below.
const reason = 'Auth.js sign-in and sign-out endpoints: they create the session, so none exists yet';

export const GET = route({ auth: 'public', reason }, async ({ req }) => handlers.GET(req));

/** A credentials sign-in over HTTP passes the sign-in rate limits first. */
export const POST = route({ auth: 'public', reason, body: { types: ['application/x-www-form-urlencoded', 'application/json'], maxBytes: BODY_LIMITS.authForm } }, async ({ req }) => {
  if (req.nextUrl.pathname.endsWith('/callback/credentials')) {
    const form = await req.clone().formData().catch(() => null);
    const email = String(form?.get('email') ?? '').trim().toLowerCase();
    const ip = clientIp(req.headers);
    await limit('sign-in-ip', ip);
    await limit('sign-in-email', `${ip}|${email}`);
  }
  return handlers.POST(req);
});
