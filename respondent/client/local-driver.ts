import type { StudyDesign } from '@/lib/schemas/study.schema';
import type { AnsweredTrial } from '@/respondent/shared/adaptive';
import { generatePlan } from '@/respondent/shared/plan';
import { expectedTrial, flowState, toPublic } from '@/respondent/shared/screens';
import type { FlowDriver } from './driver';

/** The preview's driver: a plan generated in the browser, answers kept in memory, no network. */
export function localDriver(design: StudyDesign, seed: number): FlowDriver {
  const plan = generatePlan(design, seed);
  const answered: AnsweredTrial[] = [];
  return {
    async start() {
      return { ok: true, data: flowState({ design, seed, plan, answered, answeredCount: 0, needsQuestions: false, completed: false, redirectUrl: null }) };
    },
    async answer(a) {
      const t = expectedTrial(design, seed, plan, answered, a.idx);
      if (!t) return { ok: false, retry: false, code: 'validation_failed', message: 'No such trial.' };
      answered.push({ kind: t.kind, slot: t.slot ?? a.idx, basePrice: t.basePrice, answer: a.answer });
      if (plan.mode === 'fixed') return { ok: true, data: {} };
      const next = expectedTrial(design, seed, plan, answered, answered.length);
      return { ok: true, data: { next: next ? toPublic(design, plan, next, answered.length) : null } };
    },
    async complete() {
      return { ok: true, data: { ok: true, redirectUrl: null } };
    },
  };
}
