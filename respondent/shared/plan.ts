import { createRng, type Rng } from '@/lib/psychometrics/random';
import { trialsPerRespondent, type StudyDesign } from '@/lib/schemas/study.schema';
import { minorDigits, shownDiscount, shownPrice } from './price';
import { buildShelf, shelfIndexOf } from './shelf';
import type { OpenSlot, PlannedTrial, ShelfItem, Side, TrialPlan } from './types';

/** Spot the saving: the shelf is shown again after this many trials (common practice, no source). */
export const SPOT_BLOCK = 12;
/** Practice trials use a deep, easy discount: at least 30 % (common practice, no source). */
export function practiceDepth(design: StudyDesign): number {
  return Math.min(0.6, Math.max(0.3, design.ladder[design.ladder.length - 1]));
}

export function planRng(design: StudyDesign, seed: number, salt = ''): Rng {
  return createRng(`${design.orderSeed}:${seed}${salt}`);
}

export function pricedTrial(design: StudyDesign, kind: PlannedTrial['kind'], base: number, depth: number, shelf: ShelfItem[]): PlannedTrial {
  const price = depth > 0 ? shownPrice(base, depth, design.priceEnding, minorDigits(design.currency)) : base;
  const t: PlannedTrial = { kind, basePrice: base, rung: kind === 'catch' ? null : depth, price, discount: depth > 0 ? shownDiscount(base, price) : 0 };
  const si = shelfIndexOf(shelf, base);
  if (si !== undefined) t.shelfItem = si;
  return t;
}

/** Exactly balanced sides (±1 when odd), in random order. */
function balancedSides(n: number, rng: Rng): Side[] {
  const sides: Side[] = Array.from({ length: n }, (_, i) => (i % 2 === 0 ? 'left' : 'right'));
  return rng.shuffle(sides);
}

function catchTrials(design: StudyDesign, n: number, shelf: ShelfItem[]): PlannedTrial[] {
  return Array.from({ length: n }, (_, i) => pricedTrial(design, 'catch', design.basePrices[i % design.basePrices.length], 0, shelf));
}

const ATTENTION: PlannedTrial = { kind: 'attention', basePrice: 0, rung: null, price: 0, discount: 0 };

/**
 * A respondent's trial plan from the design and their seed: practice first, then test and
 * catch trials in random order with the attention check in the middle. Adaptive designs get
 * open test slots that the staircase fills as answers arrive. Pure and deterministic.
 */
export function generatePlan(design: StudyDesign, seed: number): TrialPlan {
  const rng = planRng(design, seed);
  const shelf = buildShelf(design, rng);
  const counts = trialsPerRespondent(design);
  const bases = design.basePrices;

  const practice = Array.from({ length: design.practiceTrials }, (_, i) =>
    pricedTrial(design, 'practice', bases[(i * 7 + 3) % bases.length], practiceDepth(design), shelf));

  let main: (PlannedTrial | OpenSlot)[];
  if (design.adaptive.enabled) {
    main = Array.from({ length: counts.test }, (): OpenSlot => ({ kind: 'test', open: true }));
  } else {
    main = [];
    for (const b of bases) for (const d of design.ladder) for (let r = 0; r < design.repetitions; r++) main.push(pricedTrial(design, 'test', b, d, shelf));
  }
  main.push(...catchTrials(design, counts.catch, shelf));
  rng.shuffle(main);

  if (design.task === 'pick') {
    balancedSides(practice.length, rng).forEach((s, i) => (practice[i].lowerSide = s));
    balancedSides(main.length, rng).forEach((s, i) => (main[i].lowerSide = s));
  }
  if (design.task === 'spot') main.forEach((t, i) => { if (i > 0 && i % SPOT_BLOCK === 0) t.refresh = true; });
  if (design.attentionCheck.enabled) main.splice(Math.floor(main.length / 2), 0, { ...ATTENTION });

  const all = [...practice, ...main];
  if (design.adaptive.enabled) return { version: 1, mode: 'adaptive', shelf, slots: all.map((t, i) => ({ ...t, slot: i })) };
  return { version: 1, mode: 'fixed', shelf, trials: all as PlannedTrial[] };
}

/** Screens in the plan (for adaptive plans an upper bound: staircases may stop early). */
export function planLength(plan: TrialPlan): number {
  return plan.mode === 'fixed' ? plan.trials.length : plan.slots.length;
}
