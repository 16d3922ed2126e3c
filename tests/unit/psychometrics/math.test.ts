import { describe, expect, it } from 'vitest';
import { geometricMean, median, quantileSorted } from '@/lib/psychometrics/math';

describe('small statistics of the engine', () => {
  it('median of even and odd lists, unsorted input left alone', () => {
    const values = [3, 1, 2];
    expect(median(values)).toBe(2);
    expect(values).toEqual([3, 1, 2]);
    expect(median([4, 1, 2, 3])).toBe(2.5);
    expect(median([])).toBeNaN();
  });
  it('quantiles interpolate between order statistics (R type 7)', () => {
    expect(quantileSorted([1, 2, 3, 4], 0.25)).toBeCloseTo(1.75, 12);
    expect(quantileSorted([10], 0.9)).toBe(10);
  });
  it('geometric mean: the centre on a log axis', () => {
    expect(geometricMean([1, 100])).toBeCloseTo(10, 12);
    expect(geometricMean([2.49, 2.49])).toBeCloseTo(2.49, 12);
  });
});
