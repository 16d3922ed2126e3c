import 'server-only';
// The take-part document's decisions: which screen a phone gets for a link (stop screen, consent
// form for a new respondent, or the flow resumed from the cookie or ?resume=) and the boot data the
// bundle starts from. app/r/[token]/take-part/route.ts only hands the request over.
import { em } from '@/lib/server/db/orm';
import { openForNewRespondents } from './admission';
import { consentDocument, resumeDocument, stoppedDocument } from './document';
import { linkRefusal, loadLink, resumeCookieName } from './link';
import { findByResume, stateOf } from './respondents';
import type { RespondentBoot } from '@/respondent/shared/boot';
import { flowStudy } from '@/respondent/shared/screens';
import { respondentUrls } from '@/respondent/shared/urls';

const TITLE = 'Price survey';

export interface TakePartRequest {
  token: string;
  /** ?resume= from the address, else the resume cookie's value for the link's study. */
  resume: (studyId: string) => string | null;
  pid: string | null;
}

/** The whole HTML response for GET /r/[token]/take-part. */
export async function takePartDocument({ token, resume, pid }: TakePartRequest): Promise<Response> {
  const db = await em();
  const link = await loadLink(db, token);
  const refusal = linkRefusal(link);
  if (refusal || !link) return stoppedDocument(refusal!);

  const r = await findByResume(db, link.studyId, resume(link.studyId));
  if (!r && !(await openForNewRespondents(db, link.workspaceId, link.linkId, link.quota))) {
    return stoppedDocument({ status: 200, code: 'study_full', message: 'Thank you for your interest. No more answers are needed.' });
  }
  const urls = respondentUrls(token);
  const design = link.design;
  const boot: RespondentBoot = {
    token,
    resumeToken: r?.resumeToken ?? null,
    pid: link.acceptsPid ? pid : null,
    initial: r ? await stateOf(db, link, r) : null,
    study: flowStudy(design, design.itemPictureId ? urls.picture : null),
    consentText: design.consentText,
    retentionDays: link.retentionDays,
    questions: design.segmentQuestions,
  };
  return r ? resumeDocument({ title: TITLE, boot }) : consentDocument({ title: TITLE, action: urls.start, boot });
}

export { resumeCookieName };
