import 'server-only';
// Respondents who finished elsewhere, written in bulk together with their trials: a response
// import (state "imported") and the simulated demo and test studies (state "completed"). The
// one place that maps such a respondent and its trials onto rows; the columns come from the
// Respondent and Trial entities (lib/server/db/bulk.ts). Runs in the caller's transaction.
import { randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { RequiredEntityData } from '@mikro-orm/core';
import { Respondent, type IRespondent } from '@/entities/respondent';
import { Trial, type ITrial, type TRIAL_KINDS } from '@/entities/trial';
import { insertRows } from '@/lib/server/db/bulk';
import { randomToken } from '@/lib/server/platform/tokens';

export interface FinishedTrial {
  idx: number;
  kind: (typeof TRIAL_KINDS)[number];
  basePrice: number;
  discount: number;
  answer: 0 | 1;
  /** 0 when the source did not record it. */
  responseMs: number;
  /** What the screen showed (Trial.shown): simulated trials carry the rung drawn and the price shown. */
  shown?: Record<string, unknown> | null;
}

export interface FinishedRespondent {
  /** The label the respondent had in an imported file; null for simulated ones. */
  externalRef: string | null;
  linkId?: string | null;
  seed?: number;
  segmentAnswers: Record<string, string>;
  attentionPassed: boolean | null;
  startedAt: Date;
  completedAt: Date;
  trials: FinishedTrial[];
}

export async function insertFinishedRespondents(
  tx: EntityManager,
  { workspaceId, studyId, state, respondents }: { workspaceId: string; studyId: string; state: 'completed' | 'imported'; respondents: FinishedRespondent[] },
): Promise<{ respondents: number; trials: number }> {
  const respondentRows: Partial<RequiredEntityData<IRespondent>>[] = [];
  const trialRows: Partial<RequiredEntityData<ITrial>>[] = [];
  for (const r of respondents) {
    const id = randomUUID();
    respondentRows.push({
      id, link: r.linkId ?? null, resumeToken: randomToken(), externalRef: r.externalRef,
      seed: r.seed ?? 0, segmentAnswers: r.segmentAnswers, attentionPassed: r.attentionPassed, answeredCount: r.trials.length,
      startedAt: r.startedAt, lastSeenAt: r.completedAt, completedAt: r.completedAt,
    });
    for (const t of r.trials) {
      trialRows.push({
        respondent: id, idx: t.idx, kind: t.kind, basePrice: t.basePrice, discount: t.discount,
        answer: t.answer, responseMs: t.responseMs, shown: t.shown ?? null, clientId: randomUUID(), answeredAt: r.completedAt,
      });
    }
  }
  await insertRows(tx, Respondent, respondentRows, { workspace: workspaceId, study: studyId, state });
  await insertRows(tx, Trial, trialRows, { study: studyId });
  return { respondents: respondentRows.length, trials: trialRows.length };
}
