/**
 * `--segments auto` (pure; no I/O): phase jumps found in a first fit's residuals
 * (src/plan/steps.ts) are fitted jointly with the clock polynomial — offset, rate, drift plus one
 * step column H(t − t_k) per jump, weighted least squares by SVD — and removed from the later rows;
 * the clock fit then runs on the corrected offsets, so its parameters equal the joint solution's.
 * Frequency steps are reported, not fitted (the clock model has one rate).
 * The parameters' 1σ of the second fit leave out the uncertainty of the jump sizes (stated).
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';

/** One fitted phase jump. */
export interface FittedJump {
  /** Source line of the first row after the jump. */
  line: number;
  /** UTC time of that row. */
  time: string;
  /** Jump size, ns, and its 1σ (from the joint fit; scaled by the reduced χ² without sigmas). */
  sizeNs: number;
  sizeSigmaNs: number;
}

/**
 * Jump sizes by joint weighted least squares.
 * @param tS        times from the epoch, s
 * @param yNs       offsets (periodic term removed), ns
 * @param sigmaNs   1σ per row (1 for unit weights)
 * @param withSigma true when sigmas were given (else the covariance is scaled by the reduced χ²)
 * @param degree    polynomial degree
 * @param jumpAt    row indices where a jump starts
 */
export function fitJumpSizes(tS: readonly number[], yNs: readonly number[], sigmaNs: readonly number[], withSigma: boolean, degree: number, jumpAt: readonly number[]): { sizeNs: number[]; sigmaNs: number[] } {
  const n = tS.length;
  const p = degree + 1 + jumpAt.length;
  let scale = 0;
  for (const t of tS) scale = Math.max(scale, Math.abs(t));
  if (scale === 0) scale = 1;
  const a = new Matrix(n, p);
  const b = new Matrix(n, 1);
  for (let i = 0; i < n; i++) {
    const w = 1 / sigmaNs[i];
    const u = tS[i] / scale;
    a.set(i, 0, w);
    if (degree > 0) a.set(i, 1, u * w);
    if (degree > 1) a.set(i, 2, ((u * u) / 2) * w);
    jumpAt.forEach((k, j) => a.set(i, degree + 1 + j, i >= k ? w : 0));
    b.set(i, 0, yNs[i] * w);
  }
  const svd = new SingularValueDecomposition(a, { autoTranspose: true });
  const x = svd.solve(b);
  const inv = svd.inverse();
  // Cov = (AᵀA)⁻¹ = A⁺ A⁺ᵀ.
  let chi = 0;
  const fitted = a.mmul(x);
  for (let i = 0; i < n; i++) chi += (b.get(i, 0) - fitted.get(i, 0)) ** 2;
  const covScale = withSigma ? 1 : n > p ? chi / (n - p) : 1;
  const sizeNs: number[] = [];
  const sigmas: number[] = [];
  jumpAt.forEach((_, j) => {
    const r = degree + 1 + j;
    sizeNs.push(x.get(r, 0));
    let v = 0;
    for (let i = 0; i < n; i++) v += inv.get(r, i) ** 2;
    sigmas.push(Math.sqrt(v * covScale));
  });
  return { sizeNs, sigmaNs: sigmas };
}

/** What the wrapper needs of a fit: rows in, result with steps and rejected rows out. */
interface RowLike {
  line: number;
  ttJ2000S: number;
  offsetNs: number;
  sigmaNs: number | null;
}
interface ResultLike {
  steps: { kind: string; line: number; time: string }[];
  rejected: { line: number; offsetNs: number }[];
  epochTtJ2000S: number;
  degree: 0 | 1 | 2;
  segmentJumps: FittedJump[];
  warnings: string[];
}

/**
 * Fit with automatic segments: a first fit finds the phase jumps, their sizes are fitted jointly,
 * the later rows are corrected, and the fit runs again. Without jumps the first fit is returned.
 * @param fit the clock fit (src/plan/fit.ts), passed in to keep the modules acyclic
 */
export function fitWithAutoSegments<R extends RowLike, T extends ResultLike>(rows: readonly R[], periodicNs: ((t: number) => number) | undefined, fit: (rows: readonly R[]) => T): T {
  const first = fit(rows);
  const jumpLines = first.steps.filter((s) => s.kind === 'phase jump').map((s) => s.line);
  if (jumpLines.length === 0) return first;
  const indexOfLine = new Map(rows.map((r, i) => [r.line, i]));
  const jumpAt = jumpLines.map((l) => indexOfLine.get(l)).filter((i): i is number => i !== undefined);
  const tS = rows.map((r) => r.ttJ2000S - first.epochTtJ2000S);
  const yNs = rows.map((r) => r.offsetNs - (periodicNs === undefined ? 0 : periodicNs(r.ttJ2000S)));
  const withSigma = rows[0].sigmaNs !== null;
  const { sizeNs, sigmaNs } = fitJumpSizes(tS, yNs, rows.map((r) => r.sigmaNs ?? 1), withSigma, first.degree, jumpAt);
  const corrected = rows.map((r, i) => {
    let shift = 0;
    jumpAt.forEach((k, j) => {
      if (i >= k) shift += sizeNs[j];
    });
    return { ...r, offsetNs: r.offsetNs - shift };
  });
  const second = fit(corrected);
  const originalByLine = new Map(rows.map((r) => [r.line, r.offsetNs]));
  for (const rej of second.rejected) rej.offsetNs = originalByLine.get(rej.line) ?? rej.offsetNs;
  second.segmentJumps = jumpAt.map((k, j) => ({
    line: rows[k].line,
    time: first.steps.find((s) => s.line === rows[k].line)?.time ?? '',
    sizeNs: sizeNs[j],
    sizeSigmaNs: sigmaNs[j],
  }));
  return second;
}
