import { describe, expect, it } from 'vitest';
import { fitPlainLogistic } from '@/lib/psychometrics/plain-logistic';

// Bliss (1935) beetle mortality as tabulated by Dobson & Barnett, An Introduction to
// Generalized Linear Models (3rd ed., 2008), Table 7.2; x = log10 dose.
const dose = [1.6907, 1.7242, 1.7552, 1.7842, 1.8113, 1.8369, 1.861, 1.8839];
const n = [59, 60, 62, 56, 63, 59, 62, 60];
const killed = [6, 13, 18, 28, 52, 53, 61, 60];
const points = dose.map((x, i) => ({ x, n: n[i], k: killed[i] }));

// Published fits: Dobson & Barnett Table 7.3 (values from memory; they agree to the printed
// precision with the output of R's glm reproduced in several open course notes).
const published = {
  logit: { b0: -60.72, se0: 5.18, b1: 34.27, se1: 2.91, deviance: 11.23 },
  probit: { b0: -34.94, se0: 2.65, b1: 19.73, se1: 1.49, deviance: 10.12 },
  cloglog: { b0: -39.57, se0: 3.24, b1: 22.04, se1: 1.8, deviance: 3.45 },
} as const;

// Half a unit in the last printed digit.
const near = (actual: number, expected: number, digits: number) => expect(Math.abs(actual - expected)).toBeLessThanOrEqual(0.5 * 10 ** -digits + 1e-12);

describe('plain logistic on the Bliss beetle data (Dobson & Barnett 2008, Tables 7.2 and 7.3, from memory)', () => {
  for (const link of ['logit', 'probit', 'cloglog'] as const) {
    it(`${link} link matches the published coefficients, SEs and deviance`, () => {
      const fit = fitPlainLogistic(points, { link });
      const ref = published[link];
      expect(fit.converged).toBe(true);
      near(fit.b0, ref.b0, 2);
      near(fit.b1, ref.b1, 2);
      near(fit.se0, ref.se0, 2);
      near(fit.se1, ref.se1, 2);
      near(fit.deviance, ref.deviance, 2);
      expect(fit.df).toBe(6);
    });
  }

  it('logit LD50 = −b0/b1 ≈ 1.7717 (Dobson & Barnett 2008, from memory)', () => {
    const fit = fitPlainLogistic(points);
    near(-fit.b0 / fit.b1, 1.7717, 4);
  });

  it('log-likelihood and deviance agree: deviance = 2(saturated − fitted)', () => {
    const fit = fitPlainLogistic(points);
    const lnChoose = (a: number, b: number) => { let s = 0; for (let i = 1; i <= b; i++) s += Math.log((a - b + i) / i); return s; };
    let sat = 0;
    points.forEach((p) => {
      const q = p.k / p.n;
      sat += lnChoose(p.n, p.k) + (p.k > 0 ? p.k * Math.log(q) : 0) + (p.n - p.k > 0 ? (p.n - p.k) * Math.log(1 - q) : 0);
    });
    expect(2 * (sat - fit.logLik)).toBeCloseTo(fit.deviance, 8);
  });
});
