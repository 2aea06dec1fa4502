/**
 * Phase jumps and frequency steps in clock offsets (pure; no I/O).
 *
 * Test (documented, simple; common practice): work on the frequency series between neighbouring
 * samples, f_i = (x_{i+1} − x_i)/(t_{i+1} − t_i).
 * - A **phase jump** between samples i and i+1 is one f_i far from the others:
 *   |f_i − median(f)| > k_jump·σ_f, σ_f = 1.4826·MAD(f) (robust; one jump does not inflate it).
 *   Its size is (f_i − median(f))·Δt_i.
 * - A **frequency step** at sample i is a shift of the mean of f: a windowed two-sample t-test
 *   comparing the w values of f before i with the w values after (jump intervals excluded),
 *   t = (mean_after − mean_before)/(σ_f·√(2/w)); a step is a local maximum of |t| above k_step.
 * Two opposite jumps on consecutive intervals of similar size are one outlying sample, not a jump.
 * Thresholds: k_jump = 8, k_step = 6, w = max(5, min(50, n/10)), chosen so that white noise of
 * 1e5 samples gives a false alarm well under once (Gaussian tail beyond 6σ ≈ 2e-9 per test).
 */

/** One detected event. */
export interface DetectedStep {
  kind: 'phase jump' | 'frequency step';
  /** Index of the first sample after the event. */
  index: number;
  /** Source line of that sample. */
  line: number;
  /** Time of the event: the first sample after it, s (same scale as the input). */
  timeS: number;
  /** Phase jump size, ns (phase jump), or frequency step, ns/s ×1e-9 = fractional (frequency step). */
  sizeNs: number | null;
  /** Frequency step, fractional (frequency step only). */
  fractionalStep: number | null;
  /** Test statistic in units of σ. */
  sigmas: number;
}

/** Detection thresholds (in σ) and window. */
export const JUMP_SIGMAS = 8;
export const STEP_SIGMAS = 6;

function median(a: number[]): number {
  const s = [...a].sort((p, q) => p - q);
  const n = s.length;
  return n % 2 === 1 ? s[(n - 1) / 2] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
}

/**
 * Detect phase jumps and frequency steps.
 * @param timesS   increasing times, s
 * @param offsetNs offsets (or residuals), ns
 * @param lines    source line of each sample
 * @returns events sorted by time; empty with fewer than 12 samples
 */
export function detectSteps(timesS: readonly number[], offsetNs: readonly number[], lines: readonly number[]): DetectedStep[] {
  const n = timesS.length;
  if (n < 12) return [];
  const f: number[] = [];
  for (let i = 0; i + 1 < n; i++) f.push((offsetNs[i + 1] - offsetNs[i]) / (timesS[i + 1] - timesS[i]));
  const med = median(f);
  const sigma = 1.4826 * median(f.map((v) => Math.abs(v - med)));
  if (!(sigma > 0)) return [];
  const out: DetectedStep[] = [];
  const jump = new Uint8Array(f.length);
  for (let i = 0; i < f.length; i++) {
    const z = (f[i] - med) / sigma;
    if (Math.abs(z) > JUMP_SIGMAS) {
      jump[i] = 1;
      out.push({ kind: 'phase jump', index: i + 1, line: lines[i + 1], timeS: timesS[i + 1], sizeNs: (f[i] - med) * (timesS[i + 1] - timesS[i]), fractionalStep: null, sigmas: Math.abs(z) });
    }
  }
  // A single bad sample shows as two opposite jumps in a row: an outlier (clipping's job), not a jump.
  for (let k = out.length - 1; k > 0; k--) {
    const a = out[k - 1];
    const b = out[k];
    if (b.index === a.index + 1 && Math.abs((a.sizeNs as number) + (b.sizeNs as number)) < 0.25 * Math.abs(a.sizeNs as number)) out.splice(k - 1, 2), k--;
  }
  const w = Math.max(5, Math.min(50, Math.floor(n / 10)));
  // Windowed means with jump intervals left out, by prefix sums over the kept values.
  const keptSum = new Float64Array(f.length + 1);
  const keptCount = new Int32Array(f.length + 1);
  for (let i = 0; i < f.length; i++) {
    keptSum[i + 1] = keptSum[i] + (jump[i] === 1 ? 0 : f[i]);
    keptCount[i + 1] = keptCount[i] + (jump[i] === 1 ? 0 : 1);
  }
  const t = new Float64Array(f.length).fill(0);
  for (let i = w; i + w <= f.length; i++) {
    const nb = keptCount[i] - keptCount[i - w];
    const na = keptCount[i + w] - keptCount[i];
    if (nb < 3 || na < 3) continue;
    const before = (keptSum[i] - keptSum[i - w]) / nb;
    const after = (keptSum[i + w] - keptSum[i]) / na;
    t[i] = (after - before) / (sigma * Math.sqrt(1 / nb + 1 / na));
  }
  for (let i = w; i + w <= f.length; i++) {
    const a = Math.abs(t[i]);
    if (a <= STEP_SIGMAS) continue;
    let isMax = true;
    for (let k = Math.max(0, i - w); k < Math.min(f.length, i + w + 1) && isMax; k++) if (Math.abs(t[k]) > a || (Math.abs(t[k]) === a && k < i)) isMax = false;
    if (!isMax) continue;
    const before = (keptSum[i] - keptSum[i - w]) / (keptCount[i] - keptCount[i - w]);
    const after = (keptSum[i + w] - keptSum[i]) / (keptCount[i + w] - keptCount[i]);
    // f_i spans samples i..i+1, so the new frequency starts at sample i.
    out.push({ kind: 'frequency step', index: i, line: lines[i], timeS: timesS[i], sizeNs: null, fractionalStep: (after - before) * 1e-9, sigmas: a });
  }
  return out.sort((p, q) => p.index - q.index);
}
