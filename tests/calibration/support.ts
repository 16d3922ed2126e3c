// Shared by the calibration tier (tests/calibration): seeded simulated studies whose truth is
// known, and the figure each check prints with its binomial standard error. Every truth here is
// an own simulation, no published source. The bounds the issue sets: a 95 % interval covers the
// truth in at least 92 % of studies, a test rejects a true nested model at p < 0.05 in at most
// 7 % of them. With 200 studies the binomial SE is about 1.5 points at 95 % and 1.5 points at 5 %.
import { expect } from 'vitest';

export interface Rate { hits: number; n: number }

export function rate(): Rate {
  return { hits: 0, n: 0 };
}

export function count(r: Rate, hit: boolean): void {
  r.n++;
  if (hit) r.hits++;
}

/** Prints "name: 0.945 ± 0.016 (189 of 200)" and returns the share. */
export function report(name: string, r: Rate): number {
  const p = r.n ? r.hits / r.n : NaN;
  const se = r.n ? Math.sqrt((p * (1 - p)) / r.n) : NaN;
  console.log(`[calibration] ${name}: ${p.toFixed(3)} ± ${se.toFixed(3)} (${r.hits} of ${r.n}; own simulation, no published source)`);
  return p;
}

export function expectCoverage(name: string, r: Rate, minStudies = 200): void {
  const p = report(`coverage of 95 % intervals — ${name}`, r);
  expect(r.n, `${name}: studies with an interval`).toBeGreaterThanOrEqual(minStudies);
  expect(p, `${name}: coverage`).toBeGreaterThanOrEqual(0.92);
}

export function expectFalseRejection(name: string, r: Rate, minStudies = 200): void {
  const p = report(`false rejection at p < 0.05 — ${name}`, r);
  expect(r.n, `${name}: studies`).toBeGreaterThanOrEqual(minStudies);
  expect(p, `${name}: false rejection`).toBeLessThanOrEqual(0.07);
}

export const covers = (ci: [number, number] | null | undefined, truth: number) => !!ci && ci[0] <= truth && truth <= ci[1];
