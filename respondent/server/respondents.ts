import 'server-only';
// respondent/server: the respondent runtime's server side, server-only. The route handlers under
// app/r/[token] stay thin and call in here: links and their refusals (link.ts), starting and
// resuming respondents (this module), answers (answers.ts), completing with its one seat
// (complete.ts), and the HTML documents with the server-rendered first screen (document.tsx).
// This module: who a respondent is, how one starts or resumes, and which screens come next.
import { randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { StudyDesign } from '@/lib/schemas/study.schema';
import { completionRedirect, flowState } from '@/respondent/shared/screens';
import type { FlowState, TrialPlan } from '@/respondent/shared/types';
import type { StartInput, StartReply } from '@/respondent/shared/start.schema';
import { respondentUrls } from '@/respondent/shared/urls';
import { em } from '@/lib/server/db/orm';
import { AppError } from '@/lib/server/http/errors';
import { openLink, type RespondentLinkWithStudy } from './link';
import { lockWorkspaceSeats } from '@/lib/server/billing/seat-ledger';
import { sql } from '@/lib/server/db/sql';
import { quotaAvailable, seatAvailableForStart } from './admission';
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
}

const FULL = () => new AppError(409, 'study_full', 'This study is full. Thank you for your interest.');
const DONE = () => new AppError(409, 'already_taken_part', 'You have already taken part in this study. Thank you!');
// A panel id is not a secret (panels often number their members): it never hands out another
// respondent's resume token, plan or answers. The device that started keeps its resume token.
const PID_IN_USE = () => new AppError(409, 'already_taken_part', 'This panel id has already started this study on another device or browser. Continue there to finish.');

function toRow(r: Record<string, unknown>): RespondentProgress {
  return {
    id: String(r.id), pid: (r.pid as string | null) ?? null, seed: Number(r.seed), state: String(r.state),
    plan: r.plan as TrialPlan, answeredCount: Number(r.answered_count), segmentAnswers: (r.segment_answers as Record<string, string>) ?? {},
  };
}

const SELECT = 'select id, pid, seed, state, plan, answered_count, segment_answers from respondent';

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
    throw new AppError(422, 'validation_failed', 'Some answers are not valid.', [...issues, ...extra.map((k) => ({ path: `segmentAnswers.${k}`, message: 'Not a question of this study.' }))]);
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
  });
}

/**
 * Resume (by token or panel id) or create a respondent; refuses when no seat or quota is left.
 * `resumeTokenFor` names the study, so the caller can read the study's resume cookie.
 */
export async function startRespondent(token: string, input: StartInput, resumeTokenFor: (studyId: string) => string | null): Promise<StartReply & { studyId: string }> {
  const db = await em();
  const link = await openLink(db, token);
  const resumeToken = resumeTokenFor(link.studyId);
  const pid = link.acceptsPid ? (input.pid ?? null) : null;
  const hasAnswers = Object.keys(input.segmentAnswers).length > 0;
  const answers = hasAnswers ? validSegmentAnswers(link.design, input.segmentAnswers) : {};

  const existing = await findByResume(db, link.studyId, resumeToken);
  if (existing) return resume(db, link, existing, answers);
  if (pid) await refuseKnownPid(db, link.studyId, pid);

  const seed = newSeed();
  const plan = planFor(link.design, seed);
  const fresh = newResumeToken();
  try {
    await db.transactional(async (tx) => {
      await lockWorkspaceSeats(tx, link.workspaceId);
      if (!(await seatAvailableForStart(tx, link.workspaceId)) || !(await quotaAvailable(tx, link.linkId, link.quota))) throw FULL();
      await sql(
        tx,
        `insert into respondent (id, workspace_id, study_id, link_id, pid, resume_token, seed, state, segment_answers, plan, answered_count, started_at, last_seen_at)
         values (?, ?, ?, ?, ?, ?, ?, 'started', ?::jsonb, ?::jsonb, 0, now(), now())`,
        [randomUUID(), link.workspaceId, link.studyId, link.linkId, pid, fresh, seed, JSON.stringify(answers), JSON.stringify(plan)],
      );
    });
  } catch (err) {
    // Two starts with the same panel id at once: the unique (study, pid) lets one in; the other is refused.
    if (pid && (err as { code?: string }).code === '23505') await refuseKnownPid(db, link.studyId, pid);
    throw err;
  }
  const created = (await findByResume(db, link.studyId, fresh))!;
  return { ...(await stateOf(db, link, created)), resumeToken: fresh, studyId: link.studyId };
}

/** A start naming a panel id that already took part (or is taking part) without its resume token. */
async function refuseKnownPid(db: EntityManager, studyId: string, pid: string) {
  const known = await findByPid(db, studyId, pid);
  if (known) throw known.state === 'completed' ? DONE() : PID_IN_USE();
}

async function resume(db: EntityManager, link: RespondentLinkWithStudy, r: RespondentProgress & { resumeToken: string }, answers: Record<string, string>) {
  if (r.state === 'completed' && r.pid) throw DONE();
  if (Object.keys(answers).length && needsQuestions(link.design, r) && r.answeredCount === 0) {
    await sql(db, 'update respondent set segment_answers = ?::jsonb, last_seen_at = now() where id = ?', [JSON.stringify(answers), r.id]);
    r = { ...r, segmentAnswers: answers };
  }
  return { ...(await stateOf(db, link, r)), resumeToken: r.resumeToken, studyId: link.studyId };
}
