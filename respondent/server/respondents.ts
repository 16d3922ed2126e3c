import 'server-only';
// respondent/server: the respondent runtime's server side, server-only. The route handlers under
// app/r/[token] stay thin and call in here: links and their refusals (link.ts), starting and
// resuming respondents (this module), answers (answers.ts), completing with its one seat
// (complete.ts), and the HTML documents with the server-rendered first screen (document.tsx).
// This module: who a respondent is, how one starts or resumes, and which screens come next.
import { randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Language, StudyDesign } from '@/lib/schemas/study.schema';
import { completionRedirect, flowState } from '@/respondent/shared/screens';
import type { FlowState, TrialPlan } from '@/respondent/shared/types';
import type { StartInput, StartReply } from '@/respondent/shared/start.schema';
import { respondentUrls } from '@/respondent/shared/urls';
import { em } from '@/lib/server/db/orm';
import { refusal } from './words';
import { openLink, type RespondentLinkWithStudy } from './link';
import { withSeatLock } from '@/lib/server/billing/seat-ledger';
import { sql } from '@/lib/server/db/sql';
import { limit } from '@/lib/server/platform/rate-limit';
import { admitRespondent } from './admission';
import { PID_TAKEN, checkedPid, newReferenceCode, pidProofCookieName, requireSignedPid } from './panel-ids';
import { answeredHistory, newResumeToken, newSeed, planFor } from './trials';

/** A respondent's stored progress through the flow. */
export interface RespondentProgress {
  id: string;
  pid: string | null;
  seed: number;
  state: string;
  plan: TrialPlan;
  answeredCount: number;
  segmentAnswers: Record<string, string>;
  referenceCode: string | null;
}

const FULL = (language: Language) => refusal(language, 409, 'study_full', 'fullAtStart');
// The respondent's own device (it holds the resume token) may be told it finished.
const DONE = (language: Language) => refusal(language, 409, 'already_taken_part', 'alreadyDone');
// A panel id is not a secret (panels often number their members): it never hands out another
// respondent's resume token, plan or answers, nor says whether that respondent finished
// (PID_TAKEN, ./panel-ids.ts). The device that started keeps its resume token.

function toRow(r: Record<string, unknown>): RespondentProgress {
  return {
    id: String(r.id), pid: (r.pid as string | null) ?? null, seed: Number(r.seed), state: String(r.state),
    plan: r.plan as TrialPlan, answeredCount: Number(r.answered_count), segmentAnswers: (r.segment_answers as Record<string, string>) ?? {},
    referenceCode: (r.reference_code as string | null) ?? null,
  };
}

const SELECT = 'select id, pid, seed, state, plan, answered_count, segment_answers, reference_code from respondent';

export async function findByResume(db: EntityManager, studyId: string, resumeToken: string | null): Promise<(RespondentProgress & { resumeToken: string }) | null> {
  if (!resumeToken || resumeToken.length > 64) return null;
  const rows = await sql(db, `${SELECT} where study_id = ? and resume_token = ?`, [studyId, resumeToken]);
  return rows[0] ? { ...toRow(rows[0]), resumeToken } : null;
}

async function findByPid(db: EntityManager, studyId: string, pid: string): Promise<{ state: string } | null> {
  const found = await sql<{ state: string }>(db, 'select state from respondent where study_id = ? and pid = ?', [studyId, pid]);
  return found[0] ?? null;
}

/** Segment answers must cover every question with one of its options; nothing else is kept. */
export function validSegmentAnswers(design: StudyDesign, answers: Record<string, string>): Record<string, string> {
  const issues = design.segmentQuestions
    .filter((q) => !q.options.includes(answers[q.id] ?? ''))
    .map((q) => ({ path: `segmentAnswers.${q.id}`, message: 'Choose one of the answers.' }));
  const extra = Object.keys(answers).filter((k) => !design.segmentQuestions.some((q) => q.id === k));
  if (issues.length || extra.length) {
    throw refusal(design.language, 422, 'validation_failed', 'invalidAnswers', {}, [...issues, ...extra.map((k) => ({ path: `segmentAnswers.${k}`, message: 'Not a question of this study.' }))]);
  }
  return answers;
}

const needsQuestions = (design: StudyDesign, r: RespondentProgress) => design.segmentQuestions.some((q) => !(q.id in r.segmentAnswers));

/** The respondent's next screens. */
export async function stateOf(db: EntityManager, link: RespondentLinkWithStudy, r: RespondentProgress): Promise<FlowState> {
  const answered = r.plan.mode === 'adaptive' && r.state !== 'completed' ? await answeredHistory(db, r.id) : [];
  return flowState({
    design: link.design, seed: r.seed, plan: r.plan, answered, answeredCount: r.answeredCount,
    needsQuestions: needsQuestions(link.design, r), completed: r.state === 'completed',
    redirectUrl: r.state === 'completed' ? completionRedirect(link.design, r.pid) : null,
    pictureUrl: link.design.itemPictureId ? respondentUrls(link.token).picture : null,
    referenceCode: r.referenceCode,
  });
}

/** What the start route knows about the request besides its body. */
export interface StartClient {
  /** The client's address (clientAddress() in lib/server/platform/client-address.ts): per-link start limit. */
  address?: string;
  /** A cookie of the request by name (the panel-id signature kept by the take-part page). */
  cookie?: (name: string) => string | null;
  /** The language of a refusal no study stands behind (an unknown link): from the request's Accept-Language. */
  language?: Language;
}

/**
 * Resume (by token) or create a respondent; refuses when no seat or quota is left. A new start
 * counts against the link's limit per address (RATE_LIMIT_STARTS_PER_LINK_ADDRESS per 10 min,
 * the time a start holds a seat without answering — lib/server/billing/seat-holds.ts), so one
 * address cannot hold a workspace's seats through a link. Panel ids: ./panel-ids.ts.
 * `resumeTokenFor` names the study, so the caller can read the study's resume cookie.
 */
export async function startRespondent(token: string, input: StartInput, resumeTokenFor: (studyId: string) => string | null, client: StartClient = {}): Promise<StartReply & { studyId: string }> {
  const db = await em();
  const link = await openLink(db, token, client.language);
  const language = link.design.language;
  const resumeToken = resumeTokenFor(link.studyId);
  const pid = link.acceptsPid ? checkedPid(input.pid, language) : null;
  const hasAnswers = Object.keys(input.segmentAnswers).length > 0;
  const answers = hasAnswers ? validSegmentAnswers(link.design, input.segmentAnswers) : {};

  const existing = await findByResume(db, link.studyId, resumeToken);
  if (existing) return resume(db, link, existing, answers);
  requireSignedPid(link.pidSecret, pid, client.cookie?.(pidProofCookieName(link.linkId)), language);
  if (pid && (await findByPid(db, link.studyId, pid))) throw PID_TAKEN(language);
  await limit('respondent-start-link-address', `${link.linkId}|${client.address ?? 'unknown'}`);

  const seed = newSeed();
  const fresh = newResumeToken();
  const admitted = await withSeatLock(db, link.workspaceId, (tx) => admitRespondent(tx, {
    id: randomUUID(), workspaceId: link.workspaceId, studyId: link.studyId, linkId: link.linkId, quota: link.quota, pid,
    resumeToken: fresh, referenceCode: newReferenceCode(), seed, segmentAnswers: answers, plan: planFor(link.design, seed),
  }));
  // Two starts with the same panel id at once: the unique (study, pid) lets one in; the other gets the one refusal.
  if (admitted === 'pid_taken') throw PID_TAKEN(language);
  if (admitted === 'full') throw FULL(language);
  const created = (await findByResume(db, link.studyId, fresh))!;
  return { ...(await stateOf(db, link, created)), resumeToken: fresh, studyId: link.studyId };
}

async function resume(db: EntityManager, link: RespondentLinkWithStudy, r: RespondentProgress & { resumeToken: string }, answers: Record<string, string>) {
  if (r.state === 'completed' && r.pid) throw DONE(link.design.language);
  if (Object.keys(answers).length && needsQuestions(link.design, r) && r.answeredCount === 0) {
    await sql(db, 'update respondent set segment_answers = ?::jsonb, last_seen_at = now() where id = ?', [JSON.stringify(answers), r.id]);
    r = { ...r, segmentAnswers: answers };
  }
  return { ...(await stateOf(db, link, r)), resumeToken: r.resumeToken, studyId: link.studyId };
}
