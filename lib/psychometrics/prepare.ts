// Cells merged and sorted into typed arrays, and the guess-rate set-up: which bases share a γ
// parameter (spot task with catch trials) or what fixed γ each base has (pick 0.5, trip 0,
// a given value). The catch trials themselves enter the likelihood (fit-core.ts); the values
// here are only starting points and the fixed cases.
import { PsychometricsInputError } from './errors';
import type { Cell, CatchCell, Task } from './types';
import { validateCells, validateRate } from './validate';

/** Fewer catch trials than this at a base and its guess rate is pooled over all bases. */
export const MIN_CATCH_PER_BASE = 20;

export type GuessSource = 'task' | 'given' | 'own catch trials' | 'pooled catch trials' | 'no catch trials';

/** Cells merged, sorted by base then discount, in typed arrays ready for the fitter. */
export interface Prepared {
  task: Task;
  bases: number[];
  lnB: Float64Array;
  baseStart: Int32Array;
  baseEnd: Int32Array;
  cellBase: Int32Array;
  discount: Float64Array;
  x: Float64Array;
  n: Float64Array;
  k: Float64Array;
  guess: Float64Array;
  guessSource: GuessSource[];
  catchN: Float64Array;
  catchK: Float64Array;
  /** γ is a parameter estimated with the catch trials in the likelihood (spot task). */
  guessFromCatch: boolean;
  /** γ group of each base (a parameter index among the γs), or −1 when γ is fixed. */
  guessGroup: Int32Array;
  nGuessGroups: number;
  lapseFixed: number | null;
  minX: number;
  maxX: number;
  warnings: string[];
}

export function prepare(
  cellsIn: Cell[], catchIn: CatchCell[], task: Task, guessGiven?: number, lapseGiven?: number,
): Prepared {
  if (task !== 'spot' && task !== 'pick' && task !== 'trip') {
    throw new PsychometricsInputError(`task must be spot, pick or trip, got ${String(task)}`);
  }
  validateCells(cellsIn, catchIn);
  validateRate('guess rate', guessGiven, 0, 0.99);
  validateRate('lapse rate', lapseGiven, 0, 0.5);
  const warnings: string[] = [];
  const merged = new Map<string, Cell>();
  for (const c of cellsIn) {
    if (c.n === 0) continue;
    const key = `${c.basePrice}|${c.discount}`;
    const m = merged.get(key);
    if (m) { m.n += c.n; m.k += c.k; } else merged.set(key, { ...c });
  }
  const cells = [...merged.values()].sort((a, b) => a.basePrice - b.basePrice || a.discount - b.discount);
  const bases = [...new Set(cells.map((c) => c.basePrice))];
  const J = bases.length, m = cells.length;
  const baseIndex = new Map(bases.map((b, i) => [b, i]));
  const prep: Prepared = {
    task, bases, lnB: Float64Array.from(bases, Math.log),
    baseStart: new Int32Array(J), baseEnd: new Int32Array(J), cellBase: new Int32Array(m),
    discount: new Float64Array(m), x: new Float64Array(m), n: new Float64Array(m), k: new Float64Array(m),
    guess: new Float64Array(J), guessSource: [], catchN: new Float64Array(J), catchK: new Float64Array(J),
    guessFromCatch: false, guessGroup: new Int32Array(J).fill(-1), nGuessGroups: 0, lapseFixed: lapseGiven ?? null, minX: Infinity, maxX: -Infinity, warnings,
  };
  prep.baseStart.fill(-1);
  cells.forEach((c, i) => {
    const j = baseIndex.get(c.basePrice)!;
    if (prep.baseStart[j] < 0) prep.baseStart[j] = i;
    prep.baseEnd[j] = i + 1;
    prep.cellBase[i] = j;
    prep.discount[i] = c.discount;
    prep.x[i] = Math.log(c.discount);
    prep.n[i] = c.n;
    prep.k[i] = c.k;
    prep.minX = Math.min(prep.minX, prep.x[i]);
    prep.maxX = Math.max(prep.maxX, prep.x[i]);
  });
  for (const c of catchIn) {
    const j = baseIndex.get(c.basePrice);
    if (j === undefined) continue;
    prep.catchN[j] += c.n;
    prep.catchK[j] += c.k;
  }
  setGuessRates(prep, guessGiven);
  if (J === 1) warnings.push('single base price: the Weber slope and the model comparison need at least two base prices');
  return prep;
}

/**
 * γ per base: given by the caller; 0.5 for pick (two-alternative choice); 0 for trip; for
 * spot a parameter fitted with that base's catch trials in the likelihood. A base with at
 * least MIN_CATCH_PER_BASE catch trials gets its own γ; the others share one γ when their
 * catch trials together reach that many, and otherwise every base shares one γ (too few
 * catch trials to tell bases apart). prep.guess holds the add-half catch rate of each base's
 * group: the starting value.
 */
export function setGuessRates(prep: Prepared, guessGiven?: number): void {
  const J = prep.bases.length;
  prep.guessFromCatch = false;
  prep.guessGroup.fill(-1);
  prep.nGuessGroups = 0;
  if (guessGiven !== undefined || prep.task !== 'spot') {
    const g = guessGiven ?? (prep.task === 'pick' ? 0.5 : 0);
    prep.guess.fill(g);
    prep.guessSource = Array(J).fill(guessGiven !== undefined ? 'given' : 'task');
    return;
  }
  let pn = 0, pk = 0;
  for (let j = 0; j < J; j++) { pn += prep.catchN[j]; pk += prep.catchK[j]; }
  if (pn === 0) {
    prep.guess.fill(0);
    prep.guessSource = Array(J).fill('no catch trials');
    prep.warnings.push('spot task without catch trials: guess rate fixed at 0 (false alarms are not measured)');
    return;
  }
  prep.guessFromCatch = true;
  const own: number[] = [], rest: number[] = [];
  for (let j = 0; j < J; j++) (prep.catchN[j] >= MIN_CATCH_PER_BASE ? own : rest).push(j);
  let restN = 0;
  for (const j of rest) restN += prep.catchN[j];
  let groups: number[][];
  if (rest.length === 0) groups = own.map((j) => [j]);
  else if (restN >= MIN_CATCH_PER_BASE || own.length === 0) groups = [...own.map((j) => [j]), rest];
  else groups = [[...own, ...rest].sort((a, b) => a - b)];
  groups.forEach((members, g) => {
    let n = 0, k = 0;
    for (const j of members) { n += prep.catchN[j]; k += prep.catchK[j]; }
    for (const j of members) {
      prep.guessGroup[j] = g;
      prep.guess[j] = (k + 0.5) / (n + 1);
      prep.guessSource[j] = members.length === 1 ? 'own catch trials' : 'pooled catch trials';
    }
  });
  prep.nGuessGroups = groups.length;
  const pooledBases = prep.bases.filter((_, j) => prep.guessSource[j] === 'pooled catch trials');
  if (pooledBases.length) {
    prep.warnings.push(`fewer than ${MIN_CATCH_PER_BASE} catch trials at base ${prep.bases.filter((_, j) => prep.catchN[j] < MIN_CATCH_PER_BASE).join(', ')}: guess rate shared by base ${pooledBases.join(', ')}`);
  }
  if (pk / pn > 0.5) prep.warnings.push('false-alarm rate above 0.5 on catch trials: check the data-quality exclusions');
}
