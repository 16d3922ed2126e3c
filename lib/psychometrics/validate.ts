import { PsychometricsInputError } from './errors';
import type { Cell, CatchCell } from './types';

function isCount(v: number): boolean {
  return Number.isInteger(v) && v >= 0;
}

function where(c: { basePrice: number; discount?: number }, i: number, kind: string): string {
  const d = c.discount === undefined ? '' : `, discount ${c.discount}`;
  return `${kind} ${i + 1} (base price ${c.basePrice}${d})`;
}

/** Rejects what no fit can use, naming the first offending cell. */
export function validateCells(cells: Cell[], catchCells: CatchCell[] = []): void {
  if (!Array.isArray(cells) || cells.length === 0) {
    throw new PsychometricsInputError('no cells to fit: the input has no trials with a discount');
  }
  cells.forEach((c, i) => {
    const at = where(c, i, 'cell');
    if (!Number.isFinite(c.basePrice) || c.basePrice <= 0) throw new PsychometricsInputError(`${at}: base price must be a number above 0`);
    if (!Number.isFinite(c.discount) || c.discount <= 0 || c.discount >= 1) {
      throw new PsychometricsInputError(`${at}: discount must lie strictly between 0 and 1`);
    }
    if (!isCount(c.n)) throw new PsychometricsInputError(`${at}: n must be a non-negative whole number, got ${c.n}`);
    if (!isCount(c.k)) throw new PsychometricsInputError(`${at}: k must be a non-negative whole number, got ${c.k}`);
    if (c.k > c.n) throw new PsychometricsInputError(`${at}: k (${c.k}) exceeds n (${c.n})`);
  });
  if (cells.every((c) => c.n === 0)) throw new PsychometricsInputError('no cells to fit: every cell has n = 0');
  catchCells.forEach((c, i) => {
    const at = where(c, i, 'catch cell');
    if (!Number.isFinite(c.basePrice) || c.basePrice <= 0) throw new PsychometricsInputError(`${at}: base price must be a number above 0`);
    if (!isCount(c.n) || !isCount(c.k)) throw new PsychometricsInputError(`${at}: n and k must be non-negative whole numbers`);
    if (c.k > c.n) throw new PsychometricsInputError(`${at}: k (${c.k}) exceeds n (${c.n})`);
  });
}

export function validateRate(name: string, v: number | undefined, lo: number, hi: number): void {
  if (v === undefined) return;
  if (!Number.isFinite(v) || v < lo || v > hi) {
    throw new PsychometricsInputError(`${name} must lie between ${lo} and ${hi}, got ${v}`);
  }
}
