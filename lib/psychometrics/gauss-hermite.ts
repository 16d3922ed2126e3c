// Gauss–Hermite quadrature: nodes t_q and weights w_q with ∫ e^(−t²) h(t) dt ≈ Σ w_q h(t_q),
// exact for polynomials h of degree ≤ 2n − 1. The mixed psychometric model (mixed.ts)
// integrates each shopper's likelihood over the shopper's own threshold with it, and the
// population notice curve (shopper-spread.ts) averages the typical curve over the spread.
//
// The nodes are the roots of the Hermite polynomial H_n, found by Newton's method on the
// orthonormal three-term recurrence (the derivative comes from the same recurrence:
// p_n' = √(2n)·p_{n−1}); the weight of a root is 2/p_n'(t)². Starting guesses are the usual
// asymptotic ones for the largest roots, then each root from the two before it. The test
// (tests/unit/psychometrics/gauss-hermite.test.ts) checks the rule against an independent
// construction, the eigenvalues of the Jacobi matrix (Golub & Welsch 1969), and against a
// general-purpose library's rule kept as a fixture. Rules are cached per n. Pure.

export interface GaussHermiteRule {
  /** Nodes, ascending. */
  nodes: Float64Array;
  weights: Float64Array;
  /** ln w_q (the adaptive quadrature sums in logs). */
  logWeights: Float64Array;
}

const PI_M4 = Math.pow(Math.PI, -0.25);
const cache = new Map<number, GaussHermiteRule>();

/** The n-point rule for weight e^(−t²), 1 ≤ n ≤ 100. */
export function gaussHermite(n: number): GaussHermiteRule {
  if (!Number.isInteger(n) || n < 1 || n > 100) throw new RangeError(`Gauss–Hermite: n must be a whole number from 1 to 100, got ${n}`);
  const hit = cache.get(n);
  if (hit) return hit;
  const x = new Float64Array(n), w = new Float64Array(n);
  const m = (n + 1) >> 1;
  let z = 0;
  for (let i = 0; i < m; i++) {
    if (i === 0) z = Math.sqrt(2 * n + 1) - 1.85575 * Math.pow(2 * n + 1, -0.16667);
    else if (i === 1) z -= (1.14 * Math.pow(n, 0.426)) / z;
    else if (i === 2) z = 1.86 * z - 0.86 * x[0];
    else if (i === 3) z = 1.91 * z - 0.91 * x[1];
    else z = 2 * z - x[i - 2];
    let pp = 0;
    for (let it = 0; it < 100; it++) {
      let p1 = PI_M4, p2 = 0;
      for (let j = 1; j <= n; j++) {
        const p3 = p2;
        p2 = p1;
        p1 = z * Math.sqrt(2 / j) * p2 - Math.sqrt((j - 1) / j) * p3;
      }
      pp = Math.sqrt(2 * n) * p2;
      const z1 = z;
      z = z1 - p1 / pp;
      if (Math.abs(z - z1) <= 1e-15 * Math.max(1, Math.abs(z))) break;
    }
    // the middle root of an odd rule is 0 exactly
    if (n % 2 === 1 && i === m - 1) z = 0;
    x[n - 1 - i] = -z; x[i] = z;
    w[i] = 2 / (pp * pp); w[n - 1 - i] = w[i];
  }
  // recurrence order is descending; hand the rule out ascending
  const nodes = Float64Array.from(x).reverse();
  const weights = Float64Array.from(w).reverse();
  const rule = { nodes, weights, logWeights: weights.map(Math.log) };
  cache.set(n, rule);
  return rule;
}

/**
 * E[h(Z)] for Z ~ Normal(0, 1) by the n-point rule (Z = √2·t, weights / √π): used where the
 * integrand is smooth in Z and no adaptation is needed (averaging a logistic curve over σ).
 */
export function normalExpectation(h: (z: number) => number, n = 32): number {
  const { nodes, weights } = gaussHermite(n);
  let s = 0;
  for (let q = 0; q < n; q++) s += weights[q] * h(Math.SQRT2 * nodes[q]);
  return s / Math.sqrt(Math.PI);
}
