// Small numeric helpers shared by the fitters and the random generator.

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
  -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
  1.5056327351493116e-7,
];

/** ln Γ(z) for z > 0 (Lanczos, g = 7; about 15 significant digits). */
export function logGamma(z: number): number {
  if (z < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * z)) - logGamma(1 - z);
  const zz = z - 1;
  let a = LANCZOS[0];
  const t = zz + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (zz + i);
  return 0.5 * Math.log(2 * Math.PI) + (zz + 0.5) * Math.log(t) - t + Math.log(a);
}

const LOG_FACT = new Float64Array(1025);
for (let i = 2; i < LOG_FACT.length; i++) LOG_FACT[i] = LOG_FACT[i - 1] + Math.log(i);

export function logFactorial(n: number): number {
  return n < LOG_FACT.length ? LOG_FACT[n] : logGamma(n + 1);
}

/** ln C(n, k): the binomial coefficient that makes log-likelihoods comparable with R's glm. */
export function logChoose(n: number, k: number): number {
  return logFactorial(n) - logFactorial(k) - logFactorial(n - k);
}

export function logit(p: number): number {
  return Math.log(p / (1 - p));
}

export function clamp(v: number, lo: number, hi: number): number {
  return v < lo ? lo : v > hi ? hi : v;
}

/** Sample quantile, linear interpolation between order statistics (R's type 7). */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** Median (NaN for no values). */
export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return quantileSorted(s, 0.5);
}

/** Geometric mean of positive values (NaN for no values). */
export function geometricMean(values: number[]): number {
  return Math.exp(values.reduce((a, v) => a + Math.log(v), 0) / values.length);
}
