import 'server-only';
import { Study } from '@/entities/study';
import { StoredDesignError, readDesign } from '@/lib/schemas/study.schema';
import { STUDY_STATE_LABELS, TRANSITIONS, type StudyAction, type StudyStateName } from '@/lib/study-states';
import type { EntityManager } from '@mikro-orm/postgresql';
import { em } from '@/lib/server/db/orm';
import { sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import { recordAudit } from '@/lib/server/team/audit';
import { loadStudy, toDetail, type StudyDetail } from './studies';
import type { WorkspaceContext } from '@/lib/server/team/membership';

// A study's lifecycle: launch, pause, resume, close (the moves and labels are in
// lib/study-states.ts, shared with the buttons). A move that the current state does not allow is
// a 409; so is a move that lost a race, because the UPDATE is guarded by the state it started
// from (a double click or two analysts cannot apply it twice). Launch re-reads the design with
// the live study's limits, so nothing unrunnable goes live. Each move writes its audit event
// (study.launched, …). Tests: tests/integration/studies-lifecycle.test.ts.

// Respondents' data at launch (issue 13, point 5): the study must say who runs it (the contact
// line shown with the consent text — a 422 on the field `contact` otherwise), and the
// workspace's retention is frozen into the study, so what the consent screen promised is what
// the daily purge keeps to even if the setting changes later (lib/server/studies/retention.ts).
async function launchDataProtection(db: EntityManager, workspaceId: string, design: { contact?: string }): Promise<{ retentionDays: number }> {
  if ((design.contact ?? '').trim().length < 5) {
    throw new AppError(422, 'validation_failed', 'Say who runs this study before launching it.', [
      { path: 'contact', message: 'Say who runs this study and how respondents can reach you; it is shown with the consent text.' },
    ]);
  }
  const ws = await sqlOne<{ retention_days: number }>(db, 'select retention_days from workspace where id = ?', [workspaceId]);
  return { retentionDays: Number(ws!.retention_days) };
}

const AUDIT_ACTIONS: Record<StudyAction, string> = { launch: 'study.launched', pause: 'study.paused', resume: 'study.resumed', close: 'study.closed' };

/** Moves a study along draft → live ⇄ paused → closed; any other move is a 409. */
export async function changeStudyState(ctx: WorkspaceContext, id: string, action: StudyAction): Promise<StudyDetail> {
  const db = await em();
  const study = await loadStudy(db, ctx.workspace.id, id);
  const t = TRANSITIONS[action];
  if (!t.from.includes(study.state)) {
    throw new AppError(409, 'conflict', `A ${STUDY_STATE_LABELS[study.state as StudyStateName].toLowerCase()} study cannot be ${action === 'launch' ? 'launched' : action === 'close' ? 'closed' : action === 'pause' ? 'paused' : 'resumed'}.`);
  }
  const now = new Date();
  const changes: Partial<{ state: typeof t.to; launchedAt: Date; closedAt: Date; updatedAt: Date; retentionDays: number }> = { state: t.to, updatedAt: now };
  if (action === 'launch') {
    // Read as a live study's design is read: with every limit of the builder (a draft copied
    // from an import may not meet them yet), so nothing unrunnable goes live.
    try {
      readDesign(study.design, t.to);
    } catch (err) {
      if (err instanceof StoredDesignError) throw new AppError(409, 'conflict', 'The design is not complete enough to launch; edit the draft first.', err.issues);
      throw err;
    }
    changes.launchedAt = now;
    Object.assign(changes, await launchDataProtection(db, ctx.workspace.id, study.design));
  }
  if (action === 'close') changes.closedAt = now;
  // Guarded by the current state so two clicks (or two analysts) cannot apply a move twice.
  const n = await db.nativeUpdate(Study, { id: study.id, workspace: ctx.workspace.id, state: { $in: [...t.from] } }, changes);
  if (!n) throw new AppError(409, 'conflict', 'The study changed state meanwhile; reload the page.');
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: AUDIT_ACTIONS[action], target: study.name, detail: { studyId: study.id, from: study.state, to: t.to } });
  return toDetail(await db.findOneOrFail(Study, { id: study.id }, { refresh: true }));
}
