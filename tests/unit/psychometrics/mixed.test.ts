// The mixed psychometric model (Moscatelli, Mezzetti & Lacquaniti 2012) as lib/psychometrics/mixed.ts
// fits it: its marginal likelihood against an independent integration (scipy, kept with the
// script that made it), its score against finite differences, and the σ = 0 special case.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { fitDesign } from '@/lib/psychometrics/fit-core';
import { mixedData, mixedLogLik, mixedProblem, mixedStart } from '@/lib/psychometrics/mixed';
import { jointDesign, meanLnB } from '@/lib/psychometrics/models';
import { prepare } from '@/lib/psychometrics/prepare';
import { poolShopperCells, shopperCounts } from '@/lib/psychometrics/shoppers';
import type { ModelName, ShopperCell } from '@/lib/psychometrics/types';

interface RefCase {
  label: string; data: 'pick' | 'spot'; model: ModelName; params: Record<string, number & number[]>;
  guess: number[]; beta: number; lapse: number; sigma: number; logLik: number;
}
const fixture = JSON.parse(readFileSync(path.join(import.meta.dirname, '../../fixtures/psychometrics/mixed-loglik.json'), 'utf8')) as {
  source: string; rows: Record<'pick' | 'spot', ShopperCell[]>; cases: RefCase[];
};

function problemFor(rows: ShopperCell[], model: ModelName, guess: number[]) {
  const { cells } = poolShopperCells(rows);
  const prep = prepare(cells, [], 'trip');
  guess.forEach((g, j) => { prep.guess[j] = g; });
  const counts = shopperCounts(prep, rows);
  const d = jointDesign(prep, model);
  const data = mixedData(counts);
  return { prep, counts, d, data, pr: mixedProblem(d, data) };
}

/** The fixture's parameters in the engine's layout ψ = [θ, ln β, λ, σ]. */
function psiFor(c: RefCase, prep: ReturnType<typeof prepare>): Float64Array {
  const p = c.params;
  const theta = c.model === 'free' ? p.alphas : c.model === 'weber' ? [p.alpha] : c.model === 'constantAmount' ? [p.lnAmount]
    // power: engine θ = [α at the mean ln B, b] with α_j = θ0 + (b − 1)(ln B_j − centre); script: α_j = a + (b − 1) ln B_j
    : [p.a + (p.b - 1) * meanLnB(prep), p.b];
  return Float64Array.from([...theta, Math.log(c.beta), c.lapse, c.sigma]);
}

describe('mixed model: marginal likelihood against an independent integration', () => {
  it('the fixture names the script and library that made it', () => {
    expect(fixture.source).toMatch(/scripts\/reference\/mixed-loglik\.py \(scipy 1\.17\.1/);
  });

  it.each(fixture.cases.map((c) => [c.label, c] as const))('%s: within 1e-6 relative of scipy.integrate.quad', (_, c) => {
    const { prep, data, pr } = problemFor(fixture.rows[c.data], c.model, c.guess);
    const psi = psiFor(c, prep);
    // the shared grid, first from its width bound, then from the widths the first evaluation saw
    for (let pass = 0; pass < 2; pass++) {
      const ll = mixedLogLik(pr, psi, false) + data.logConst;
      expect(Math.abs(ll - c.logLik) / Math.abs(c.logLik), `shared grid, pass ${pass + 1}`).toBeLessThan(1e-6);
    }
    if (c.sigma > 0) expect(pr.shared).toBeGreaterThan(0);
    // every shopper by adaptive Gauss–Hermite quadrature (the rule the grid falls back to)
    const adaptive = mixedProblem(pr.d, data);
    adaptive.useGrid = false;
    const la = mixedLogLik(adaptive, psi, false) + data.logConst;
    expect(Math.abs(la - c.logLik) / Math.abs(c.logLik), 'adaptive Gauss–Hermite').toBeLessThan(1e-6);
    expect(adaptive.shared).toBe(0);
  });

  it('a shopper effect lowers nothing it should not: σ = 0 is the pooled fixed-effect likelihood exactly', () => {
    const { prep, d, pr } = problemFor(fixture.rows.pick, 'weber', [0.5, 0.5, 0.5]);
    const fixed = fitDesign(d, prep.k, [Math.log(0.08), Math.log(4), 0.02]);
    const ll0 = mixedLogLik(pr, mixedStart(pr, fixed.params, 0), false);
    expect(ll0).toBeCloseTo(fixed.logLik, 9);
  });
});

describe('mixed model: the score', () => {
  it('matches central differences of the marginal log-likelihood (free model, σ = 0.6)', () => {
    const { pr } = problemFor(fixture.rows.spot, 'free', [0.08, 0.12, 0.1]);
    const psi = Float64Array.from([Math.log(0.06), Math.log(0.08), Math.log(0.11), Math.log(4), 0.02, 0.6]);
    mixedLogLik(pr, psi, true);
    const g = Array.from(pr.grad);
    psi.forEach((v, j) => {
      const h = 1e-5;
      const up = Float64Array.from(psi), dn = Float64Array.from(psi);
      up[j] = v + h; dn[j] = v - h;
      const num = (mixedLogLik(pr, up, false) - mixedLogLik(pr, dn, false)) / (2 * h);
      // the score holds the adaptive nodes fixed: exact up to the quadrature's own error
      expect(Math.abs(g[j] - num)).toBeLessThan(2e-3 * Math.max(1, Math.abs(num)));
    });
  });
});
