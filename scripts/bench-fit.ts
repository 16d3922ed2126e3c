// Benchmark of the psychometrics engine (`npm run bench:fit`): a study of 8 base prices × 10
// rungs, 2,000 respondents × 80 trials (160,000 trials), timed as median of several runs.
//
// `full_analysis_ms` (last line) is the path the app takes since the shopper became the unit:
// the same 160,000 trials as 2,000 shoppers' count vectors (shoppers who differ, SD 0.3 in ln
// threshold) with a 1,000-sample respondent-level bootstrap that refits γ, λ, every per-base
// fit and all four joint models on each sample, plus the Monte-Carlo deviance checks, and the
// mixed model of the shopper spread (preferred and free model, σ's profile interval, the
// share-of-shoppers read-out): one analyse() call, as the app's fit job makes it.
// `mixed_model_ms` is the mixed model's part alone (the same call with spread, bootstrap 0,
// less the call without). `cell_analysis_ms` is the older path: pooled cells without ids and a
// parametric bootstrap.
//
// Peer: the plain logistic (logit(p) = b0 + b1·ln d per base price) is also fitted by a
// general-purpose package from the npm registry. ml-logistic-regression cannot take binomial
// counts or case weights (it trains on one 0/1 label per row by fixed-step gradient descent
// and always runs its full step count), so fitting the same cells with it would mean
// expanding them back into 160,000 rows and would still not reach the maximum-likelihood
// estimates to compare against. The peer is therefore IRLS written on ml-matrix (the linear
// algebra package ml-logistic-regression itself is built on), fitting the same cells.
import { Matrix, solve } from 'ml-matrix';
import { aggregateTrials } from '../lib/psychometrics/aggregate';
import { analyse } from '../lib/psychometrics/analyse';
import { median } from '../lib/psychometrics/math';
import { fitPlainLogistic } from '../lib/psychometrics/plain-logistic';
import { createRng } from '../lib/psychometrics/random';
import { geometricLadder, noticeProbability, type Observer, simulateShopperCells } from '../lib/psychometrics/simulate';
import type { Cell, TrialRow } from '../lib/psychometrics/types';

const BASES = [1.99, 4.99, 9.99, 24.99, 49, 99, 249, 899];
const RUNGS = geometricLadder(0.01, 0.3, 10);
const RESPONDENTS = 2000;
const RUNS = 7;
const BOOTSTRAP = 1000;

// A partly proportional observer: Weber slope 0.8, about 5 % at 10.
const observer: Observer = { alpha: (b) => Math.log(0.05) + (0.8 - 1) * Math.log(b / 10), beta: 3.5, lapse: 0.02, guess: 0.5 };

function makeTrials(): TrialRow[] {
  const rng = createRng('bench');
  const rows: TrialRow[] = [];
  for (let r = 0; r < RESPONDENTS; r++) {
    for (const basePrice of BASES) for (const discount of RUNGS) {
      rows.push({ basePrice, discount, response: rng.next() < noticeProbability(observer, basePrice, discount) ? 1 : 0 });
    }
  }
  return rows;
}

function time<T>(fn: () => T): [number, T] {
  const t = performance.now();
  const out = fn();
  return [performance.now() - t, out];
}

/** Median CPU time of the last medianTime call: less sensitive than wall time to other work on the machine. */
let lastCpuMs = NaN;

function medianTime<T>(fn: () => T): [number, T] {
  const times: number[] = [], cpu: number[] = [];
  let out!: T;
  for (let i = 0; i < RUNS; i++) {
    const c = process.cpuUsage();
    const [ms, o] = time(fn);
    const d = process.cpuUsage(c);
    times.push(ms); cpu.push((d.user + d.system) / 1000); out = o;
  }
  lastCpuMs = median(cpu);
  return [median(times), out];
}

function byBase(cells: Cell[]) {
  return BASES.map((b) => cells.filter((c) => c.basePrice === b).map((c) => ({ x: Math.log(c.discount), n: c.n, k: c.k })));
}

// Binomial-logit IRLS on ml-matrix: β ← (XᵀWX)⁻¹ XᵀW z.
function peerFit(points: { x: number; n: number; k: number }[]): [number, number] {
  const X = new Matrix(points.map((p) => [1, p.x]));
  let beta = Matrix.columnVector([0, 0]);
  for (let it = 0; it < 25; it++) {
    const eta = X.mmul(beta).to1DArray();
    const w: number[] = [], z: number[] = [];
    points.forEach((p, i) => {
      const mu = 1 / (1 + Math.exp(-eta[i]));
      const v = Math.max(mu * (1 - mu), 1e-12);
      w.push(p.n * v);
      z.push(eta[i] + (p.k / p.n - mu) / v);
    });
    const XtW = X.transpose().mulRowVector(w);
    const next = solve(XtW.mmul(X), XtW.mmul(Matrix.columnVector(z)));
    const change = Math.max(Math.abs(next.get(0, 0) - beta.get(0, 0)), Math.abs(next.get(1, 0) - beta.get(1, 0)));
    beta = next;
    if (change < 1e-10) break;
  }
  return [beta.get(0, 0), beta.get(1, 0)];
}

const trials = makeTrials();
const [aggMs, { cells }] = medianTime(() => aggregateTrials(trials));
const input = { cells, task: 'pick' as const, seed: 1 };
const [noBootMs] = medianTime(() => analyse({ ...input, bootstrap: 0 }));
const [cellMs] = medianTime(() => analyse({ ...input, bootstrap: BOOTSTRAP }));
const shopperCells = simulateShopperCells(observer, BASES, RUNGS, { shoppers: RESPONDENTS, repetitions: 1, sigma: 0.3 }, createRng('bench-shoppers'));
const shopperTrials = shopperCells.reduce((a, c) => a + c.n, 0);
const [fullMs, report] = medianTime(() => analyse({ shopperCells, task: 'pick', seed: 1, bootstrap: BOOTSTRAP }));
const fullCpuMs = lastCpuMs;
const [withSpreadMs] = medianTime(() => analyse({ shopperCells, task: 'pick', seed: 1, bootstrap: 0 }));
const [noSpreadMs] = medianTime(() => analyse({ shopperCells, task: 'pick', seed: 1, bootstrap: 0, spread: false }));
const mixedMs = Math.max(0, withSpreadMs - noSpreadMs);
const spread = report.shopperSpread;
const groups = byBase(cells);
const [plainMs, plain] = medianTime(() => groups.map((g) => fitPlainLogistic(g)));
const [peerMs, peer] = medianTime(() => groups.map(peerFit));
let maxRel = 0;
plain.forEach((f, i) => {
  maxRel = Math.max(maxRel, Math.abs(f.b0 - peer[i][0]) / Math.abs(peer[i][0]), Math.abs(f.b1 - peer[i][1]) / Math.abs(peer[i][1]));
});

const f = (x: number, d = 1) => x.toFixed(d);
console.log(`trials ${trials.length}, cells ${cells.length}, bases ${BASES.length}, median of ${RUNS} runs`);
console.log(`aggregate trials → cells:                       ${f(aggMs)} ms`);
console.log(`four joint models + per-base fits, no bootstrap: ${f(noBootMs)} ms`);
console.log(`cells without ids, ${BOOTSTRAP}-sample parametric bootstrap: ${f(cellMs)} ms`);
console.log(`${RESPONDENTS} shoppers (${shopperTrials} trials), ${BOOTSTRAP}-sample respondent bootstrap and the mixed model: ${f(fullMs)} ms (target ≤ 1,500 ms; CPU time ${f(fullCpuMs)} ms); ${report.bootstrapFailures?.nonFinite ?? 0} non-finite samples`);
console.log(`of which the mixed model (preferred + free, σ interval, shares):  ${f(mixedMs)} ms; σ ${f(spread?.sigma ?? NaN, 3)} [${spread?.sigmaCi?.map((v) => f(v, 3)).join(', ')}] (simulated 0.3)`);
console.log(`plain logistic per base (engine IRLS):           ${f(plainMs, 3)} ms`);
console.log(`plain logistic per base (peer: ml-matrix IRLS):  ${f(peerMs, 3)} ms, max relative difference ${maxRel.toExponential(2)}`);
console.log(`weber slope ${f(report.models.power.weberSlope ?? NaN, 3)} [${report.models.power.weberSlopeCi?.map((v) => f(v, 3)).join(', ')}] (simulated 0.8); preferred model ${report.preferredModel}`);
console.log(`bench:fit trials=${trials.length} shoppers=${RESPONDENTS} bootstrap=${BOOTSTRAP} full_analysis_ms=${f(fullMs)} mixed_model_ms=${f(mixedMs)} cell_analysis_ms=${f(cellMs)} plain_fit_ms=${f(plainMs, 3)} peer_ms=${f(peerMs, 3)} peer_max_rel_diff=${maxRel.toExponential(2)}`);
