import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { gaussHermite, normalExpectation } from '@/lib/psychometrics/gauss-hermite';

/**
 * Golub & Welsch (1969): the n-point Gauss rule's nodes are the eigenvalues of the symmetric
 * tridiagonal Jacobi matrix of the weight's recurrence (for e^(−t²): zero diagonal,
 * off-diagonal √(k/2)), and each weight is μ₀ = √π times the squared first component of the
 * normalised eigenvector. Eigen-decomposition here by cyclic Jacobi rotations, a method
 * independent of the engine's Newton iteration on the Hermite recurrence.
 */
function golubWelsch(n: number): { nodes: number[]; weights: number[] } {
  const a = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (Math.abs(i - j) === 1 ? Math.sqrt(Math.max(i, j) / 2) : 0)));
  const v: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += a[p][q] ** 2;
    if (off < 1e-30) break;
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        if (Math.abs(a[p][q]) < 1e-300) continue;
        const theta = (a[q][q] - a[p][p]) / (2 * a[p][q]);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1), s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k][p], akq = a[k][q];
          a[k][p] = c * akp - s * akq; a[k][q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p][k], aqk = a[q][k];
          a[p][k] = c * apk - s * aqk; a[q][k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k][p], vkq = v[k][q];
          v[k][p] = c * vkp - s * vkq; v[k][q] = s * vkp + c * vkq;
        }
      }
    }
  }
  const pairs = Array.from({ length: n }, (_, i) => ({ node: a[i][i], weight: Math.sqrt(Math.PI) * v[0][i] ** 2 }));
  pairs.sort((x, y) => x.node - y.node);
  return { nodes: pairs.map((p) => p.node), weights: pairs.map((p) => p.weight) };
}

const fixture = JSON.parse(readFileSync(path.join(import.meta.dirname, '../../fixtures/psychometrics/mixed-loglik.json'), 'utf8')) as {
  gaussHermite: Record<string, { nodes: number[]; weights: number[] }>;
};

describe('Gauss–Hermite rules', () => {
  it('the 3-point rule is the published one (Golub & Welsch 1969: nodes 0, ±√(3/2); weights √π·2/3, √π/6)', () => {
    const r = gaussHermite(3);
    expect(r.nodes[0]).toBeCloseTo(-Math.sqrt(1.5), 14);
    expect(r.nodes[1]).toBeCloseTo(0, 15);
    expect(r.nodes[2]).toBeCloseTo(Math.sqrt(1.5), 14);
    expect(r.weights[0]).toBeCloseTo(Math.sqrt(Math.PI) / 6, 14);
    expect(r.weights[1]).toBeCloseTo((Math.sqrt(Math.PI) * 2) / 3, 14);
    expect(r.weights[2]).toBeCloseTo(Math.sqrt(Math.PI) / 6, 14);
  });

  it.each([2, 5, 9, 15, 20, 32])('the %i-point rule equals the eigen-decomposition of the Jacobi matrix (Golub & Welsch 1969)', (n) => {
    const r = gaussHermite(n);
    const gw = golubWelsch(n);
    for (let q = 0; q < n; q++) {
      expect(Math.abs(r.nodes[q] - gw.nodes[q])).toBeLessThan(1e-11 * Math.max(1, Math.abs(gw.nodes[q])));
      // eigenvector components carry absolute (not relative) accuracy, so the tiny outer weights are compared absolutely
      expect(Math.abs(r.weights[q] - gw.weights[q])).toBeLessThan(1e-10 * gw.weights[q] + 1e-14);
      expect(r.logWeights[q]).toBeCloseTo(Math.log(r.weights[q]), 12);
    }
  });

  it.each(['3', '9', '20', '40'])('the %s-point rule equals numpy hermgauss (fixture from scripts/reference/mixed-loglik.py)', (key) => {
    const ref = fixture.gaussHermite[key];
    const r = gaussHermite(Number(key));
    ref.nodes.forEach((x, q) => {
      expect(Math.abs(r.nodes[q] - x)).toBeLessThan(1e-12 * Math.max(1, Math.abs(x)));
      expect(Math.abs(r.weights[q] - ref.weights[q]) / ref.weights[q]).toBeLessThan(1e-9);
    });
  });

  it('integrates polynomials up to degree 2n − 1 exactly and normal moments through normalExpectation', () => {
    const r = gaussHermite(6);
    // ∫ t^10 e^(−t²) dt = Γ(5.5) = 945√π/32; degree 11 is odd and integrates to 0
    let s10 = 0, s11 = 0;
    for (let q = 0; q < 6; q++) { s10 += r.weights[q] * r.nodes[q] ** 10; s11 += r.weights[q] * r.nodes[q] ** 11; }
    expect(s10).toBeCloseTo((945 * Math.sqrt(Math.PI)) / 32, 9);
    expect(Math.abs(s11)).toBeLessThan(1e-9);
    expect(normalExpectation((z) => z ** 4)).toBeCloseTo(3, 10);
    expect(normalExpectation((z) => Math.exp(0.7 * z))).toBeCloseTo(Math.exp(0.245), 10);
  });

  it('refuses a rule size it cannot build', () => {
    expect(() => gaussHermite(0)).toThrow(RangeError);
    expect(() => gaussHermite(2.5)).toThrow(RangeError);
  });
});
