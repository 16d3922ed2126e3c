import { logChoose } from './math';

/**
 * Seeded generator used for bootstraps, simulations and per-respondent trial order.
 * sfc32 on 32-bit integer arithmetic (Math.imul, >>> 0) so a seed gives the same stream on
 * every platform and engine; strings are hashed with cyrb128 into the 128-bit state.
 */
export interface Rng {
  next(): number;
  int(maxExclusive: number): number;
  normal(): number;
  binomial(n: number, p: number): number;
  shuffle<T>(a: T[]): T[];
}

function cyrb128(str: string): [number, number, number, number] {
  let h1 = 1779033703, h2 = 3144134277, h3 = 1013904242, h4 = 2773480762;
  for (let i = 0; i < str.length; i++) {
    const k = str.charCodeAt(i);
    h1 = h2 ^ Math.imul(h1 ^ k, 597399067);
    h2 = h3 ^ Math.imul(h2 ^ k, 2869860233);
    h3 = h4 ^ Math.imul(h3 ^ k, 951274213);
    h4 = h1 ^ Math.imul(h4 ^ k, 2716044179);
  }
  h1 = Math.imul(h3 ^ (h1 >>> 18), 597399067);
  h2 = Math.imul(h4 ^ (h2 >>> 22), 2869860233);
  h3 = Math.imul(h1 ^ (h3 >>> 17), 951274213);
  h4 = Math.imul(h2 ^ (h4 >>> 19), 2716044179);
  return [(h1 ^ h2 ^ h3 ^ h4) >>> 0, (h2 ^ h1) >>> 0, (h3 ^ h1) >>> 0, (h4 ^ h1) >>> 0];
}

export function createRng(seed: number | string): Rng {
  // Numbers and their decimal strings give the same stream, so a seed typed into a form
  // reproduces a seed stored as a number.
  let [a, b, c, d] = cyrb128(String(seed));
  let spare: number | null = null;

  function next(): number {
    a >>>= 0; b >>>= 0; c >>>= 0; d >>>= 0;
    let t = (a + b) | 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) | 0;
    c = (c << 21) | (c >>> 11);
    d = (d + 1) | 0;
    t = (t + d) | 0;
    c = (c + t) | 0;
    return (t >>> 0) / 4294967296;
  }
  // Discard the first outputs: sfc32 mixes its state in a dozen rounds.
  for (let i = 0; i < 12; i++) next();

  function int(maxExclusive: number): number {
    return Math.floor(next() * maxExclusive);
  }

  function normal(): number {
    if (spare !== null) { const s = spare; spare = null; return s; }
    let u = 0;
    while (u === 0) u = next();
    const r = Math.sqrt(-2 * Math.log(u));
    const th = 2 * Math.PI * next();
    spare = r * Math.sin(th);
    return r * Math.cos(th);
  }

  function binomial(n: number, p: number): number {
    if (n <= 0 || p <= 0) return 0;
    if (p >= 1) return n;
    if (p > 0.5) return n - binomial(n, 1 - p);
    const q = 1 - p;
    if (n * p < 30) {
      // Inversion from 0: about n·p steps.
      let f = Math.pow(q, n);
      let u = next();
      const r = p / q;
      let x = 0;
      while (u > f && x < n) { u -= f; x++; f *= (r * (n - x + 1)) / x; }
      return x;
    }
    // Exact inversion searching outwards from the mode: O(sqrt(n·p·q)) steps, so large
    // cells (thousands of trials) cost no more than a few dozen multiplications.
    const m = Math.floor((n + 1) * p);
    const pm = Math.exp(logChoose(n, m) + m * Math.log(p) + (n - m) * Math.log(q));
    let u = next() - pm;
    if (u < 0) return m;
    let lo = m, plo = pm, hi = m, phi = pm;
    const r = p / q;
    while (lo > 0 || hi < n) {
      if (lo > 0) { plo *= lo / ((n - lo + 1) * r); lo--; u -= plo; if (u < 0) return lo; }
      if (hi < n) { phi *= ((n - hi) * r) / (hi + 1); hi++; u -= phi; if (u < 0) return hi; }
    }
    return m;
  }

  function shuffle<T>(arr: T[]): T[] {
    for (let i = arr.length - 1; i > 0; i--) {
      const j = int(i + 1);
      const tmp = arr[i]; arr[i] = arr[j]; arr[j] = tmp;
    }
    return arr;
  }

  return { next, int, normal, binomial, shuffle };
}
