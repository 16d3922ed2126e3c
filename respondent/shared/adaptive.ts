import { nextStaircaseTrial, type StaircaseConfig, type StaircaseTrial } from '@/lib/psychometrics/staircase';
import type { StudyDesign } from '@/lib/schemas/study.schema';
import { planRng, pricedTrial } from './plan';
import type { AdaptivePlan, PlannedTrial } from './types';

/** An answered trial as the adaptive resolver needs it (in answer order). */
export interface AnsweredTrial {
  kind: PlannedTrial['kind'];
  slot: number;
  basePrice: number;
  answer: number;
}

/**
 * Interleaved staircases per base price on the log-discount scale: start at the middle rung,
 * step by the ladder's mean log spacing, bounded by the ladder's ends.
 */
export function staircaseConfig(design: StudyDesign): StaircaseConfig {
  const l = design.ladder;
  return {
    basePrices: design.basePrices,
    rule: design.adaptive.rule,
    startDiscount: l[Math.floor((l.length - 1) / 2)],
    stepLog: Math.log(l[l.length - 1] / l[0]) / (l.length - 1),
    minDiscount: l[0],
    maxDiscount: l[l.length - 1],
    maxReversals: design.adaptive.reversals,
    maxTrialsPerBase: design.adaptive.trialsPerBase,
  };
}

/**
 * The next screen of an adaptive plan given what was answered so far, or null when done.
 * Test slots take the staircase's next placement (base chosen with an rng seeded by the slot,
 * so a replay gives the same trial); once every staircase has stopped, remaining test slots are
 * skipped. The staircase runs on nominal levels; the trial records the discount actually shown.
 */
export function nextAdaptiveTrial(design: StudyDesign, seed: number, plan: AdaptivePlan, answered: AnsweredTrial[]): PlannedTrial | null {
  const config = staircaseConfig(design);
  const history: StaircaseTrial[] = answered
    .filter((a) => a.kind === 'test')
    .map((a) => ({ basePrice: a.basePrice, discount: 0, response: a.answer === 1 ? 1 : 0 }));
  const from = answered.length ? answered[answered.length - 1].slot + 1 : 0;
  for (let s = from; s < plan.slots.length; s++) {
    const slot = plan.slots[s];
    if (!('open' in slot)) return { ...slot, slot: s };
    const next = nextStaircaseTrial(config, history, planRng(design, seed, `:slot${s}`));
    if (!next) continue;
    const t = pricedTrial(design, 'test', next.basePrice, next.discount, plan.shelf);
    return { ...t, lowerSide: slot.lowerSide, refresh: slot.refresh, slot: s };
  }
  return null;
}
