/**
 * Gragg–Bulirsch–Stoer stepper for y = (r, v), ẏ = (v, a(τ, r)): Gragg's modified midpoint rule
 * with Richardson extrapolation in h² (Hairer, Nørsett & Wanner, Solving ODEs I, §II.9), written
 * here with no dependency. The force is a callback so that the caller chooses the axes (fixed
 * true-pole axes, or GCRF with the pole of each instant). Buffers are reused: no allocation per step.
 */

/** Acceleration [m/s²] at offset τ [s] from the epoch and position r [m], into out[o..o+2]. */
export type Force = (tauS: number, x: number, y: number, z: number, out: Float64Array, o: number) => void;

/** Step sequence n_k = 2(k+1) (Deuflhard's harmonic sequence), columns 0..K_MAX. */
export const K_MAX = 8;
export const K_MIN = 2;
const SEQ = Array.from({ length: K_MAX + 1 }, (_, k) => 2 * (k + 1));
/** Work A_k: evaluations to reach column k (plus the one at the step end). */
export const WORK = SEQ.map((_, k) => 1 + SEQ.slice(0, k + 1).reduce((s, n) => s + n, 0));
/** Neville coefficients 1/((n_k/n_{k−j})² − 1). */
const COEF = SEQ.map((nk, k) => SEQ.map((_, j) => (j === 0 || j > k ? 0 : 1 / ((nk / SEQ[k - j]) ** 2 - 1))));

export class GbsStepper {
  private readonly table = new Float64Array((K_MAX + 1) * (K_MAX + 1) * 6);
  private readonly zPrev = new Float64Array(6);
  private readonly zCur = new Float64Array(6);
  private readonly acc = new Float64Array(3);
  /** Step-size factor proposed by column k after the last attempt. */
  readonly fac = new Float64Array(K_MAX + 1);
  /** Scaled error of column k after the last attempt (NaN if not reached). */
  readonly err = new Float64Array(K_MAX + 1);
  evaluations = 0;

  /**
   * @param force the acceleration
   * @param gmM3PerS2 GM, for the velocity floor of the error scale
   * @param relTol relative tolerance per step (position scaled by |r|, velocity by |v|)
   */
  constructor(
    private readonly force: Force,
    private readonly gmM3PerS2: number,
    private readonly relTol: number,
  ) {}

  /** Acceleration at (τ, r) into `out[o..o+2]`, counted. */
  accel(tau: number, x: number, y: number, z: number, out: Float64Array, o: number): void {
    this.force(tau, x, y, z, out, o);
    this.evaluations++;
  }

  /** Gragg's modified midpoint with n substeps over bigH from τ0, y0 (6) and a0 (3), into table row offset `out`. */
  private midpoint(tau0: number, y0: Float64Array, a0: Float64Array, bigH: number, n: number, out: number): void {
    const h = bigH / n;
    const zp = this.zPrev;
    const zc = this.zCur;
    const acc = this.acc;
    for (let c = 0; c < 3; c++) {
      zp[c] = y0[c];
      zp[c + 3] = y0[c + 3];
      zc[c] = y0[c] + h * y0[c + 3];
      zc[c + 3] = y0[c + 3] + h * a0[c];
    }
    const f = this.force;
    for (let m = 1; m < n; m++) {
      f(tau0 + m * h, zc[0], zc[1], zc[2], acc, 0);
      for (let c = 0; c < 3; c++) {
        const nr = zp[c] + 2 * h * zc[c + 3];
        const nv = zp[c + 3] + 2 * h * acc[c];
        zp[c] = zc[c];
        zp[c + 3] = zc[c + 3];
        zc[c] = nr;
        zc[c + 3] = nv;
      }
    }
    f(tau0 + bigH, zc[0], zc[1], zc[2], acc, 0);
    this.evaluations += n;
    const t = this.table;
    for (let c = 0; c < 3; c++) {
      t[out + c] = 0.5 * (zc[c] + zp[c] + h * zc[c + 3]);
      t[out + c + 3] = 0.5 * (zc[c + 3] + zp[c + 3] + h * acc[c]);
    }
  }

  /**
   * One step of size bigH [s] (negative backwards) from τ0. On success writes y(τ0+H) into yOut and
   * returns the column that converged; returns −1 if no column up to K_MAX met the tolerance.
   */
  step(tau0: number, y0: Float64Array, a0: Float64Array, bigH: number, yOut: Float64Array): number {
    const t = this.table;
    const w = K_MAX + 1;
    this.err.fill(Number.NaN);
    for (let k = 0; k <= K_MAX; k++) {
      const rowK = k * w * 6;
      this.midpoint(tau0, y0, a0, bigH, SEQ[k], rowK);
      const rowP = (k - 1) * w * 6;
      for (let j = 1; j <= k; j++) {
        const cf = COEF[k][j];
        const cur = rowK + j * 6;
        const left = rowK + (j - 1) * 6;
        const up = rowP + (j - 1) * 6;
        for (let c = 0; c < 6; c++) t[cur + c] = t[left + c] + (t[left + c] - t[up + c]) * cf;
      }
      if (k < K_MIN) continue;
      const best = rowK + k * 6;
      const prev = rowK + (k - 1) * 6;
      const rNorm = Math.hypot(t[best], t[best + 1], t[best + 2]);
      const vNorm = Math.hypot(t[best + 3], t[best + 4], t[best + 5]);
      // Velocity floor (1e-3 of circular speed) keeps the scale finite at a ballistic apex.
      const vScale = Math.max(vNorm, 1e-3 * Math.sqrt(this.gmM3PerS2 / rNorm));
      const dr = Math.hypot(t[best] - t[prev], t[best + 1] - t[prev + 1], t[best + 2] - t[prev + 2]);
      const dv = Math.hypot(t[best + 3] - t[prev + 3], t[best + 4] - t[prev + 4], t[best + 5] - t[prev + 5]);
      const e = Math.max(dr / (this.relTol * rNorm), dv / (this.relTol * vScale));
      this.err[k] = e;
      // Step-size factor for which column k would just meet the tolerance (Hairer–Nørsett–Wanner II.9).
      this.fac[k] = Number.isFinite(e) ? 0.94 * Math.pow(0.65 / Math.max(e, 1e-300), 1 / (2 * k + 1)) : 0.1;
      if (e <= 1) {
        for (let c = 0; c < 6; c++) yOut[c] = t[best + c];
        return k;
      }
    }
    return -1;
  }
}
