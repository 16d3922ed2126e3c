import type { NextRequest } from 'next/server';
import { em } from '@/lib/server/db/orm';
import { linkRefusal, loadLink, resumeCookieName } from '@/respondent/server/link';
import { findByResume, stateOf } from '@/respondent/server/respondents';
import { openForNewRespondents } from '@/respondent/server/admission';
import { noticeHtml, respondentDocument, WAITING_HTML } from '@/respondent/server/document';
import { consentHtml } from '@/respondent/server/consent-html';
import { flowStudy } from '@/respondent/shared/screens';

const TITLE = 'Price survey';

/**
 * The respondent flow, served as a complete HTML document by this route handler rather than an
 * App Router page, so a phone loads only the flow's own small bundle (scripts/build-respondent.mjs)
 * and not the Next.js client runtime. The consent screen is a real form posting to the start
 * route (it works before and without the script); resumes come from the cookie or ?resume=.
 */
export async function GET(req: NextRequest, ctx: { params: Promise<{ token: string }> }) {
  const { token } = await ctx.params;
  const sp = req.nextUrl.searchParams;
  const db = await em();
  const link = await loadLink(db, token);
  const refusal = linkRefusal(link);
  if (refusal || !link) {
    const r = refusal!;
    const title = r.status === 404 ? 'No study at this address' : 'This study is not open';
    return respondentDocument({ title, body: noticeHtml(title, r.message, r.code), status: r.status });
  }

  const resume = sp.get('resume') || req.cookies.get(resumeCookieName(link.studyId))?.value || null;
  const r = await findByResume(db, link.studyId, resume);
  if (!r && !(await openForNewRespondents(db, link.workspaceId, link.linkId, link.quota))) {
    const title = 'This study is full';
    return respondentDocument({ title, body: noticeHtml(title, 'Thank you for your interest. No more answers are needed.', 'study_full') });
  }
  const design = link.design;
  const pid = link.acceptsPid ? sp.get('pid') || null : null;
  const action = `/api/r/${encodeURIComponent(token)}/start`;
  return respondentDocument({
    title: TITLE,
    body: r ? WAITING_HTML : consentHtml({ consentText: design.consentText, retentionDays: link.retentionDays, action, pid }),
    boot: {
      token,
      resumeToken: r?.resumeToken ?? null,
      pid,
      initial: r ? await stateOf(db, link, r) : null,
      study: flowStudy(design, design.itemPictureId ? `/api/r/${token}/picture` : null),
      consentText: design.consentText,
      retentionDays: link.retentionDays,
      questions: design.segmentQuestions,
    },
  });
}
