import 'server-only';
// The small respondent requests behind app/r/[token]/…: the link entry's refusal, the item
// picture, the flow state on resume, an answer batch and the complete. Each opens the request's EntityManager
// here so the route files stay free of database imports (eslint.config.mjs).
import { em } from '@/lib/server/db/orm';
import { sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import { completeRespondent } from './complete';
import { answeringRespondent, recordAnswers } from './answers';
import { limitAnswersOfRespondent } from './answer-limits';
import type { AnswerBatchReply, AnswerInput } from '@/respondent/shared/answer.schema';
import { linkRefusal, loadLink, openLink } from './link';
import { findByResume, stateOf } from './respondents';
import type { FlowState } from '@/respondent/shared/types';
import type { Language } from '@/lib/schemas/study.schema';
import { refusal } from './words';

/** Why the link cannot be used (unknown 404, closed or paused 410), or null when it is open; unknown links in `unknownLanguage`. */
export async function linkEntryRefusal(token: string, unknownLanguage: Language = 'en') {
  return linkRefusal(await loadLink(await em(), token), unknownLanguage);
}

/** The study's item picture, only through a known link of the study's workspace. */
export async function linkPicture(token: string): Promise<{ contentType: string; bytes: Uint8Array<ArrayBuffer> }> {
  const db = await em();
  const link = await loadLink(db, token);
  const id = link?.design.itemPictureId;
  const row = id ? await sqlOne<{ content_type: string; bytes: Buffer }>(db, 'select content_type, bytes from study_asset where id = ? and workspace_id = ?', [id, link.workspaceId]) : undefined;
  if (!row) throw new AppError(404, 'not_found', 'No picture.');
  return { contentType: row.content_type, bytes: new Uint8Array(row.bytes) as Uint8Array<ArrayBuffer> };
}

/** The respondent's next screens, found by resume token (header, ?resume= or the cookie). */
export async function respondentState(token: string, resume: (studyId: string) => string | null): Promise<FlowState> {
  const db = await em();
  const link = await openLink(db, token);
  const r = await findByResume(db, link.studyId, resume(link.studyId));
  if (!r) throw refusal(link.design.language, 404, 'not_found', 'lost');
  return stateOf(db, link, r);
}

/** Finishes the respondent; uses one seat exactly once however often it is retried. */
export async function completeByLink(token: string, resumeToken: string | null) {
  return completeRespondent(await em(), token, resumeToken);
}

/** Stores one batch for the respondent behind the first resume token that matches this link. */
export async function storeAnswerBatch(token: string, resumeTokens: string[], answers: AnswerInput[]): Promise<AnswerBatchReply> {
  const db = await em();
  const respondent = await answeringRespondent(db, token, resumeTokens);
  await limitAnswersOfRespondent(respondent.id, answers.length);
  return recordAnswers(db, respondent, answers);
}
