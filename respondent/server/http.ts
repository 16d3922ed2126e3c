import 'server-only';
import type { NextRequest } from 'next/server';
import { resumeCookieName } from './link';

// What the respondent route handlers (app/r/[token]/…) share besides route(): where the resume
// token comes from, and the cookie that keeps it. Every response under /r is sent with
// `cache-control: no-store` and the respondent pages' script policy by next.config.mjs.

/** The resume token: a header from the page's script, ?resume= in the address, or (given the study) the cookie. */
export function resumeTokenFrom(req: NextRequest, studyId?: string): string | null {
  return req.headers.get('x-resume-token') || req.nextUrl.searchParams.get('resume') || (studyId ? req.cookies.get(resumeCookieName(studyId))?.value ?? null : null);
}

const THIRTY_DAYS = 60 * 60 * 24 * 30;

/**
 * A `set-cookie` value keeping the resume token, so reopening the link on this phone resumes.
 * Scoped to /r: the flow document and every respondent endpoint receive it, nothing else does.
 */
export function resumeCookie(studyId: string, token: string, secure: boolean): string {
  return `${resumeCookieName(studyId)}=${token}; Path=/r; Max-Age=${THIRTY_DAYS}; HttpOnly; SameSite=Lax${secure ? '; Secure' : ''}`;
}

