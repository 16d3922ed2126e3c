// The mixed psychometric model: how much shoppers differ (a generalised linear mixed model for
// psychometric functions, Moscatelli, Mezzetti & Lacquaniti 2012). Each shopper s has an own
// ln threshold α_s = α(model, base) + σ·z_s with z_s ~ Normal(0, 1), so σ is the SD of
// shoppers' ln thresholds; given z_s the shopper answers like the fixed model in fit-core.ts:
//   P_si = γ_i + (1 − γ_i − λ)·F(β(x_i − α_i − σ z_s)),  F logistic, α_i = z_i·θ + offset_i,
// with the same Design (free, weber, constant amount, power), the same lapse bound [0, 0.06]
// and the same guess rates: the task's, or for the spot task γ as parameters fitted with the
// catch trials in this likelihood (per base, or pooled where a base has fewer than 20 catch
// trials; prepare.ts), with the fixed models' add-half term, so σ's interval and the shares
// carry γ's uncertainty and a base with no false alarm still has an interval for γ. Catch
// trials do not depend on the shopper's threshold, so they sit in each shopper's row as
// cells whose term is the same at every z. Parameters ψ = [the fixed design's θ, ln β,
// λ (unless fixed), γ…, then σ], so a fixed fit's parameters start the mixed fit directly.
//
// Estimation is by maximum marginal likelihood: each shopper's likelihood is integrated over
// z_s. Speed (issue 12, point 10: 2,000 shoppers in the benchmark) comes from one shared grid
// per evaluation: nodes z_q = q·h on [−9, 9] and, per design cell and node, ln P and ln(1 − P)
// computed once, so a shopper's integrand at a node is a sum of table entries over its cells
// — no exp or log per shopper. Shoppers shown the same cells (a cell pattern) share the sums
// with every answer yes and every answer no, so a shopper costs only the cells where its
// answers differ from the nearer of the two. Each shopper sums only the window of nodes where
// its integrand lives (its last centre ± 7.5 widths, widened while an end still carries
// weight). The trapezoid rule on the line is exponentially accurate for smooth integrands:
// h is at most 0.6/(βσ) (the logistic's poles lie π/(βσ) off the real line) and 0.7 of the
// narrowest shoppers' width (2nd percentile), so the error is ~1e-12 relative; a shopper narrower than 1.2·h,
// or heavy at ±9, is integrated by adaptive Gauss–Hermite quadrature instead (Liu & Pierce
// 1994): the integrand is centred at its mode ẑ_s and scaled by its curvature
// τ_s = (−g''(ẑ_s))^(−1/2), so that
//   L_s ≈ √2·τ_s·Σ_q w_q·exp(t_q² + g_s(ẑ_s + √2 τ_s t_q)),   g_s = ln(binomial terms · φ),
// with more nodes as β·σ·τ grows and a fine uniform grid for a shopper with a second mode.
// Both ways are checked within 1e-6 of an independent integration
// (tests/fixtures/psychometrics/mixed-loglik.json, made by scipy; mixed.test.ts runs each
// case with and without the shared grid).
// At σ = 0 the integral is the fixed model's likelihood exactly, so σ = 0 is the pooled fit.
// Each shopper is a count vector over the prepared cells (shoppers.ts); shoppers with the
// same counts are integrated once and weighted.
//
// The optimiser is projected BHHH (Berndt–Hall–Hall–Hausman: the sum of outer products of the
// shoppers' scores stands in for the information, which is natural here because the shopper
// is the independent unit; the γ add-half term enters with its exact curvature) with
// backtracking. With fewer than 8 shoppers per parameter, or after 15 BHHH steps, Newton
// steps on the observed information (differences of the analytic score) take over: BHHH
// needs many shoppers to stand in for the information and otherwise crawls. A line search
// that cannot improve is reported as not converged unless the Newton decrement is already
// negligible. Gradients hold the quadrature nodes fixed (the error of that is of the
// quadrature's own order). σ's interval is the profile likelihood interval
// {σ : 2(ℓ̂ − ℓ_p(σ)) ≤ χ²₁(0.95)}, found on the signed root of the deviance, each end
// started at its Wald guess σ̂ ± 1.96·SE; it is fast (a few warm-started refits) and,
// unlike a Wald interval, behaves at σ = 0 (the lower end is 0 whenever the pooled fit lies
// within the cut-off). The test of σ = 0 is the likelihood ratio against the pooled fit with
// the boundary null distribution ½χ²₀ + ½χ²₁ (Self & Liang 1987, value from memory).
// Tests: tests/unit/psychometrics/mixed.test.ts (reference integrals), mixed-guess.test.ts
// (γ), shopper-spread.test.ts; tests/calibration/shopper-spread.test.ts, share-of-shoppers.test.ts.
import { chiSquareP } from './chi2';
import { type Design, GAMMA_PRIOR } from './fit-core';
import { gaussHermite, type GaussHermiteRule } from './gauss-hermite';
import { choleskySolve, invertSpd } from './linalg';
import { logChoose } from './math';
import type { ShopperCounts } from './shoppers';

/**
 * Nodes per shopper, chosen per shopper from ρ = β·σ·τ: the integrand's width τ measured in
 * units of one cell's transition 1/(βσ). An informative shopper (many trials, ρ ≲ 1) has a
 * near-normal integrand and 9 adaptive nodes reach ~1e-9; a shopper with few trials on a
 * steep curve has plateaus with sharp edges in z and needs more. The levels were set so
 * that each case of tests/fixtures/psychometrics/mixed-loglik.json is within 1e-6 (mixed.test.ts).
 */
export const NODE_LEVELS = [9, 15, 21, 31, 41] as const;
const RHO_LIMITS = [1, 1.6, 2.2, 3];
export const MIXED_NODES = NODE_LEVELS[0];
/** Most points of the fallback grid for a row whose integrand is far from normal. */
const MAX_GRID = 801;
/** Share of a row's integral on an outermost node above which the row goes to the grid. */
const OUTER_SHARE = 5e-4;
/** BHHH iterations before Newton steps on the observed information take over. */
const BHHH_ITERATIONS = 15;
/** Fewer shoppers than this many per parameter and fitMixed takes Newton steps from the start. */
const NEWTON_SHOPPERS_PER_PARAMETER = 8;
/** Upper bound for σ (SD of ln thresholds): e^4 ≈ 55-fold between neighbouring SDs is no longer a spread. */
export const SIGMA_MAX = 4;
/** χ²₁ 95 % point: the profile-likelihood cut-off for σ's interval. */
export const CHI2_1_95 = 3.841458820694124;
const P_EPS = 1e-12;
const LN_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

/** Shoppers in compressed rows: shopper r's cells are cell[start[r] .. start[r+1]). */
export interface MixedData {
  rows: number;
  start: Int32Array;
  cell: Int32Array;
  n: Float64Array;
  k: Float64Array;
  /** How many shoppers share row r's counts (times their bootstrap or simulation weight). */
  weight: Float64Array;
  /** Σ weight·ln C(n, k): added to the reported log-likelihood so it is comparable with a glm's. */
  logConst: number;
  /** Total weight of shoppers with at least one test trial. */
  shoppers: number;
  /**
   * Cell pattern of each row (which cells, how many trials each; answers aside), −1 for a
   * pattern shared by fewer than PATTERN_MIN rows. Rows of one pattern share the grid's sums
   * over the pattern's cells, so only the cells where a row's answers differ from the
   * all-yes or all-no reference cost anything per row (gridRow).
   */
  pattern: Int32Array;
  /** A row of each pattern (its cells and trial counts are the pattern's). */
  patternRow: Int32Array;
}

/** Rows a cell pattern needs before the grid keeps sums for it. */
const PATTERN_MIN = 4;

/** Shopper count vectors → compressed rows, identical shoppers merged (weights optional). */
export function mixedData(counts: ShopperCounts, weights?: ArrayLike<number>, catchCell?: ArrayLike<number>): MixedData {
  const m = counts.nCells, J = counts.nBases;
  const S = counts.ids.length;
  const byKey = new Map<string, number>();
  const start: number[] = [0], cell: number[] = [], n: number[] = [], k: number[] = [], weight: number[] = [];
  let logConst = 0, shoppers = 0;
  for (let s = 0; s < S; s++) {
    const w = weights ? weights[s] : 1;
    if (!(w > 0)) continue;
    // (design cell, n, k) of the shopper's test cells, then of its catch cells when γ is fitted
    const cs: number[] = [], ns: number[] = [], ks: number[] = [];
    for (let i = 0; i < m; i++) if (counts.n[s * m + i] > 0) { cs.push(i); ns.push(counts.n[s * m + i]); ks.push(counts.k[s * m + i]); }
    if (cs.length === 0) continue;
    if (catchCell) {
      for (let j = 0; j < J; j++) {
        const cn = counts.catchN[s * J + j];
        if (cn > 0 && catchCell[j] >= 0) { cs.push(catchCell[j]); ns.push(cn); ks.push(counts.catchK[s * J + j]); }
      }
    }
    shoppers += w;
    let lc = 0;
    const key = cs.map((i, a) => { lc += logChoose(ns[a], ks[a]); return `${i}:${ns[a]}:${ks[a]}`; }).join(',');
    logConst += w * lc;
    const r = byKey.get(key);
    if (r !== undefined) { weight[r] += w; continue; }
    byKey.set(key, weight.length);
    for (let a = 0; a < cs.length; a++) { cell.push(cs[a]); n.push(ns[a]); k.push(ks[a]); }
    start.push(cell.length);
    weight.push(w);
  }
  const rows = weight.length;
  const patternOf = new Map<string, number[]>();
  for (let r = 0; r < rows; r++) {
    let key = '';
    for (let c = start[r]; c < start[r + 1]; c++) key += `${cell[c]}:${n[c]},`;
    const list = patternOf.get(key);
    if (list) list.push(r); else patternOf.set(key, [r]);
  }
  const pattern = new Int32Array(rows).fill(-1), patternRow: number[] = [];
  for (const list of patternOf.values()) {
    if (list.length < PATTERN_MIN) continue;
    for (const r of list) pattern[r] = patternRow.length;
    patternRow.push(list[0]);
  }
  return {
    rows, start: Int32Array.from(start), cell: Int32Array.from(cell),
    n: Float64Array.from(n), k: Float64Array.from(k), weight: Float64Array.from(weight), logConst, shoppers,
    pattern, patternRow: Int32Array.from(patternRow),
  };
}

/** Design cell of each base's catch cell (−1: none), for mixedData when γ is fitted with the catch trials. */
export function catchCellsOf(d: Design, testCells: number, bases: number): Int32Array {
  const out = new Int32Array(bases).fill(-1);
  for (let i = 0; i < d.nCells; i++) if (d.isCatch[i] && d.gIdx[i] >= 0) out[d.src[i] - testCells] = i;
  return out;
}

export interface MixedProblem {
  d: Design;
  data: MixedData;
  nPar: number;
  iBeta: number;
  /** Index of λ, or −1 when the lapse rate is fixed. */
  iLapse: number;
  iSigma: number;
  lower: Float64Array;
  upper: Float64Array;
  /** Rules for NODE_LEVELS (or the one fixed rule given to mixedProblem). */
  rules: GaussHermiteRule[];
  /** Per row: the centre of its integrand (warm start) and its width. */
  mode: Float64Array;
  scale: Float64Array;
  grad: Float64Array;
  info: Float64Array;
  /** Per design cell at the current ψ: α_i, γ_i and the curve's height s_i = 1 − γ_i − λ (0 for a catch cell). */
  alpha: Float64Array;
  gam: Float64Array;
  height: Float64Array;
  nodeGrad: Float64Array;
  nodeLog: Float64Array;
  nodeZ: Float64Array;
  nodeW: Float64Array;
  /** Rows integrated on the fallback grid (over all evaluations so far). */
  fallbacks: number;
  /** Row integrals taken on the shared grid, and those that needed the per-row adaptive rule. */
  shared: number;
  adaptive: number;
  /** Whether the shared grid is used at all (false: every row adaptive, as the reference tests check both). */
  useGrid: boolean;
  grid: SharedGrid;
  /** Whether the rows' widths (pr.scale) come from a grid evaluation yet. */
  gridSeen: boolean;
  /** σ of the last grid evaluation. */
  gridSigma: number;
  score: Float64Array;
  evaluations: number;
}

/**
 * The shared quadrature grid of one evaluation: nodes z_q = (q − half)·h on [−Z_MAX, Z_MAX]
 * and, per design cell i and node q (at [i·Q + q]), ln P, ln(1 − P) and the pieces of the
 * score, so that a shopper's integrand at a node is a sum of table entries over its cells.
 * Per cell pattern (MixedData.pattern) it also holds the sums over the pattern's cells with
 * every answer "yes" and every answer "no" (and their scores), the two references from which
 * a row needs only the cells where its answers differ.
 */
interface SharedGrid {
  h: number;
  Q: number;
  half: number;
  lp: Float64Array;
  lq: Float64Array;
  uy: Float64Array;
  un: Float64Array;
  dd: Float64Array;
  ff: Float64Array;
  tt: Float64Array;
  /** For a row read against a pattern's reference: ln P − ln(1 − P), u = 1/(P(1 − P)), u·D, u·D·t, u·f. */
  dl: Float64Array;
  ud: Float64Array;
  udd: Float64Array;
  uddt: Float64Array;
  udf: Float64Array;
  g: Float64Array;
  post: Float64Array;
  /** Per pattern and node [pat·Q + q]: Σ n·ln P (all yes) and Σ n·ln(1 − P) (all no). */
  allYes: Float64Array;
  allNo: Float64Array;
  /** Their scores, [(pat·Q + q)·nPar + a]. */
  scoreYes: Float64Array;
  scoreNo: Float64Array;
}

/** Largest shared grid (nodes); a finer one would cost more than the adaptive rule. */
const GRID_MAX = 2401;
/** Nodes beyond ±Z_MAX carry less than φ(9) ≈ 1e-18 of the shopper-effect density. */
const Z_MAX = 9;
/** A node share below which a window's end is taken as the integrand's tail. */
const TAIL_SHARE = 1e-11;
/** A row's window: its last centre ± this many of its widths (a normal tail there is e^(−28)). */
const WINDOW = 7.5;
/** Narrowest integrand, in grid steps, the grid integrates; narrower rows go to the adaptive rule. */
const MIN_WIDTH = 1.2;
/** Quantile of the rows' widths that sets the grid's step. */
const NARROW_QUANTILE = 0.02;

function emptyGrid(): SharedGrid {
  const e = new Float64Array(0);
  return {
    h: 0, Q: 0, half: 0, lp: e, lq: e, uy: e, un: e, dd: e, ff: e, tt: e, dl: e, ud: e, udd: e, uddt: e, udf: e,
    g: e, post: e, allYes: e, allNo: e, scoreYes: e, scoreNo: e,
  };
}

/** (Re)allocates the grid's tables when they are too small for Q nodes. */
function sizeGrid(pr: MixedProblem, Q: number): SharedGrid {
  const G = pr.grid, size = Q * pr.d.nCells, P = pr.data.patternRow.length;
  if (G.lp.length < size) {
    for (const key of ['lp', 'lq', 'uy', 'un', 'dd', 'ff', 'tt', 'dl', 'ud', 'udd', 'uddt', 'udf'] as const) G[key] = new Float64Array(size);
  }
  if (G.g.length < Q) { G.g = new Float64Array(Q); G.post = new Float64Array(Q); }
  if (G.allYes.length < P * Q) {
    G.allYes = new Float64Array(P * Q); G.allNo = new Float64Array(P * Q);
    G.scoreYes = new Float64Array(P * Q * pr.nPar); G.scoreNo = new Float64Array(P * Q * pr.nPar);
  }
  return G;
}

/** A mixed problem over a fixed-effect design (jointDesign / baseDesign) and shoppers' rows. */
export function mixedProblem(d: Design, data: MixedData, nodes?: number): MixedProblem {
  // ψ = the fixed design's parameters [θ, ln β, λ?, γ…] followed by σ
  const p = d.pTheta;
  const iLapse = d.lapseFixed === null ? p + 1 : -1;
  const nPar = d.nPar + 1;
  const lower = new Float64Array(nPar), upper = new Float64Array(nPar);
  lower.set(d.lower); upper.set(d.upper);
  lower[nPar - 1] = 0; upper[nPar - 1] = SIGMA_MAX;
  const rules = nodes === undefined ? NODE_LEVELS.map((q) => gaussHermite(q)) : [gaussHermite(nodes)];
  return {
    d, data, nPar, iBeta: p, iLapse, iSigma: nPar - 1, lower, upper, rules,
    mode: new Float64Array(data.rows), scale: new Float64Array(data.rows).fill(Z_MAX),
    grad: new Float64Array(nPar), info: new Float64Array(nPar * nPar),
    alpha: new Float64Array(d.nCells), gam: new Float64Array(d.nCells), height: new Float64Array(d.nCells),
    nodeGrad: new Float64Array(MAX_GRID * nPar), nodeLog: new Float64Array(MAX_GRID), score: new Float64Array(nPar),
    nodeZ: new Float64Array(MAX_GRID), nodeW: new Float64Array(MAX_GRID),
    evaluations: 0, fallbacks: 0, shared: 0, adaptive: 0, useGrid: nodes === undefined, grid: emptyGrid(), gridSeen: false, gridSigma: 0,
  };
}

/** ψ from a fixed-effect fit's parameters ([θ, ln β, λ?, γ…]) and a σ. */
export function mixedStart(pr: MixedProblem, fixedParams: ArrayLike<number>, sigma: number): Float64Array {
  const psi = new Float64Array(pr.nPar);
  for (let j = 0; j < pr.iSigma; j++) psi[j] = fixedParams[j];
  psi[pr.iSigma] = sigma;
  project(pr, psi);
  return psi;
}

function project(pr: MixedProblem, v: Float64Array): void {
  for (let j = 0; j < pr.nPar; j++) v[j] = v[j] < pr.lower[j] ? pr.lower[j] : v[j] > pr.upper[j] ? pr.upper[j] : v[j];
}

/**
 * Marginal log-likelihood at ψ (without the ln C(n, k) constant, with the γ add-half terms of
 * fit-core.ts). With `withScores` it also fills pr.grad and pr.info (Σ over shoppers of
 * weight · score · scoreᵀ, the BHHH matrix).
 */
export function mixedLogLik(pr: MixedProblem, psi: ArrayLike<number>, withScores: boolean): number {
  const { d, data, nPar, iBeta, iLapse, iSigma, rules, alpha, gam, height, grad, info, nodeZ, nodeW, score } = pr;
  const p = d.pTheta;
  pr.evaluations++;
  const lapse = iLapse >= 0 ? psi[iLapse] : d.lapseFixed!;
  for (let i = 0; i < d.nCells; i++) {
    let a = d.offset[i];
    for (let j = 0; j < p; j++) a += d.z[i * p + j] * psi[j];
    alpha[i] = a;
    gam[i] = d.gIdx[i] >= 0 ? psi[d.gIdx[i]] : d.gamma[i];
    height[i] = d.isCatch[i] ? 0 : 1 - gam[i] - lapse;
  }
  const beta = Math.exp(psi[iBeta]);
  const sigma = psi[iSigma];
  if (withScores) { grad.fill(0); info.fill(0); }
  const grid = sigma > 0 && pr.useGrid ? buildGrid(pr, beta, sigma, withScores) : null;
  let total = 0;
  for (let r = 0; r < data.rows; r++) {
    const c0 = data.start[r], c1 = data.start[r + 1];
    let ls: number;
    if (withScores) score.fill(0);
    if (sigma <= 0) {
      // σ = 0: the shopper's likelihood is the fixed model's; ∂/∂σ is 0 by symmetry in z.
      ls = 0;
      for (let c = c0; c < c1; c++) ls += cellTerm(pr, c, 0, beta, 0, withScores ? score : null);
    } else if (grid && !Number.isNaN(ls = gridRow(pr, grid, r, beta, withScores))) {
      pr.shared++;
    } else {
      pr.adaptive++;
      const g2 = findMode(pr, r, beta, sigma);
      const z = pr.mode[r];
      const tau = 1 / Math.sqrt(-g2);
      pr.scale[r] = tau;
      const spread = Math.SQRT2 * tau;
      const rho = beta * sigma * tau;
      let level = 0;
      while (level < rules.length - 1 && rho > RHO_LIMITS[level]) level++;
      const rule = rules[level], Q = rule.nodes.length;
      const logSpread = Math.log(spread);
      for (let q = 0; q < Q; q++) {
        const tq = rule.nodes[q];
        nodeZ[q] = z + spread * tq;
        nodeW[q] = rule.logWeights[q] + tq * tq + logSpread;
      }
      ls = rowIntegral(pr, r, Q, beta, sigma, withScores);
      // A normal-shaped integrand puts almost nothing on the rule's outermost nodes (the
      // Gaussian share there is w/√π, below 3e-5 for 9 nodes). Much more there means the
      // integrand reaches past the rule (a second mode: answers that contradict each other on
      // a steep curve, or a long plateau), so the row is integrated on a fine uniform grid
      // instead (the trapezoid rule, exponentially accurate for smooth integrands on the line).
      const outer = Math.max(pr.nodeLog[0], pr.nodeLog[Q - 1]);
      if (outer > OUTER_SHARE) {
        // The integrand's singularities (poles of the logistic) lie π/(βσ) off the real line,
        // so the trapezoid error is about exp(−2π²/(βσh)) < 1e-15 with h ≤ 0.5/(βσ); other
        // modes further than a few units from ẑ are crushed by the normal density.
        const lo = Math.max(-Z_MAX, z - 8 * tau - 4), hi = Math.min(Z_MAX, z + 8 * tau + 4);
        let h = Math.min(0.25, 0.5 / (beta * sigma));
        let count = Math.ceil((hi - lo) / h) + 1;
        if (count > MAX_GRID) { count = MAX_GRID; h = (hi - lo) / (count - 1); }
        const lh = Math.log(h);
        for (let q = 0; q < count; q++) { nodeZ[q] = lo + q * h; nodeW[q] = lh; }
        ls = rowIntegral(pr, r, count, beta, sigma, withScores);
        pr.fallbacks++;
      }
    }
    const w = data.weight[r];
    total += w * ls;
    if (withScores) {
      for (let a = 0; a < nPar; a++) {
        grad[a] += w * score[a];
        const wa = w * score[a];
        for (let b = 0; b <= a; b++) info[a * nPar + b] += wa * score[b];
      }
    }
  }
  if (withScores) for (let a = 0; a < nPar; a++) for (let b = 0; b < a; b++) info[b * nPar + a] = info[a * nPar + b];
  // the γ add-half terms, as in the fixed models (fit-core.ts), so σ = 0 is their objective exactly
  for (let g = 0; g < d.nGamma; g++) {
    const v = psi[d.gammaStart + g];
    total += GAMMA_PRIOR * (Math.log(v) + Math.log(1 - v));
    if (withScores) {
      const a = d.gammaStart + g;
      grad[a] += GAMMA_PRIOR * (1 / v - 1 / (1 - v));
      // the penalty's own curvature (exact): near γ = 0 it dominates, and BHHH alone would crawl there
      info[a * nPar + a] += GAMMA_PRIOR * (1 / (v * v) + 1 / ((1 - v) * (1 - v)));
    }
  }
  return total;
}

/**
 * The shared grid for this ψ, or null when it would be finer than GRID_MAX nodes. Its step
 * h is set by the two scales on which a shopper's integrand can change: the transition of
 * one cell, 1/(βσ) in z (the logistic's poles lie π/(βσ) off the real line, so the
 * trapezoid rule's error is about exp(−2π²/(βσh)) ≈ 1e-14 at h = 0.6/(βσ)), and the width of
 * the narrowest shopper's integrand: on the first evaluation its bound
 * (1 + (βσ)²·n_max/4)^(−1/2) for n_max trials (each trial adds at most (βσ)²/4 to the
 * curvature in z), afterwards the narrowest widths actually seen (2nd percentile). A row whose own width comes
 * out below MIN_WIDTH·h is integrated adaptively instead (gridRow), so the width is checked, not trusted.
 */
function buildGrid(pr: MixedProblem, beta: number, sigma: number, withScores: boolean): SharedGrid | null {
  const { d, data, alpha, gam, height, nPar } = pr;
  const bs = beta * sigma;
  let width: number;
  if (pr.gridSeen) {
    // 0.7 of the narrowest rows (the 2nd percentile of widths: one shopper with far more trials
    // than the rest goes adaptive rather than making the grid fine for everyone), so that a row
    // may narrow by a sixth before it leaves the grid
    const widths = Float64Array.from(pr.scale).sort();
    const narrowest = widths[Math.floor(NARROW_QUANTILE * (widths.length - 1))];
    // a larger σ narrows the rows in z about in proportion (their width in ln threshold stays)
    width = 0.7 * narrowest * Math.min(1, pr.gridSigma / sigma);
  } else {
    let nMax = 0;
    for (let r = 0; r < data.rows; r++) {
      let t = 0;
      for (let c = data.start[r]; c < data.start[r + 1]; c++) if (!d.isCatch[data.cell[c]]) t += data.n[c];
      if (t > nMax) nMax = t;
    }
    width = 0.9 / Math.sqrt(1 + (bs * bs * nMax) / 4);
  }
  const h = Math.min(0.5, 0.6 / bs, width);
  const half = Math.ceil(Z_MAX / h), Q = 2 * half + 1;
  if (!(Q <= GRID_MAX)) return null;
  pr.gridSeen = true;
  pr.gridSigma = sigma;
  const G = sizeGrid(pr, Q);
  G.h = h; G.Q = Q; G.half = half;
  const { lp, lq, uy, un, dd, ff, tt, dl, ud, udd, uddt, udf } = G;
  for (let i = 0; i < d.nCells; i++) {
    const o = i * Q, s = height[i], gi = gam[i];
    if (d.isCatch[i]) {
      const P = gi < P_EPS ? P_EPS : gi > 1 - P_EPS ? 1 - P_EPS : gi;
      lp.fill(Math.log(P), o, o + Q); lq.fill(Math.log(1 - P), o, o + Q); dl.fill(Math.log(P) - Math.log(1 - P), o, o + Q);
      uy.fill(1 / P, o, o + Q); un.fill(-1 / (1 - P), o, o + Q); ud.fill(1 / (P * (1 - P)), o, o + Q);
      for (const t of [dd, ff, tt, udd, uddt, udf]) t.fill(0, o, o + Q);
      continue;
    }
    const base = beta * (d.x[i] - alpha[i]);
    for (let q = 0; q < Q; q++) {
      const t = base - bs * (q - half) * h;
      const f = 1 / (1 + Math.exp(-t));
      let P = gi + s * f;
      P = P < P_EPS ? P_EPS : P > 1 - P_EPS ? 1 - P_EPS : P;
      const a = Math.log(P), b = Math.log(1 - P), u = 1 / (P * (1 - P)), D = s * f * (1 - f);
      lp[o + q] = a; lq[o + q] = b; dl[o + q] = a - b;
      uy[o + q] = 1 / P; un[o + q] = -1 / (1 - P); dd[o + q] = D; ff[o + q] = f; tt[o + q] = t;
      ud[o + q] = u; udd[o + q] = u * D; uddt[o + q] = u * D * t; udf[o + q] = u * f;
    }
  }
  // the all-yes and all-no references of each pattern
  const { allYes, allNo, scoreYes, scoreNo } = G;
  const p = d.pTheta;
  for (let pat = 0; pat < data.patternRow.length; pat++) {
    const r = data.patternRow[pat], po = pat * Q;
    allYes.fill(0, po, po + Q); allNo.fill(0, po, po + Q);
    if (withScores) { scoreYes.fill(0, po * nPar, (po + Q) * nPar); scoreNo.fill(0, po * nPar, (po + Q) * nPar); }
    for (let c = data.start[r]; c < data.start[r + 1]; c++) {
      const i = data.cell[c], o = i * Q, n = data.n[c], gi = d.gIdx[i];
      for (let q = 0; q < Q; q++) { allYes[po + q] += n * lp[o + q]; allNo[po + q] += n * lq[o + q]; }
      if (!withScores) continue;
      for (let side = 0; side < 2; side++) {
        const u = side === 0 ? uy : un, out = side === 0 ? scoreYes : scoreNo;
        for (let q = 0; q < Q; q++) {
          const w = n * u[o + q], wd = w * dd[o + q], so = (po + q) * nPar;
          for (let j = 0; j < p; j++) out[so + j] -= beta * wd * d.z[i * p + j];
          out[so + p] += wd * tt[o + q];
          if (pr.iLapse >= 0) out[so + pr.iLapse] -= w * ff[o + q];
          if (gi >= 0) out[so + gi] += w * (1 - ff[o + q]);
          out[so + nPar - 1] -= beta * wd * (q - half) * h;
        }
      }
    }
  }
  return G;
}

/**
 * Row r's log integral on the shared grid, over the window of nodes where its integrand lives
 * (from the row's last centre and width, widened until both ends are tail); with scores the
 * row's score goes into pr.score. NaN when the row must be integrated adaptively: its
 * integrand is narrower than the grid resolves, or still heavy at ±Z_MAX.
 */
function gridRow(pr: MixedProblem, G: SharedGrid, r: number, beta: number, withScores: boolean): number {
  const { d, data, score, nPar } = pr;
  const { h, Q, half, lp, lq, g, post } = G;
  const c0 = data.start[r], c1 = data.start[r + 1];
  // with a pattern: start from the all-yes or the all-no reference, whichever leaves fewer cells to correct
  const pat = data.pattern[r];
  let fromYes = false;
  if (pat >= 0) {
    let notYes = 0, notNo = 0;
    for (let c = c0; c < c1; c++) { if (data.k[c] < data.n[c]) notYes++; if (data.k[c] > 0) notNo++; }
    fromYes = notYes < notNo;
  }
  const ref = pat < 0 ? null : fromYes ? G.allYes : G.allNo;
  let lo = Math.max(0, Math.floor((pr.mode[r] - WINDOW * pr.scale[r]) / h) + half);
  let hi = Math.min(Q - 1, Math.ceil((pr.mode[r] + WINDOW * pr.scale[r]) / h) + half);
  let mx = -Infinity, sum = 0;
  for (let attempt = 0; ; attempt++) {
    if (ref) {
      const po = pat * Q;
      for (let q = lo; q <= hi; q++) { const z = (q - half) * h; g[q] = ref[po + q] - 0.5 * z * z; }
      for (let c = c0; c < c1; c++) {
        const o = data.cell[c] * Q;
        // all yes → this row: (n − k) answers turn to no; all no → this row: k turn to yes
        const m = fromYes ? data.n[c] - data.k[c] : data.k[c];
        if (m === 0) continue;
        const mm = fromYes ? -m : m, dl = G.dl;
        for (let q = lo; q <= hi; q++) g[q] += mm * dl[o + q];
      }
    } else {
      for (let q = lo; q <= hi; q++) { const z = (q - half) * h; g[q] = -0.5 * z * z; }
      for (let c = c0; c < c1; c++) {
        const o = data.cell[c] * Q, k = data.k[c], nk = data.n[c] - k;
        if (k > 0 && nk > 0) for (let q = lo; q <= hi; q++) g[q] += k * lp[o + q] + nk * lq[o + q];
        else if (k > 0) for (let q = lo; q <= hi; q++) g[q] += k * lp[o + q];
        else for (let q = lo; q <= hi; q++) g[q] += nk * lq[o + q];
      }
    }
    mx = -Infinity;
    for (let q = lo; q <= hi; q++) if (g[q] > mx) mx = g[q];
    sum = 0;
    for (let q = lo; q <= hi; q++) { post[q] = Math.exp(g[q] - mx); sum += post[q]; }
    const tailLo = post[lo] / sum > TAIL_SHARE, tailHi = post[hi] / sum > TAIL_SHARE;
    if ((tailLo && lo === 0) || (tailHi && hi === Q - 1)) return NaN;
    if (!tailLo && !tailHi) break;
    if (attempt >= 6) return NaN;
    const wide = hi - lo + 1;
    if (tailLo) lo = Math.max(0, lo - wide);
    if (tailHi) hi = Math.min(Q - 1, hi + wide);
  }
  let m1 = 0, m2 = 0;
  for (let q = lo; q <= hi; q++) { post[q] /= sum; const z = (q - half) * h; m1 += post[q] * z; m2 += post[q] * z * z; }
  const sd = Math.sqrt(Math.max(0, m2 - m1 * m1));
  // the trapezoid rule's relative error on a normal-shaped integrand is 2·exp(−2π²(sd/h)²) < 1e-12 here
  if (!(sd >= MIN_WIDTH * h)) return NaN;
  pr.mode[r] = m1; pr.scale[r] = sd;
  if (withScores) {
    const { uy, un, dd, ff, tt } = G;
    const p = d.pTheta;
    // trim the window to the nodes that carry weight
    while (lo < hi && post[lo] < 1e-15) lo++;
    while (hi > lo && post[hi] < 1e-15) hi--;
    score.fill(0);
    if (ref) {
      const sref = fromYes ? G.scoreYes : G.scoreNo;
      for (let q = lo; q <= hi; q++) {
        const wq = post[q], so = (pat * Q + q) * nPar;
        for (let a = 0; a < nPar; a++) score[a] += wq * sref[so + a];
      }
    }
    const { ud, udd, uddt, udf } = G;
    for (let c = c0; c < c1; c++) {
      const i = data.cell[c], o = i * Q, k = data.k[c], nk = data.n[c] - k;
      let a0 = 0, a1 = 0, a2 = 0, a3 = 0, a4 = 0;
      if (ref) {
        // only the change from the reference: m answers turned, each adding ±(1/P + 1/(1 − P))·∂P/∂ψ
        const m = fromYes ? nk : k;
        if (m === 0) continue;
        for (let q = lo; q <= hi; q++) {
          const w = post[q], wd = w * udd[o + q];
          a0 += w * ud[o + q]; a1 += wd; a2 += w * uddt[o + q]; a3 += wd * (q - half); a4 += w * udf[o + q];
        }
        const mm = fromYes ? -m : m;
        a0 *= mm; a1 *= mm; a2 *= mm; a3 *= mm; a4 *= mm;
      } else {
        // weights of ∂P/∂ψ in full: k/P − (n − k)/(1 − P)
        for (let q = lo; q <= hi; q++) {
          const om = post[q] * (k * uy[o + q] + nk * un[o + q]);
          const od = om * dd[o + q];
          a0 += om; a1 += od; a2 += od * tt[o + q]; a3 += od * (q - half); a4 += om * ff[o + q];
        }
      }
      for (let j = 0; j < p; j++) score[j] -= beta * a1 * d.z[i * p + j];
      score[p] += a2;
      if (pr.iLapse >= 0) score[pr.iLapse] -= a4;
      const gi = d.gIdx[i];
      if (gi >= 0) score[gi] += a0 - a4;
      score[nPar - 1] -= beta * a3 * h;
    }
  }
  return mx + Math.log(sum) + Math.log(h) - LN_SQRT_2PI;
}

/**
 * ∫ exp(g(z)) dz for row r on the points pr.nodeZ[0..count) with log weights pr.nodeW (which
 * include any e^(t²) factor of the rule): returns the log of the sum and, with scores, puts
 * the row's score (node scores averaged with the integrand's weights) into pr.score.
 * pr.nodeLog[q] is left holding node q's share of the integral.
 */
function rowIntegral(pr: MixedProblem, r: number, count: number, beta: number, sigma: number, withScores: boolean): number {
  const { data, nPar, nodeGrad, nodeLog, nodeZ, nodeW, score } = pr;
  const c0 = data.start[r], c1 = data.start[r + 1];
  let mx = -Infinity;
  for (let q = 0; q < count; q++) {
    const zq = nodeZ[q];
    let g = -0.5 * zq * zq - LN_SQRT_2PI;
    const ng = withScores ? nodeGrad.subarray(q * nPar, (q + 1) * nPar) : null;
    if (ng) ng.fill(0);
    for (let c = c0; c < c1; c++) g += cellTerm(pr, c, zq, beta, sigma, ng);
    nodeLog[q] = nodeW[q] + g;
    if (nodeLog[q] > mx) mx = nodeLog[q];
  }
  let sum = 0;
  for (let q = 0; q < count; q++) { nodeLog[q] = Math.exp(nodeLog[q] - mx); sum += nodeLog[q]; }
  for (let q = 0; q < count; q++) nodeLog[q] /= sum;
  if (withScores) {
    score.fill(0);
    for (let q = 0; q < count; q++) {
      const wq = nodeLog[q];
      if (wq === 0) continue;
      for (let a = 0; a < nPar; a++) score[a] += wq * nodeGrad[q * nPar + a];
    }
  }
  return mx + Math.log(sum);
}

const modeState = new Float64Array(4);

/** g(z) = Σ ℓ_c(z) − z²/2 and its first two derivatives (exact, and the expected-information one). */
function modeTerms(pr: MixedProblem, r: number, z: number, beta: number, sigma: number): void {
  const { d, data, alpha, gam, height } = pr;
  let g = -0.5 * z * z, g1 = -z, g2 = -1, fisher = -1;
  const u = -beta * sigma;
  for (let c = data.start[r]; c < data.start[r + 1]; c++) {
    const i = data.cell[c], n = data.n[c], k = data.k[c];
    const s = height[i];
    // a catch cell (height 0) does not depend on z: its constant is all it adds
    const f = s === 0 ? 0 : 1 / (1 + Math.exp(-beta * (d.x[i] - alpha[i] - sigma * z)));
    const df = f * (1 - f);
    let P = gam[i] + s * f;
    P = P < P_EPS ? P_EPS : P > 1 - P_EPS ? 1 - P_EPS : P;
    if (k > 0) g += k * Math.log(P);
    if (n - k > 0) g += (n - k) * Math.log(1 - P);
    const d1 = s * df * u, d2 = s * df * (1 - 2 * f) * u * u;
    const w1 = k / P - (n - k) / (1 - P);
    g1 += w1 * d1;
    g2 += w1 * d2 - (k / (P * P) + (n - k) / ((1 - P) * (1 - P))) * d1 * d1;
    fisher -= (n / (P * (1 - P))) * d1 * d1;
  }
  modeState[0] = g; modeState[1] = g1; modeState[2] = g2; modeState[3] = fisher;
}

/**
 * Mode of shopper row r's integrand by Newton's method with an ascent safeguard (a step that
 * lowers g is halved), warm-started at the row's last mode so the mode is tracked
 * continuously as ψ moves; sets pr.mode[r] and returns the curvature g''(ẑ) (< 0; the
 * expected-information value where the exact one is not negative).
 */
function findMode(pr: MixedProblem, r: number, beta: number, sigma: number): number {
  let z = pr.mode[r];
  modeTerms(pr, r, z, beta, sigma);
  let [g, g1, g2, fisher] = modeState;
  for (let it = 0; it < 50; it++) {
    const h = g2 < -1e-6 ? g2 : fisher;
    let step = -g1 / h;
    if (step > 3) step = 3; else if (step < -3) step = -3;
    if (Math.abs(step) < 1e-10) break;
    let moved = false;
    for (let half = 0; half < 40; half++) {
      modeTerms(pr, r, z + step, beta, sigma);
      if (modeState[0] >= g - 1e-13 * Math.abs(g)) { moved = true; break; }
      step *= 0.5;
    }
    if (!moved) break;
    z += step;
    [g, g1, g2, fisher] = modeState;
    if (Math.abs(step) < 1e-9) break;
  }
  pr.mode[r] = z;
  return g2 < -1e-6 ? g2 : fisher;
}

/** One cell's binomial log term at shopper effect z; adds ∂/∂ψ into g when given. */
function cellTerm(
  pr: MixedProblem, c: number, z: number, beta: number, sigma: number, g: Float64Array | null,
): number {
  const { d, data, alpha, gam, height } = pr;
  const i = data.cell[c], n = data.n[c], k = data.k[c];
  const s = height[i];
  const t = s === 0 ? 0 : beta * (d.x[i] - alpha[i] - sigma * z);
  const f = s === 0 ? 0 : 1 / (1 + Math.exp(-t));
  let P = gam[i] + s * f;
  P = P < P_EPS ? P_EPS : P > 1 - P_EPS ? 1 - P_EPS : P;
  let ll = 0;
  if (k > 0) ll += k * Math.log(P);
  if (n - k > 0) ll += (n - k) * Math.log(1 - P);
  if (g) {
    const w1 = k / P - (n - k) / (1 - P);
    const sdf = s * f * (1 - f);
    const common = -w1 * sdf * beta;
    const p = d.pTheta;
    for (let j = 0; j < p; j++) g[j] += common * d.z[i * p + j];
    g[p] += w1 * sdf * t;
    if (pr.iLapse >= 0) g[pr.iLapse] -= w1 * f;
    if (d.gIdx[i] >= 0) g[d.gIdx[i]] += w1 * (1 - f);
    g[pr.iSigma] += common * z;
  }
  return ll;
}

export interface MixedFit {
  params: Float64Array;
  /** Marginal log-likelihood without the ln C(n, k) constant. */
  logLik: number;
  converged: boolean;
  iterations: number;
}

/**
 * Maximum marginal likelihood by projected BHHH with backtracking. `fixSigma` holds σ (the
 * profile likelihood). Converged means the Newton decrement gᵀH⁻¹g fell below `tol`
 * (log-likelihood units) at a point no line search could improve on.
 */
export function fitMixed(
  pr: MixedProblem, start: ArrayLike<number>,
  opts: { fixSigma?: number; tol?: number; maxIterations?: number } = {},
): MixedFit {
  const nPar = pr.nPar;
  const tol = opts.tol ?? 1e-6;
  const maxIt = opts.maxIterations ?? 100;
  const psi = Float64Array.from(start);
  if (opts.fixSigma !== undefined) psi[pr.iSigma] = opts.fixSigma;
  project(pr, psi);
  let ll = mixedLogLik(pr, psi, true);
  const grad = new Float64Array(nPar), info = new Float64Array(nPar * nPar);
  const freeIdx = new Int32Array(nPar);
  const sub = new Float64Array(nPar * nPar), subG = new Float64Array(nPar), subX = new Float64Array(nPar), work = new Float64Array(nPar * nPar);
  const step = new Float64Array(nPar), cand = new Float64Array(nPar);
  let converged = false, it = 0;
  // BHHH's outer products need many more shoppers than parameters to stand in for the
  // information; with few shoppers, or when BHHH crawls, Newton steps on the observed
  // information (differences of the analytic score, nPar + 1 evaluations) take over
  const newtonFrom = pr.data.shoppers < NEWTON_SHOPPERS_PER_PARAMETER * nPar ? 1 : BHHH_ITERATIONS + 1;
  for (it = 1; it <= maxIt; it++) {
    if (it >= newtonFrom) {
      const H = observedInformation(pr, psi, opts.fixSigma !== undefined);
      grad.set(pr.grad);
      // keep the observed information where it is positive definite on the diagonal, else BHHH's
      let ok = true;
      for (let j = 0; j < nPar; j++) if (!(H[j * nPar + j] > 0) && !(j === pr.iSigma && opts.fixSigma !== undefined)) ok = false;
      info.set(ok ? H : pr.info);
    } else {
      grad.set(pr.grad); info.set(pr.info);
    }
    let m = 0;
    for (let j = 0; j < nPar; j++) {
      if (j === pr.iSigma && opts.fixSigma !== undefined) continue;
      const atLo = psi[j] <= pr.lower[j] + 1e-12 && grad[j] <= 0;
      const atHi = psi[j] >= pr.upper[j] - 1e-12 && grad[j] >= 0;
      if (!atLo && !atHi) freeIdx[m++] = j;
    }
    if (m === 0) { converged = true; break; }
    for (let a = 0; a < m; a++) {
      subG[a] = grad[freeIdx[a]];
      for (let b = 0; b < m; b++) sub[a * m + b] = info[freeIdx[a] * nPar + freeIdx[b]];
    }
    let ridge = 1e-10, ok = false;
    for (let tries = 0; tries < 8 && !ok; tries++) {
      for (let a = 0; a < m; a++) sub[a * m + a] = info[freeIdx[a] * nPar + freeIdx[a]] * (1 + ridge) + ridge;
      ok = choleskySolve(sub, subG, m, subX, work);
      ridge *= 100;
    }
    if (!ok) break;
    step.fill(0);
    let decrement = 0;
    for (let a = 0; a < m; a++) { step[freeIdx[a]] = subX[a]; decrement += subX[a] * subG[a]; }
    if (decrement < tol) { converged = true; break; }
    let t = 1, llc = -Infinity, accepted = false;
    for (let h = 0; h < 30; h++) {
      for (let j = 0; j < nPar; j++) cand[j] = psi[j] + t * step[j];
      project(pr, cand);
      llc = mixedLogLik(pr, cand, true);
      if (llc >= ll - 1e-12 * Math.abs(ll)) { accepted = true; break; }
      t *= 0.5;
    }
    if (!accepted) {
      // no improvement along the BHHH direction: only an optimum if the decrement is already tiny
      converged = decrement < 1e3 * tol;
      mixedLogLik(pr, psi, true);
      break;
    }
    psi.set(cand);
    const gain = llc - ll;
    ll = llc;
    // Near the optimum the score (nodes held fixed) and the quadrature carry errors of order
    // 1e-9: once steps gain nothing measurable, stop, and call it an optimum only if the
    // decrement is small on the scale of a log-likelihood unit.
    if (gain < 1e-9 * Math.max(1, Math.abs(ll)) || (t < 1 / 64 && gain < 1e-6)) { converged = decrement < 1e-3; break; }
  }
  return { params: psi, logLik: ll, converged, iterations: Math.min(it, maxIt) };
}

/**
 * Observed information −∂²ℓ/∂ψ² by forward differences of the analytic score, symmetrised.
 * σ is included even at 0: ℓ is even in σ, so σ = 0 is an interior point of that function.
 */
export function observedInformation(pr: MixedProblem, psi: Float64Array, skipSigma = false): Float64Array {
  const nPar = pr.nPar;
  mixedLogLik(pr, psi, true);
  const g0 = Float64Array.from(pr.grad);
  const H = new Float64Array(nPar * nPar);
  const p = Float64Array.from(psi);
  for (let j = 0; j < nPar; j++) {
    if (skipSigma && j === pr.iSigma) continue;
    let h = 1e-5 * Math.max(1, Math.abs(psi[j]));
    if (j !== pr.iSigma && psi[j] + h > pr.upper[j]) h = -h;
    p[j] = psi[j] + h;
    mixedLogLik(pr, p, true);
    for (let a = 0; a < nPar; a++) H[a * nPar + j] = -(pr.grad[a] - g0[a]) / h;
    p[j] = psi[j];
  }
  for (let a = 0; a < nPar; a++) for (let b = 0; b < a; b++) {
    const v = 0.5 * (H[a * nPar + b] + H[b * nPar + a]);
    H[a * nPar + b] = v; H[b * nPar + a] = v;
  }
  mixedLogLik(pr, psi, true);
  return H;
}

/** Covariance from the observed information; parameters on a bound (other than σ) get NaN. */
export function mixedCovariance(pr: MixedProblem, psi: Float64Array): Float64Array {
  const nPar = pr.nPar;
  const H = observedInformation(pr, psi);
  const free: number[] = [];
  for (let j = 0; j < nPar; j++) {
    if (j === pr.iSigma || (psi[j] > pr.lower[j] + 1e-9 && psi[j] < pr.upper[j] - 1e-9)) free.push(j);
  }
  const m = free.length;
  const a = new Float64Array(m * m);
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) a[i * m + j] = H[free[i] * nPar + free[j]];
  const inv = invertSpd(a, m);
  const cov = new Float64Array(nPar * nPar).fill(NaN);
  if (inv) for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) cov[free[i] * nPar + free[j]] = inv[i * m + j];
  return cov;
}

export interface SigmaProfile {
  ci: [number, number] | null;
  /** Deviance of the pooled (σ = 0) fit against the mixed fit, and its boundary p-value. */
  chi2: number;
  p: number;
  /** The best fit found, which may be the σ = 0 one if it beat the starting optimum. */
  fit: MixedFit;
  /** Whether both ends were found (false: the search gave up; the interval is then null). */
  complete: boolean;
}

/**
 * Profile-likelihood interval for σ at level 95 %: the σ values whose profile deviance
 * 2(ℓ̂ − ℓ_p(σ)) stays under χ²₁(0.95). The signed root r(σ) = ±√(2(ℓ̂ − ℓ_p(σ))) is close
 * to linear in σ, so each end is searched from its Wald guess σ̂ ± 1.96·SE (from `cov`, the
 * observed information's inverse at the optimum) by secant steps and regula falsi (profileEnd): one or two refits per
 * end where a blind search took five or more. `pooled` is ℓ_p(0), the fixed model's maximum
 * (without constant).
 */
export function profileSigma(
  pr: MixedProblem, best: MixedFit, pooled: { params: ArrayLike<number>; logLik: number }, cov?: Float64Array | null,
): SigmaProfile {
  let fit = best;
  const iS = pr.iSigma;
  if (pooled.logLik > fit.logLik + 1e-9) {
    // the pooled fit is better: the optimum is at (or near) σ = 0; start again from there
    const again = fitMixed(pr, mixedStart(pr, pooled.params, 0.05));
    fit = again.logLik >= pooled.logLik ? again : { params: mixedStart(pr, pooled.params, 0), logLik: pooled.logLik, converged: again.converged, iterations: again.iterations };
  }
  const lhat = fit.logLik;
  const sHat = fit.params[iS];
  const chi2 = Math.max(0, 2 * (lhat - pooled.logLik));
  const p = chi2 <= 0 ? 1 : 0.5 * chiSquareP(chi2, 1)!;
  const crit = Math.sqrt(CHI2_1_95);
  const profileTol = 1e-4;
  // Each refit starts from the one before it, moved along the other parameters' regression on
  // σ (cov[·, σ]/var σ from the observed information: where the conditional optimum moves as σ
  // is held elsewhere), so it starts close to its optimum.
  const nPar = pr.nPar;
  const varS = cov ? cov[iS * nPar + iS] : NaN;
  const slope = new Float64Array(nPar);
  if (cov && varS > 0) for (let j = 0; j < nPar; j++) if (j !== iS && Number.isFinite(cov[j * nPar + iS])) slope[j] = cov[j * nPar + iS] / varS;
  let from = Float64Array.from(fit.params), fromSigma = sHat;
  const start = new Float64Array(nPar);
  const r = (sigma: number) => {
    for (let j = 0; j < nPar; j++) start[j] = from[j] + slope[j] * (sigma - fromSigma);
    project(pr, start);
    let f = fitMixed(pr, start, { fixSigma: sigma, tol: profileTol });
    if (!f.converged) {
      const plain = fitMixed(pr, from, { fixSigma: sigma, tol: profileTol });
      if (plain.logLik > f.logLik) f = plain;
    }
    from = Float64Array.from(f.params); fromSigma = sigma;
    return Math.sign(sigma - sHat) * Math.sqrt(Math.max(0, 2 * (lhat - f.logLik)));
  };
  const waldSe = Math.sqrt(varS);
  const step = Number.isFinite(waldSe) && waldSe > 0 ? crit * waldSe : Math.max(0.1, 0.5 * sHat);
  let complete = true;
  // lower end: 0 unless σ = 0 lies outside the interval
  let lowerEnd = 0;
  if (chi2 > CHI2_1_95 && sHat > 0) {
    const e = profileEnd(r, sHat, -crit, Math.max(0, sHat - step), 0, -Math.sqrt(chi2));
    if (e === null) complete = false; else lowerEnd = e;
  }
  from = Float64Array.from(fit.params); fromSigma = sHat;
  const upperEnd = profileEnd(r, sHat, crit, Math.min(SIGMA_MAX, sHat + step), SIGMA_MAX, null);
  if (upperEnd === null) complete = false;
  return { ci: complete ? [lowerEnd, upperEnd!] : null, chi2, p, fit, complete };
}

/**
 * One end of σ's profile interval: the σ where the signed root r(σ) reaches `target` (±1.96),
 * searched from σ̂ (r = 0) towards `limit` (0 or SIGMA_MAX, where r is `rLimit` if known).
 * The first try is `guess` (the Wald end, σ̂ ± 1.96·SE); as r is near linear in σ, secant steps
 * from σ̂ and the tries so far usually land within the tolerance in one or two refits, and
 * once two tries bracket the target regula falsi finishes. A search that runs into the limit
 * returns the limit (the interval reaches σ = 0 or the largest spread allowed).
 */
function profileEnd(
  r: (s: number) => number, sHat: number, target: number, guess: number, limit: number, rLimit: number | null,
): number | null {
  const tol = 0.02;
  let a = sHat, ra = 0;
  let b = guess, rb = b === limit && rLimit !== null ? rLimit : r(b);
  for (let it = 0; it < 12; it++) {
    if (Math.abs(rb - target) < tol) return b;
    if ((rb - target) * (ra - target) < 0) return solveRoot(r, a < b ? a : b, (a < b ? ra : rb) - target, a < b ? b : a, (a < b ? rb : ra) - target, tol, target);
    if (b === limit) return limit;
    const slope = (rb - ra) / (b - a);
    let next = slope * Math.sign(target) > 1e-9 ? b + (target - rb) / slope : b + 2 * (b - a);
    // overshoot a little so the next try usually brackets the target
    next += 0.05 * (next - b);
    if ((limit - next) * Math.sign(target) < 0 || next === b) next = limit;
    a = b; ra = rb;
    b = next; rb = b === limit && rLimit !== null ? rLimit : r(b);
  }
  return null;
}

/** Illinois regula falsi for h(s) = 0 on [lo, hi] with h(lo), h(hi) of opposite signs. */
function solveRoot(h: (s: number) => number, lo: number, hLo: number, hi: number, hHi: number, tol: number, target = 0): number | null {
  if (!(hLo * hHi <= 0)) return null;
  let side = 0;
  for (let it = 0; it < 30; it++) {
    const s = (lo * hHi - hi * hLo) / (hHi - hLo);
    const hs = h(s) - target;
    if (Math.abs(hs) < tol || hi - lo < 1e-5) return s;
    if (hs * hHi > 0) { hi = s; hHi = hs; if (side === -1) hLo /= 2; side = -1; }
    else { lo = s; hLo = hs; if (side === 1) hHi /= 2; side = 1; }
  }
  return null;
}
