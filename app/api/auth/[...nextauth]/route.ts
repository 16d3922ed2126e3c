import type { NextRequest } from 'next/server';
import { handlers } from '@/lib/server/team/auth';
import { toErrorResponse } from '@/lib/server/http/route';
import { clientIp, limit } from '@/lib/server/platform/rate-limit';

export const { GET } = handlers;

/** Auth.js itself, with the sign-in rate limits in front of a credentials sign-in over HTTP. */
export async function POST(req: NextRequest) {
  if (req.nextUrl.pathname.endsWith('/callback/credentials')) {
    try {
      const form = await req.clone().formData().catch(() => null);
      const email = String(form?.get('email') ?? '').trim().toLowerCase();
      const ip = clientIp(req.headers);
      await limit('sign-in-ip', ip);
      await limit('sign-in-email', `${ip}|${email}`);
    } catch (err) {
      return toErrorResponse(err);
    }
  }
  return handlers.POST(req);
}
