import 'server-only';
import type { NextRequest, NextResponse } from 'next/server';
import { toErrorResponse } from '@/lib/server/http/route';
import { resumeCookieName } from './link';

type Ctx = { params: Promise<{ token: string }> };

/** Respondent route handlers: no session, the link token in the path, one error shape, never cached. */
export function respondentRoute(handler: (req: NextRequest, token: string) => Promise<Response>) {
  return async (req: NextRequest, ctx: Ctx) => {
    let res: Response;
    try {
      res = await handler(req, (await ctx.params).token);
    } catch (err) {
      res = toErrorResponse(err);
    }
    res.headers.set('cache-control', 'no-store');
    return res;
  };
}

/** The resume token: a header from the page's script, or ?resume= in the address. */
export function resumeTokenFrom(req: NextRequest, studyId?: string): string | null {
  return req.headers.get('x-resume-token') || req.nextUrl.searchParams.get('resume') || (studyId ? req.cookies.get(resumeCookieName(studyId))?.value ?? null : null);
}

/** Kept so that reopening the link on this phone resumes; scoped to the respondent pages. */
export function setResumeCookie(res: NextResponse, studyId: string, token: string, secure: boolean) {
  res.cookies.set(resumeCookieName(studyId), token, { httpOnly: true, sameSite: 'lax', path: '/r', secure, maxAge: 60 * 60 * 24 * 30 });
}
