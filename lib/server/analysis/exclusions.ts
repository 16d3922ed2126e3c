import 'server-only';
import { Study } from '@/entities/study';
import type { ExclusionRuleId, ExclusionRules } from '@/lib/schemas/exclusions.schema';
import { RULE_NOT_FOR, RULE_ORDER, ruleApplies } from '@/lib/exclusions';
import { recordAudit } from '@/lib/server/team/audit';
import { em } from '@/lib/server/db/orm';
import { notFoundError } from '@/lib/server/http/errors';
import type { WorkspaceContext } from '@/lib/server/team/membership';
import { findStudy, respondentRows, screen } from './cells';

// A study's exclusion rules (attention check, false alarms on catch trials, speeders,
// straight-lining; judged by lib/exclusions.ts, each only on the tasks where it means
// something) and how many finished respondents each rule removes, for the exclusions panel;
// `notForTask` gives, per rule without meaning for the study's task, the reason in words (such a
// rule never excludes there, whatever its switch says). Viewers read, analysts save (the routes check); a save
// writes a `study.exclusions_changed` audit event. The rules are null until first saved and read
// with their defaults then. Tests: tests/integration/exclusions.test.ts.

export async function getExclusions(ctx: WorkspaceContext, studyId: string) {
  const db = await em();
  const study = await findStudy(db, ctx.workspace.id, studyId);
  const { counts } = screen(await respondentRows(study.id), study.exclusionRules);
  const notForTask: Partial<Record<ExclusionRuleId, string>> = {};
  for (const id of RULE_ORDER) if (!ruleApplies(id, study.task)) notForTask[id] = RULE_NOT_FOR[id][study.task] ?? 'This rule has no meaning for the study’s task.';
  return { rules: study.exclusionRules, counts, dataVersion: study.dataVersion, task: study.task, notForTask };
}

/**
 * Rules are part of every fit's cache key, so saving them needs no data-version bump: the
 * next results request finds no cached fit for the new rules and queues one.
 */
export async function saveExclusionRules(ctx: WorkspaceContext, studyId: string, rules: ExclusionRules) {
  const db = await em();
  const s = await db.findOne(Study, { id: studyId, workspace: ctx.workspace.id });
  if (!s) throw notFoundError('That study');
  s.exclusionRules = rules;
  await db.flush();
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'study.exclusions_changed', target: s.id, detail: { rules } });
  return getExclusions(ctx, studyId);
}
