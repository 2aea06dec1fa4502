/**
 * The stability table: OADEV, MDEV, TDEV and OHDEV with EDF-based 68 % and 95 % intervals and the
 * identified noise type at each averaging time (pure; no I/O). This is the JSON of
 * `tauplan stability` and the `stability` rows of `tauplan fit`.
 */
import { InputError } from '../errors.ts';
import { mdevGrid, ohdevGrid, oadevGrid, presentCount, tdevGrid, type PhaseGrid } from './deviations.ts';
import { mdevEdf, oadevEdfTable5, ohdevEdf, withIntervals, type DeviationInterval, type PowerLawAlpha } from './edf.ts';
import { identifyNoise } from './noiseId.ts';

/** Which averaging factors: powers of two, 1-2-5 per decade, or every m. */
export type TauSet = 'octave' | 'decade' | 'all';

/** One row of the table. */
export interface StabilityTableRow {
  /** Averaging time, s. */
  tauS: number;
  /** Averaging factor (τ = m·τ0). */
  m: number;
  /** Identified power-law exponent α of S_y(f) ∝ f^α (2 white PM … −2 RW FM), null when too few points. */
  alpha: PowerLawAlpha | null;
  /** α the intervals assume (the identified one, else the nearest identified at a shorter τ, else 0). */
  alphaForEdf: PowerLawAlpha;
  /** Overlapping Allan deviation (dimensionless). */
  oadev: DeviationInterval | null;
  /** Terms in the OADEV sum (after gaps). */
  oadevTerms: number;
  /** Modified Allan deviation (dimensionless). */
  mdev: DeviationInterval | null;
  /** Time deviation, s. */
  tdevS: DeviationInterval | null;
  /** Overlapping Hadamard deviation (dimensionless). */
  ohdev: DeviationInterval | null;
}

/** The whole table. */
export interface StabilityTable {
  /** Grid spacing, s. */
  tau0S: number;
  /** Samples present. */
  points: number;
  /** Grid points (or frequency samples) missing. */
  missing: number;
  rows: StabilityTableRow[];
  /** What a reader must know (assumed noise types, approximations). */
  notes: string[];
}

/** Options of {@link stabilityTable}. */
export interface StabilityTableOptions {
  /** Default 'octave'. */
  tauSet?: TauSet;
  /** Where the data came from, for error messages. */
  source?: string;
  /** Missing samples the caller counted before the grid (e.g. NaN lines of frequency data). */
  missing?: number;
  /** Samples the caller counted as present (default: phase points present). */
  points?: number;
}

/** Averaging factors of a tau set for N phase points (up to where OADEV has a term). */
export function averagingFactors(phasePoints: number, tauSet: TauSet): number[] {
  const out: number[] = [];
  const ok = (m: number): boolean => phasePoints - 2 * m >= 1;
  if (tauSet === 'octave') for (let m = 1; ok(m); m *= 2) out.push(m);
  else if (tauSet === 'decade') {
    for (let decade = 1; ok(decade); decade *= 10) for (const k of [1, 2, 5]) if (ok(k * decade)) out.push(k * decade);
  } else for (let m = 1; ok(m); m++) out.push(m);
  return out;
}

/**
 * Compute the table.
 * @throws InputError with fewer than 3 phase points present (OADEV needs 3; MDEV, TDEV and OHDEV 4)
 */
export function stabilityTable(grid: PhaseGrid, options: StabilityTableOptions = {}): StabilityTable {
  const source = options.source ?? 'data';
  if (!(grid.tau0S > 0) || !Number.isFinite(grid.tau0S)) throw new InputError(`sample spacing τ0 = ${grid.tau0S} s`, '--tau0', 'give a positive sample spacing, e.g. --tau0 1s');
  const present = presentCount(grid);
  if (present < 3) {
    throw new InputError(`${present} phase point(s)`, source, 'OADEV needs at least 3 phase points (2 frequency samples); MDEV, TDEV and OHDEV need 4');
  }
  const n = grid.xS.length;
  const broken = grid.brokenIncrement?.reduce((a, b) => a + b, 0) ?? 0;
  const notes: string[] = [];
  const rows: StabilityTableRow[] = [];
  let lastAlpha: PowerLawAlpha | null = null;
  let assumed = false;
  for (const m of averagingFactors(n, options.tauSet ?? 'octave')) {
    const id = identifyNoise(grid.xS, m);
    const alphaForEdf: PowerLawAlpha = id.alpha ?? lastAlpha ?? 0;
    if (id.alpha === null) assumed = true;
    else lastAlpha = id.alpha;
    const o = oadevGrid(grid, m);
    const md = mdevGrid(grid, m);
    const td = tdevGrid(grid, m);
    const h = ohdevGrid(grid, m);
    const mdEdf = md.value === null ? 0 : mdevEdf(md.terms, m, alphaForEdf);
    rows.push({
      tauS: m * grid.tau0S,
      m,
      alpha: id.alpha,
      alphaForEdf,
      oadevTerms: o.terms,
      oadev: o.value === null ? null : withIntervals(o.value, oadevEdfTable5(o.terms + 2 * m, m, alphaForEdf)),
      mdev: md.value === null ? null : withIntervals(md.value, mdEdf),
      tdevS: td.value === null ? null : withIntervals(td.value, mdEdf),
      ohdev: h.value === null ? null : withIntervals(h.value, ohdevEdf(h.terms, m, alphaForEdf)),
    });
  }
  if (assumed) notes.push('where too few points identify the noise type (alpha null), the intervals assume the type found at the nearest shorter tau (white FM if none)');
  if (rows.some((r) => r.m > 64 && r.mdev !== null)) notes.push('MDEV/TDEV degrees of freedom above m = 64 are scaled from m = 64 (approximation)');
  return { tau0S: grid.tau0S, points: options.points ?? present, missing: options.missing ?? n - present + broken, rows, notes };
}
