/**
 * Gauss–Legendre nodes and weights on [−1, 1], computed by Newton iteration on Pₙ
 * (Golub–Welsch would also do; Newton from the Chebyshev guess converges in a few steps).
 */
import { InternalError } from '../errors.ts';

export interface GaussRule {
  nodes: Float64Array;
  weights: Float64Array;
}

export function gaussLegendre(n: number): GaussRule {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      dp = (n * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-15) break; // Newton converges quadratically; the weight-sum check below catches a failure
    }
    nodes[n - 1 - i] = x;
    weights[n - 1 - i] = 2 / ((1 - x * x) * dp * dp);
  }
  if (!weightsSumToTwo(weights)) throw new InternalError('Gauss–Legendre weights do not sum to 2');
  return { nodes, weights };
}

function weightsSumToTwo(w: Float64Array): boolean {
  let s = 0;
  for (const v of w) s += v;
  return Math.abs(s - 2) < 1e-13;
}

/** Inverse of the Vandermonde matrix V[i][j] = u_i^j for the nodes, row-major, so that c = V⁻¹·y gives monomial coefficients. */
export function inverseVandermonde(nodes: Float64Array): Float64Array {
  const n = nodes.length;
  // Gauss–Jordan on [V | I]; n ≤ 12, nodes well spread, so this is well conditioned enough.
  const a = new Float64Array(n * 2 * n);
  for (let i = 0; i < n; i++) {
    let p = 1;
    for (let j = 0; j < n; j++) {
      a[i * 2 * n + j] = p;
      p *= nodes[i];
    }
    a[i * 2 * n + n + i] = 1;
  }
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(a[r * 2 * n + col]) > Math.abs(a[piv * 2 * n + col])) piv = r;
    if (piv !== col) {
      for (let k = 0; k < 2 * n; k++) {
        const t = a[col * 2 * n + k];
        a[col * 2 * n + k] = a[piv * 2 * n + k];
        a[piv * 2 * n + k] = t;
      }
    }
    const d = a[col * 2 * n + col];
    for (let k = 0; k < 2 * n; k++) a[col * 2 * n + k] /= d;
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const f = a[r * 2 * n + col];
      if (f === 0) continue;
      for (let k = 0; k < 2 * n; k++) a[r * 2 * n + k] -= f * a[col * 2 * n + k];
    }
  }
  const inv = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) inv[i * n + j] = a[i * 2 * n + n + j];
  return inv;
}
