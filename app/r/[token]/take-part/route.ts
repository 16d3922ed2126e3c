import { route } from '@/lib/server/http/route';
import { resumeCookieName, takePartDocument } from '@/respondent/server/take-part';

/**
 * The respondent flow, served as a complete HTML document by this route handler rather than an
 * App Router page, so a phone loads only the flow's own small bundle (respondent/vite.config.ts)
 * and not the Next.js client runtime. New respondents get the consent screen as a real form
 * posting to the start route (it works before and without the script); resumes come from the
 * cookie or ?resume= (respondent/server/take-part.ts decides).
 */
export const GET = route(
  { auth: 'public', reason: 'the respondent flow document; the unguessable link token in the path is the only credential' },
  async ({ req, params }) => {
    const sp = req.nextUrl.searchParams;
    return takePartDocument({
      token: String(params.token),
      pid: sp.get('pid') || null,
      sig: sp.get('sig'),
      secure: req.nextUrl.protocol === 'https:',
      acceptLanguage: req.headers.get('accept-language'),
      resume: (studyId) => sp.get('resume') || req.cookies.get(resumeCookieName(studyId))?.value || null,
    });
  },
);
