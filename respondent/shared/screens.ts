import type { StudyDesign } from '@/lib/schemas/study.schema';
import { nextAdaptiveTrial, type AnsweredTrial } from './adaptive';
import { planLength } from './plan';
import type { FlowState, FlowStudy, PlannedTrial, PublicTrial, TrialPlan } from './types';

export function flowStudy(design: StudyDesign, pictureUrl: string | null = null): FlowStudy {
  return {
    task: design.task,
    itemName: design.itemName,
    pictureUrl,
    currency: design.currency,
    locale: design.locale,
    viewMs: design.viewMs,
    tripMinutes: design.tripMinutes,
    contact: design.contact,
  };
}

/** The browser's view of a planned trial: catch trials look like any other trial. */
export function toPublic(design: StudyDesign, plan: TrialPlan, t: PlannedTrial, idx: number): PublicTrial {
  if (t.kind === 'attention') {
    const a = design.attentionCheck;
    return { idx, kind: 'attention', label: '', base: 0, price: 0, attention: { question: a.question, options: a.options } };
  }
  const shelfLabel = t.shelfItem !== undefined ? plan.shelf[t.shelfItem]?.label : undefined;
  const p: PublicTrial = { idx, kind: t.kind === 'practice' ? 'practice' : 'trial', label: shelfLabel ?? design.itemName, base: t.basePrice, price: t.price };
  if (t.lowerSide) p.side = t.lowerSide;
  if (t.shelfItem !== undefined) p.shelfItem = t.shelfItem;
  if (t.refresh) p.refresh = true;
  return p;
}

/** The planned trial expected at `idx` (answered = the trials already stored, in idx order). */
export function expectedTrial(design: StudyDesign, seed: number, plan: TrialPlan, answered: AnsweredTrial[], idx: number): PlannedTrial | null {
  if (plan.mode === 'fixed') return plan.trials[idx] ?? null;
  if (idx !== answered.length) return null;
  return nextAdaptiveTrial(design, seed, plan, answered);
}

/** Upcoming screens from the next unanswered trial: all of them for fixed plans, one for adaptive. */
export function upcomingTrials(design: StudyDesign, seed: number, plan: TrialPlan, answered: AnsweredTrial[], answeredCount: number): PublicTrial[] {
  if (plan.mode === 'fixed') return plan.trials.slice(answeredCount).map((t, i) => toPublic(design, plan, t, answeredCount + i));
  const next = nextAdaptiveTrial(design, seed, plan, answered);
  return next ? [toPublic(design, plan, next, answered.length)] : [];
}

export function flowState(args: {
  design: StudyDesign;
  seed: number;
  plan: TrialPlan;
  answered: AnsweredTrial[];
  answeredCount: number;
  needsQuestions: boolean;
  completed: boolean;
  redirectUrl: string | null;
  pictureUrl?: string | null;
  referenceCode?: string | null;
}): FlowState {
  const { design, plan } = args;
  const upcoming = args.completed ? [] : upcomingTrials(design, args.seed, plan, args.answered, args.answeredCount);
  const phase = args.completed ? 'completed' : args.needsQuestions ? 'questions' : upcoming.length ? 'trials' : 'done';
  const total = plan.mode === 'fixed' ? planLength(plan) : Math.max(args.answeredCount + upcoming.length, upcoming.length ? planLength(plan) : args.answeredCount);
  return {
    phase,
    study: flowStudy(design, args.pictureUrl ?? null),
    shelf: plan.shelf.map((s) => ({ label: s.label, price: s.price })),
    upcoming,
    adaptive: plan.mode === 'adaptive',
    answered: args.answeredCount,
    total,
    practice: (plan.mode === 'fixed' ? plan.trials : plan.slots).filter((t) => t.kind === 'practice').length,
    redirectUrl: args.redirectUrl,
    referenceCode: args.referenceCode ?? null,
  };
}

/** Completion redirect for panel vendors, with the panel id passed back when there is one. */
export function completionRedirect(design: StudyDesign, pid: string | null): string | null {
  if (!design.redirectUrl) return null;
  if (!pid) return design.redirectUrl;
  const u = new URL(design.redirectUrl);
  u.searchParams.set('pid', pid);
  return u.toString();
}
