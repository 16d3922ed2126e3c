import { route } from '@/lib/server/http/route';
import { em } from '@/lib/server/db/orm';
import { openForNewRespondents } from '@/lib/server/billing/seat-holds';
import { consentDocument, resumeDocument, stoppedDocument } from '@/respondent/server/document';
import { linkRefusal, loadLink, resumeCookieName } from '@/respondent/server/link';
import { findByResume, stateOf } from '@/respondent/server/respondents';
import type { RespondentBoot } from '@/respondent/shared/boot';
import { flowStudy } from '@/respondent/shared/screens';
import { respondentUrls } from '@/respondent/shared/urls';

const TITLE = 'Price survey';

/**
 * The respondent flow, served as a complete HTML document by this route handler rather than an
 * App Router page, so a phone loads only the flow's own small bundle (respondent/vite.config.ts)
 * and not the Next.js client runtime. New respondents get the consent screen as a real form
 * posting to the start route (it works before and without the script); resumes come from the
 * cookie or ?resume=.
 */
export const GET = route(
  { auth: 'public', reason: 'the respondent flow document; the unguessable link token in the path is the only credential' },
  async ({ req, params }) => {
    const token = String(params.token);
    const sp = req.nextUrl.searchParams;
    const db = await em();
    const link = await loadLink(db, token);
    const refusal = linkRefusal(link);
    if (refusal || !link) return stoppedDocument(refusal!);

    const resume = sp.get('resume') || req.cookies.get(resumeCookieName(link.studyId))?.value || null;
    const r = await findByResume(db, link.studyId, resume);
    if (!r && !(await openForNewRespondents(db, link.workspaceId, link.linkId, link.quota))) {
      return stoppedDocument({ status: 200, code: 'study_full', message: 'Thank you for your interest. No more answers are needed.' });
    }
    const urls = respondentUrls(token);
    const design = link.design;
    const boot: RespondentBoot = {
      token,
      resumeToken: r?.resumeToken ?? null,
      pid: link.acceptsPid ? sp.get('pid') || null : null,
      initial: r ? await stateOf(db, link, r) : null,
      study: flowStudy(design, design.itemPictureId ? urls.picture : null),
      consentText: design.consentText,
      retentionDays: link.retentionDays,
      questions: design.segmentQuestions,
    };
    return r ? resumeDocument({ title: TITLE, boot }) : consentDocument({ title: TITLE, action: urls.start, boot });
  },
);
