// The guess rate in the mixed model (issue 12, point 3): for the spot task the catch trials
// enter the mixed likelihood and γ is a parameter (per base, or pooled where a base has fewer
// than 20 catch trials), as in the fixed models. Protects: γ and σ recovered together, a base
// where nobody false-alarmed still carries an interval for γ, and the score with γ in it.
// Simulated shoppers are own simulation, no published source.
import { describe, expect, it } from 'vitest';
import { analyse } from '@/lib/psychometrics/analyse';
import { catchCellsOf, mixedData, mixedLogLik, mixedProblem, mixedStart } from '@/lib/psychometrics/mixed';
import { jointDesign } from '@/lib/psychometrics/models';
import { prepare } from '@/lib/psychometrics/prepare';
import { createRng } from '@/lib/psychometrics/random';
import { poolShopperCells, shopperCounts } from '@/lib/psychometrics/shoppers';
import { geometricLadder } from '@/lib/psychometrics/simulate';
import { simulateShoppers } from '@/lib/psychometrics/simulate-shoppers';

const LADDER = geometricLadder(0.01, 0.4, 8);
const BASES = [2.49, 12.9, 49];

function study(guess: number, seed: string, catchPerBase: number) {
  const observer = { alpha: () => Math.log(0.08), beta: 4, lapse: 0.02, guess };
  return simulateShoppers(observer, 0.5, { basePrices: BASES, rungs: LADDER, repetitions: 3, shoppers: 60, catchPerBase }, createRng(seed));
}

describe('mixed model, spot task: γ fitted with the catch trials', () => {
  it('recovers σ = 0.5 and γ = 0.1 per base (60 shoppers, 10 catch trials per base each), intervals covering both', () => {
    const r = analyse({ shopperCells: study(0.1, 'guess-a', 10), task: 'spot', bootstrap: 0 });
    const sp = r.shopperSpread!;
    expect(sp.converged).toBe(true);
    expect(sp.sigma).toBeGreaterThan(0.4);
    expect(sp.sigma).toBeLessThan(0.65);
    expect(sp.sigmaCi![0]).toBeLessThan(0.5);
    expect(sp.sigmaCi![1]).toBeGreaterThan(0.5);
    expect(sp.guess!.map((g) => g.bases)).toEqual(BASES.map((b) => [b]));
    for (const g of sp.guess!) {
      expect(g.value).toBeGreaterThan(0.07);
      expect(g.value).toBeLessThan(0.13);
      expect(g.ci![0]).toBeLessThan(0.1);
      expect(g.ci![1]).toBeGreaterThan(0.1);
    }
    expect(sp.sigmaMethod).toMatch(/guess rates fitted with the catch trials/);
  });

  it('a base where nobody false-alarmed still has a γ interval above zero', () => {
    const rows = study(0, 'guess-c', 10);
    expect(rows.filter((x) => x.discount === 0).every((x) => x.k === 0)).toBe(true);
    const sp = analyse({ shopperCells: rows, task: 'spot', bootstrap: 0 }).shopperSpread!;
    for (const g of sp.guess!) {
      expect(g.value).toBeGreaterThan(0);
      expect(g.ci).not.toBeNull();
      expect(g.ci![0]).toBeLessThan(g.value);
      // 600 catch trials with no false alarm: the upper end is of the order of 3.7/600 (the exact binomial bound)
      expect(g.ci![1]).toBeGreaterThan(3 / 600);
      expect(g.ci![1]).toBeLessThan(0.03);
    }
  });

  it('pools γ over the bases when each has fewer than 20 catch trials', () => {
    const sp = analyse({ shopperCells: study(0.1, 'guess-b', 0).concat(poolCatch()), task: 'spot', bootstrap: 0 }).shopperSpread!;
    expect(sp.guess).toHaveLength(1);
    expect(sp.guess![0].bases).toEqual(BASES);
    expect(sp.guess![0].ci![0]).toBeLessThan(sp.guess![0].value);
  });

  it('pick task: no γ to fit', () => {
    const sp = analyse({ shopperCells: study(0.5, 'guess-d', 0), task: 'pick', bootstrap: 0 }).shopperSpread!;
    expect(sp.guess).toEqual([]);
  });

  it('the score with γ and the catch cells in it matches central differences', () => {
    const rows = study(0.1, 'guess-e', 10).filter((x) => !x.respondent.endsWith('7'));
    const { cells, catchCells } = poolShopperCells(rows);
    const prep = prepare(cells, catchCells, 'spot');
    const d = jointDesign(prep, 'weber');
    const pr = mixedProblem(d, mixedData(shopperCounts(prep, rows), undefined, catchCellsOf(d, prep.x.length, prep.bases.length)));
    const psi = mixedStart(pr, [Math.log(0.07), Math.log(3.5), 0.03, 0.09, 0.12, 0.1], 0.45);
    expect(pr.nPar).toBe(7);
    mixedLogLik(pr, psi, true);
    const g = Array.from(pr.grad);
    psi.forEach((v, j) => {
      const h = 1e-6;
      const up = Float64Array.from(psi), dn = Float64Array.from(psi);
      up[j] = v + h; dn[j] = v - h;
      const num = (mixedLogLik(pr, up, false) - mixedLogLik(pr, dn, false)) / (2 * h);
      expect(Math.abs(g[j] - num), `parameter ${j}`).toBeLessThan(1e-4 * Math.max(1, Math.abs(num)));
    });
  });
});

/** Two catch trials per base for each of 60 shoppers, one false alarm in ten: 120 per base, then cut to 6 per base. */
function poolCatch() {
  const rng = createRng('guess-pool');
  const out: { respondent: string; basePrice: number; discount: number; n: number; k: number }[] = [];
  for (let s = 1; s <= 6; s++) for (const basePrice of BASES) out.push({ respondent: `s${s}`, basePrice, discount: 0, n: 1, k: rng.next() < 0.1 ? 1 : 0 });
  return out;
}
