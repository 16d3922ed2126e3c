// How many completes would tell whether one percentage rule fits: the planner's search behind
// "the data cannot tell yet … about N completes would". The count it returns must be the
// smallest that brings the simulated Weber-slope interval under TELL_WIDTH (never below the
// minimum of shoppers), and a design that spans a narrower price range must need more.
import { describe, expect, it } from 'vitest';
import { planDesign } from '@/lib/psychometrics/planner';
import { completesToTellWeber, WEBER_PLAN_SIMULATIONS, type WeberPlanInput } from '@/lib/server/analysis/weber-plan';
import { MIN_SHOPPERS_TO_TELL, TELL_WIDTH } from '@/lib/results-text';
import { FIT_SEED } from '@/lib/server/analysis/study-fit';

// An invented pick-task design (own example, no published source): two base prices, six rungs.
const design = (basePrices: number[]): WeberPlanInput => ({
  basePrices, rungs: [0.02, 0.04, 0.06, 0.09, 0.13, 0.2], repetitions: 2, task: 'pick',
  alpha: basePrices.map((b) => Math.log(0.08) - 0.2 * Math.log(b / basePrices[0])), beta: 2.5, lapse: 0.02, guess: 0.5,
});
const widthAt = (input: WeberPlanInput, n: number) => planDesign({ ...input, respondents: n, simulations: WEBER_PLAN_SIMULATIONS, seed: FIT_SEED }).weberSlopeWidth!;

describe('completes that would tell the Weber verdict', () => {
  it('is the smallest count whose simulated Weber-slope interval is at most TELL_WIDTH wide', () => {
    const input = design([2.49, 12.9]);
    const n = completesToTellWeber(input)!;
    expect(n).toBeGreaterThanOrEqual(MIN_SHOPPERS_TO_TELL);
    expect(widthAt(input, n)).toBeLessThanOrEqual(TELL_WIDTH);
    if (n > MIN_SHOPPERS_TO_TELL) expect(widthAt(input, n - 1)).toBeGreaterThan(TELL_WIDTH);
    expect(completesToTellWeber(input)).toBe(n); // seeded: the same answer every time
  }, 60_000);

  it('a narrower price range needs more completes', () => {
    const wide = completesToTellWeber(design([2.49, 49]))!;
    const narrow = completesToTellWeber(design([9.99, 12.9]));
    expect(narrow === null || narrow > wide).toBe(true);
  }, 60_000);
});
