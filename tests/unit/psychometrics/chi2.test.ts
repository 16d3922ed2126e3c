import { describe, expect, it } from 'vitest';
import { chiSquareCritical, chiSquareP } from '@/lib/psychometrics/chi2';

// Upper-tail critical values: NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.6.7.4.
const table = [
  { df: 1, alpha: 0.05, value: 3.841 },
  { df: 2, alpha: 0.05, value: 5.991 },
  { df: 6, alpha: 0.05, value: 12.592 },
  { df: 3, alpha: 0.01, value: 11.345 },
];

describe('χ² tail probabilities (NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.6.7.4)', () => {
  for (const { df, alpha, value } of table) {
    it(`P(χ²(${df}) ≥ ${value}) = ${alpha}`, () => {
      expect(chiSquareP(value, df)!).toBeCloseTo(alpha, 4);
      expect(chiSquareCritical(alpha, df)).toBeCloseTo(value, 2);
    });
  }
  it('has nothing to test at df 0 and gives 1 at χ² = 0', () => {
    expect(chiSquareP(3, 0)).toBeNull();
    expect(chiSquareP(0, 4)).toBe(1);
  });
});
