import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { readDesign, type StudyDesign } from '@/lib/schemas/study.schema';
import type { TrialPlan } from '@/respondent/shared/types';
import { sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';

/** What never changes for a respondent once started: plan, seed, frozen design. Cached per process. */
export interface RespondentContext {
  id: string;
  studyId: string;
  workspaceId: string;
  linkToken: string | null;
  seed: number;
  pid: string | null;
  plan: TrialPlan;
  design: StudyDesign;
}

const MAX_CACHED = 5000;
const holder = globalThis as unknown as { __respondentContexts?: Map<string, RespondentContext> };
const cache = (holder.__respondentContexts ??= new Map());

/**
 * The respondent behind a resume token, for the answer and complete routes. The answer path is
 * the hot one, so the immutable part is looked up with one select and then kept in memory
 * (oldest entries dropped first); state that changes is read by the write statement itself.
 */
export async function respondentContext(db: EntityManager, linkToken: string, resumeToken: string | null): Promise<RespondentContext> {
  // Made only when thrown: an Error captures a stack trace, a real cost on the answer path.
  const missing = () => new AppError(404, 'not_found', 'We could not find your answers. Open the study link again.');
  if (!resumeToken || resumeToken.length > 64) throw missing();
  let ctx = cache.get(resumeToken);
  if (!ctx) {
    const r = await sqlOne(
      db,
      `select r.id, r.seed, r.plan, r.pid, r.study_id, r.workspace_id, s.state, s.design, l.token as link_token
         from respondent r join study s on s.id = r.study_id left join respondent_link l on l.id = r.link_id
        where r.resume_token = ? and r.plan is not null`,
      [resumeToken],
    );
    if (!r) throw missing();
    ctx = {
      id: String(r.id), studyId: String(r.study_id), workspaceId: String(r.workspace_id),
      linkToken: (r.link_token as string | null) ?? null, seed: Number(r.seed), pid: (r.pid as string | null) ?? null,
      plan: r.plan as TrialPlan, design: readDesign(r.design, String(r.state)),
    };
    if (cache.size >= MAX_CACHED) cache.delete(cache.keys().next().value!);
    cache.set(resumeToken, ctx);
  }
  if (ctx.linkToken !== linkToken) throw missing();
  return ctx;
}
