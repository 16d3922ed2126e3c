// Segment comparison on the power model: each answer group of one segment question fitted on
// its own (a full analysis each, with its intervals), then one shared power model on all
// groups' trials; the likelihood-ratio statistic 2·(Σ ℓ_group − ℓ_shared) asks whether the
// groups differ at all (df = (groups − 1) × the power model's parameters).
//
// The shopper is the unit (issue 12, point 4): when every group carries respondent ids the
// p-value comes from a permutation test over shoppers — whole shoppers are reassigned to the
// answer groups at random (group sizes kept), each group's power model refitted, and p is the
// share of permutations whose statistic reaches the observed one (with the usual +1 in
// numerator and denominator). Under "the groups do not differ" every assignment of shoppers
// to groups is equally likely, so the test holds its level however much shoppers differ;
// a χ² reference would count each shopper's trials as independent evidence. Without ids the
// χ² reference remains, and `test.method` says which was used. The shared model is the same
// under every permutation (same pooled data), so each permutation costs one power fit per group.
// Tests: tests/unit/psychometrics/segments.test.ts.
import { analyse } from './analyse';
import { chiSquareP } from './chi2';
import { PsychometricsInputError } from './errors';
import { fitAll, makeEngine } from './engine';
import { type Design, fitBest, fitDesign } from './fit-core';
import { logChoose } from './math';
import { jointDesign, loadSample, observedSample } from './models';
import { prepare } from './prepare';
import { createRng } from './random';
import type { AnalysisReport, ThresholdBound } from './report-types';
import { poolShopperCells, shopperCounts } from './shoppers';
import type { Cell, CatchCell, Interval, ShopperCell, Task } from './types';

export interface GroupInput { label: string; cells?: Cell[]; catchCells?: CatchCell[]; shopperCells?: ShopperCell[] }

export interface CompareOptions {
  task: Task;
  guess?: number;
  lapse?: number;
  target?: number;
  /** Bootstrap samples per group for the Weber-slope interval (default 200: a comparison screen, not a report). */
  bootstrap?: number;
  /** Shopper permutations for the test when ids are present (default 200). */
  permutations?: number;
  seed?: number | string;
}

export interface GroupResult {
  label: string;
  thresholds: { basePrice: number; fraction: number | null; amount: number | null; bound?: ThresholdBound | null }[];
  weberSlope: number | null;
  weberSlopeCi: Interval | null;
  logLik: number;
  shoppers: number | null;
  warnings: string[];
}

export function compareGroups(groups: GroupInput[], opts: CompareOptions) {
  if (groups.length < 2) throw new PsychometricsInputError('segment comparison needs at least two groups');
  const reports: AnalysisReport[] = groups.map((g, i) => {
    try {
      return analyse({ cells: g.cells, catchCells: g.catchCells, shopperCells: g.shopperCells, spread: false, task: opts.task, guess: opts.guess, lapse: opts.lapse,
        target: opts.target, bootstrap: opts.bootstrap ?? 200, seed: `${opts.seed ?? 1}:${i}` });
    } catch (e) {
      if (e instanceof PsychometricsInputError) throw new PsychometricsInputError(`group "${g.label}": ${e.message}`);
      throw e;
    }
  });
  const byShopper = groups.every((g) => g.shopperCells && new Set(g.shopperCells.map((r) => r.respondent)).size >= 2);
  // One layout for all groups: every group's cells (per shopper when ids are present).
  const tag = (gi: number, id: string) => `${gi}\u0000${id}`;
  const rows: ShopperCell[] = byShopper
    ? groups.flatMap((g, gi) => g.shopperCells!.map((r) => ({ ...r, respondent: tag(gi, r.respondent) })))
    : [];
  const pooledAll = byShopper ? poolShopperCells(rows) : {
    cells: groups.flatMap((g) => g.cells ?? []), catchCells: groups.flatMap((g) => g.catchCells ?? []),
  };
  const prep = prepare(pooledAll.cells, pooledAll.catchCells, opts.task, opts.guess, opts.lapse);
  prep.warnings.length = 0;
  const d = jointDesign(prep, 'power');
  const m = prep.x.length, J = prep.bases.length;
  const k = new Float64Array(d.nCells);
  // per-group samples on the common layout
  const groupSample = (member: (gi: number) => boolean, sc: ReturnType<typeof shopperCounts> | null, owner: Int32Array | null) => {
    const N = new Float64Array(m + J), K = new Float64Array(m + J);
    if (sc && owner) {
      for (let s = 0; s < sc.ids.length; s++) {
        if (!member(owner[s])) continue;
        for (let i = 0; i < m; i++) { N[i] += sc.n[s * m + i]; K[i] += sc.k[s * m + i]; }
        for (let j = 0; j < J; j++) { N[m + j] += sc.catchN[s * J + j]; K[m + j] += sc.catchK[s * J + j]; }
      }
    }
    return { N, K };
  };
  let groupData: { N: Float64Array; K: Float64Array }[];
  let sc: ReturnType<typeof shopperCounts> | null = null;
  let owner: Int32Array | null = null;
  if (byShopper) {
    sc = shopperCounts(prep, rows);
    owner = Int32Array.from(sc.ids, (id) => Number(id.slice(0, id.indexOf('\u0000'))));
    groupData = groups.map((_, gi) => groupSample((o) => o === gi, sc, owner));
  } else {
    groupData = groups.map((g) => {
      const gp = prepare(g.cells ?? [], g.catchCells ?? [], opts.task, opts.guess, opts.lapse);
      const N = new Float64Array(m + J), K = new Float64Array(m + J);
      const cellIndex = new Map<string, number>();
      for (let i = 0; i < m; i++) cellIndex.set(`${prep.bases[prep.cellBase[i]]}|${prep.discount[i]}`, i);
      for (let i = 0; i < gp.x.length; i++) {
        const at = cellIndex.get(`${gp.bases[gp.cellBase[i]]}|${gp.discount[i]}`)!;
        N[at] += gp.n[i]; K[at] += gp.k[i];
      }
      gp.bases.forEach((b, j) => { const at = prep.bases.indexOf(b); N[m + at] += gp.catchN[j]; K[m + at] += gp.catchK[j]; });
      return { N, K };
    });
  }
  const all = observedSample(prep);
  loadSample(d, all.N, all.K, k);
  const sharedFit = fitAll(makeEngine(prep), all.N, all.K, null).joint.fits.power;
  const refitShared = fitDesign(d, k, sharedFit.params);
  const shared = refitShared.logLik >= sharedFit.logLik ? refitShared : sharedFit;
  const constOf = (N: Float64Array, K: Float64Array) => { let c = 0; for (let i = 0; i < N.length; i++) c += logChoose(N[i], K[i]); return c; };
  const groupObjective = (des: Design, N: Float64Array, K: Float64Array, warm: Float64Array[]): { obj: number; params: Float64Array } => {
    loadSample(des, N, K, k);
    const f = fitBest(des, k, warm);
    return { obj: f.logLik, params: f.params };
  };
  const sepFits = groupData.map((g) => groupObjective(d, g.N, g.K, [shared.params]));
  const groupLogLik = sepFits.map((f, gi) => f.obj + constOf(groupData[gi].N, groupData[gi].K));
  const sharedLogLik = shared.logLik + groupLogLik.reduce((a, v, gi) => a + v - sepFits[gi].obj, 0);
  loadSample(d, all.N, all.K, k);
  const sepSum = sepFits.reduce((a, f) => a + f.obj, 0);
  let chi2 = 2 * (sepSum - shared.logLik);
  const warnings: string[] = [];
  if (chi2 < 0) {
    if (chi2 < -1e-6) warnings.push(`the likelihood-ratio statistic came out negative (${chi2.toPrecision(3)}); reported as 0`);
    chi2 = 0;
  }
  const df = (groups.length - 1) * d.nPar;
  let p: number | null = chiSquareP(chi2, df);
  let method = 'likelihood ratio, χ² reference (assumes independent trials: the data carry no shopper ids)';
  if (byShopper && sc && owner) {
    const P = opts.permutations ?? 200;
    const rng = createRng(`${opts.seed ?? 1}:permutation`);
    const labels = Array.from(owner);
    let reach = 0;
    for (let r = 0; r < P; r++) {
      const perm = Int32Array.from(rng.shuffle([...labels]));
      let s = 0;
      for (let gi = 0; gi < groups.length; gi++) {
        const g = groupSample((o) => o === gi, sc, perm);
        s += groupObjective(d, g.N, g.K, [sepFits[gi].params, shared.params]).obj;
      }
      if (2 * (s - shared.logLik) >= chi2 - 1e-9) reach++;
    }
    p = (reach + 1) / (P + 1);
    method = `permutation test over shoppers (${P} random reassignments of whole shoppers to the answer groups)`;
  }
  return {
    groups: reports.map((r, i): GroupResult => ({
      label: groups[i].label,
      thresholds: r.models.power.thresholds.map(({ basePrice, fraction, amount, bound }) => ({ basePrice, fraction, amount, bound: bound ?? null })),
      weberSlope: r.models.power.weberSlope,
      weberSlopeCi: r.models.power.weberSlopeCi,
      logLik: groupLogLik[i],
      shoppers: r.shoppers ?? null,
      warnings: r.warnings,
    })),
    shared: { logLik: sharedLogLik, weberSlope: shared.params[1], converged: shared.converged },
    test: { chi2, df, p, method },
    warnings,
  };
}
