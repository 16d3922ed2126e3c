// Segment comparison on the power model: each answer group of one segment question fitted on its
// own, then one shared model on all groups' cells; the likelihood-ratio test (chi-square) asks
// whether the groups differ at all. Fewer bootstrap samples
// than a full report (a comparison screen). Tests: tests/unit/psychometrics/segments.test.ts.
import { analyse } from './analyse';
import { chiSquareP } from './chi2';
import { PsychometricsInputError } from './errors';
import { fitDesign, makeDesign } from './fit-core';
import { logChoose } from './math';
import { prepare } from './prepare';
import type { AnalysisReport } from './report-types';
import type { Cell, CatchCell, Interval, Task } from './types';

export interface GroupInput { label: string; cells: Cell[]; catchCells?: CatchCell[] }

export interface CompareOptions {
  task: Task;
  guess?: number;
  lapse?: number;
  target?: number;
  /** Bootstrap samples per group for the Weber-slope interval (default 200: a comparison screen, not a report). */
  bootstrap?: number;
  seed?: number | string;
}

export interface GroupResult {
  label: string;
  thresholds: { basePrice: number; fraction: number; amount: number }[];
  weberSlope: number | null;
  weberSlopeCi: Interval | null;
  logLik: number;
  warnings: string[];
}

/**
 * Segment comparison on the power model: each group fitted on its own, then one shared
 * power model (same a, b, slope and lapse; each group keeps its own guess rates) on all
 * groups' cells; the likelihood-ratio test asks whether the groups differ.
 */
export function compareGroups(groups: GroupInput[], opts: CompareOptions) {
  if (groups.length < 2) throw new PsychometricsInputError('segment comparison needs at least two groups');
  const reports: AnalysisReport[] = groups.map((g, i) => {
    try {
      return analyse({ cells: g.cells, catchCells: g.catchCells, task: opts.task, guess: opts.guess, lapse: opts.lapse,
        target: opts.target, bootstrap: opts.bootstrap ?? 200, seed: `${opts.seed ?? 1}:${i}` });
    } catch (e) {
      if (e instanceof PsychometricsInputError) throw new PsychometricsInputError(`group "${g.label}": ${e.message}`);
      throw e;
    }
  });
  const preps = groups.map((g) => prepare(g.cells, g.catchCells ?? [], opts.task, opts.guess, opts.lapse));
  const all = preps.flatMap((p) => Array.from(p.lnB));
  const centre = all.reduce((a, b) => a + b, 0) / all.length;
  const x: number[] = [], n: number[] = [], k: number[] = [], gamma: number[] = [], lb: number[] = [];
  let minX = Infinity, maxX = -Infinity, logConst = 0;
  for (const p of preps) {
    for (let i = 0; i < p.x.length; i++) {
      x.push(p.x[i]); n.push(p.n[i]); k.push(p.k[i]); gamma.push(p.guess[p.cellBase[i]]); lb.push(p.lnB[p.cellBase[i]] - centre);
      minX = Math.min(minX, p.x[i]); maxX = Math.max(maxX, p.x[i]);
      logConst += logChoose(p.n[i], p.k[i]);
    }
  }
  const m = x.length;
  const z = new Float64Array(m * 2);
  for (let i = 0; i < m; i++) { z[2 * i] = 1; z[2 * i + 1] = lb[i]; }
  const d = makeDesign(Float64Array.from(x), Float64Array.from(n), Float64Array.from(gamma), 2, z,
    Float64Array.from(lb, (v) => -v), opts.lapse ?? null, [minX - 4, -3], [maxX + 4, 4]);
  const p0 = reports[0].models.power;
  const start = new Float64Array(d.nPar);
  start[0] = p0.thresholds.reduce((a, t) => a + t.alpha, 0) / p0.thresholds.length;
  start[1] = p0.weberSlope ?? 1;
  start[2] = Math.log(p0.slope);
  if (d.nPar > 3) start[3] = p0.lapse;
  const shared = fitDesign(d, Float64Array.from(k), start);
  const sharedLogLik = shared.logLik + logConst;
  const separateLogLik = reports.reduce((a, r) => a + r.models.power.logLik, 0);
  const chi2 = Math.max(0, 2 * (separateLogLik - sharedLogLik));
  const df = reports.reduce((a, r) => a + r.models.power.k, 0) - d.nPar;
  return {
    groups: reports.map((r, i): GroupResult => ({
      label: groups[i].label,
      thresholds: r.models.power.thresholds.map(({ basePrice, fraction, amount }) => ({ basePrice, fraction, amount })),
      weberSlope: r.models.power.weberSlope,
      weberSlopeCi: r.models.power.weberSlopeCi,
      logLik: r.models.power.logLik,
      warnings: r.warnings,
    })),
    shared: { logLik: sharedLogLik, weberSlope: shared.params[1], converged: shared.converged },
    test: { chi2, df, p: chiSquareP(chi2, df) },
  };
}
