import 'server-only';
// The take-part document's decisions: which screen a phone gets for a link (stop screen, consent
// form for a new respondent, or the flow resumed from the cookie or ?resume=) and the boot data the
// bundle starts from. app/r/[token]/take-part/route.ts only hands the request over.
import { em } from '@/lib/server/db/orm';
import { openForNewRespondents } from './admission';
import { consentDocument, resumeDocument, stoppedDocument } from './document';
import { linkRefusal, loadLink, resumeCookieName } from './link';
import { findByResume, stateOf } from './respondents';
import { checkedPid, pidProofCookie, requireSignedPid } from './panel-ids';
import { AppError } from '@/lib/server/http/errors';
import type { RespondentBoot } from '@/respondent/shared/boot';
import { flowStudy } from '@/respondent/shared/screens';
import { respondentUrls } from '@/respondent/shared/urls';
import { languageFromAcceptLanguage, messagesFor } from '@/respondent/messages/all';

export interface TakePartRequest {
  token: string;
  /** ?resume= from the address, else the resume cookie's value for the link's study. */
  resume: (studyId: string) => string | null;
  pid: string | null;
  /** ?sig=: the panel's signature of the pid, on links that ask for one (./panel-ids.ts). */
  sig?: string | null;
  /** Served over https (the signature cookie is then Secure). */
  secure?: boolean;
  /** The request's Accept-Language: the stop screen's language for a link no study stands behind. */
  acceptLanguage?: string | null;
}

/** The whole HTML response for GET /r/[token]/take-part. */
export async function takePartDocument({ token, resume, pid: rawPid, sig, secure = false, acceptLanguage = null }: TakePartRequest): Promise<Response> {
  const db = await em();
  const link = await loadLink(db, token);
  const refused = linkRefusal(link, languageFromAcceptLanguage(acceptLanguage));
  if (refused || !link) return stoppedDocument(refused!);
  const language = link.design.language;
  const messages = messagesFor(language);

  const r = await findByResume(db, link.studyId, resume(link.studyId));
  // Panel ids are checked here too, so a bad one is refused before the consent screen.
  let pid: string | null = null;
  try {
    pid = link.acceptsPid && !r ? checkedPid(rawPid, language) : null;
    if (pid) requireSignedPid(link.pidSecret, pid, sig, language);
  } catch (err) {
    if (err instanceof AppError) return stoppedDocument(err);
    throw err;
  }
  if (!r && !(await openForNewRespondents(db, link.workspaceId, link.linkId, link.quota))) {
    return stoppedDocument({ status: 200, code: 'study_full', message: messages.stop.full }, language);
  }
  const urls = respondentUrls(token);
  const design = link.design;
  const boot: RespondentBoot = {
    token,
    resumeToken: r?.resumeToken ?? null,
    pid,
    initial: r ? await stateOf(db, link, r) : null,
    study: flowStudy(design, design.itemPictureId ? urls.picture : null),
    consentText: design.consentText,
    retentionDays: link.retentionDays,
    questions: design.segmentQuestions,
    language,
    messages,
  };
  if (r) return resumeDocument({ boot });
  const doc = await consentDocument({ action: urls.start, boot });
  if (pid && link.pidSecret && sig) doc.headers.append('set-cookie', pidProofCookie(link.linkId, sig, secure));
  return doc;
}

export { resumeCookieName };
