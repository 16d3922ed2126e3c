import type { StudyDesign } from '@/lib/schemas/study.schema';
import type { AnsweredTrial } from '@/respondent/shared/adaptive';
import { generatePlan } from '@/respondent/shared/plan';
import { expectedTrial, flowState, toPublic } from '@/respondent/shared/screens';
import type { Messages } from '@/respondent/messages/format';
import type { FlowDriver } from './driver';

/** The preview's driver: a plan generated in the browser, answers kept in memory, no network. */
export function localDriver(design: StudyDesign, seed: number, m: Messages): FlowDriver {
  const plan = generatePlan(design, seed);
  const answered: AnsweredTrial[] = [];
  return {
    async start() {
      return { ok: true, data: flowState({ design, seed, plan, answered, answeredCount: 0, needsQuestions: false, completed: false, redirectUrl: null }) };
    },
    async sendAnswers(batch) {
      const acknowledged: string[] = [];
      for (const a of [...batch].sort((x, y) => x.idx - y.idx)) {
        if (a.idx < answered.length) { acknowledged.push(a.clientId); continue; }
        const t = expectedTrial(design, seed, plan, answered, a.idx);
        if (!t) return { ok: false, retry: false, code: 'validation_failed', message: m.stop.failed };
        answered.push({ kind: t.kind, slot: t.slot ?? a.idx, basePrice: t.basePrice, answer: a.answer });
        acknowledged.push(a.clientId);
      }
      const reply = { acknowledged, conflicts: [], answered: answered.length };
      if (plan.mode === 'fixed') return { ok: true, data: reply };
      const next = expectedTrial(design, seed, plan, answered, answered.length);
      return { ok: true, data: { ...reply, next: next ? toPublic(design, plan, next, answered.length) : null } };
    },
    storageKey: () => null,
    async complete() {
      return { ok: true, data: { ok: true, redirectUrl: null } };
    },
  };
}
