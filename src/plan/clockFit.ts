/**
 * A measured clock's fit split into relativity and hardware, pure (no I/O).
 *
 * The periodic relativistic term −2 r·v/c² (IS-GPS-200 §20.3.3.3.3.1; IERS 2010 eq. 10.11) has a
 * convention per source: precise products (SP3 clocks, RINEX clock files) exclude it (the user
 * adds it), onboard-versus-ground measurements (CSV, TDM) include it. With an orbit, the fit works
 * on the clock with every modelled periodic relativistic term removed:
 *
 *     rel(t)  = ∫ y_rel dt along the orbit (src/clock, scenario gravity model)
 *     line(t) = least-squares line through rel(t) + 2 r·v/c² over the samples (as `size` defines
 *               meanFractionalOffset; its slope is `relativisticMeanFractionalOffset`)
 *     removed = rel − line                  (source includes the term)
 *             = rel − line + 2 r·v/c²        (source excludes it: only the small remainder, from
 *                                             the zonal harmonics, is left to remove)
 *
 * so the fitted frequency is the hardware offset plus the mean relativistic rate, and
 * `hardwareFractionalOffset` = fractionalFrequency − relativisticMeanFractionalOffset.
 */
import type { GravityModel } from '../orbit/gravity.ts';
import { conventionalPeriodicS } from '../clock/rate.ts';
import type { MeasurementSeries, PeriodicTerm } from '../model/measurements.ts';
import { segmentCount, seriesRows } from '../model/measurements.ts';
import { allocStateBlock, type Trajectory } from '../orbit/trajectory.ts';
import { fitClock, type FitOptions, type FitResult } from './fit.ts';
import { prepareSatelliteClock } from './satelliteClock.ts';
import { lineFit } from './size.ts';
import { InputError } from '../errors.ts';

/** The relativistic part along an orbit at given times. */
export interface RelativisticAlong {
  /** Periodic part to remove from each sample under the given convention, ns. */
  removeNs: Float64Array;
  /** Slope of the line through rel(t) + 2 r·v/c² over the times (dimensionless). */
  meanFractionalOffset: number;
  /** Conventional term −2 r·v/c² at each time, ns (for tests and the report). */
  conventionalNs: Float64Array;
}

/**
 * Relativistic proper-time offset along `trajectory` at `tTt` (s since J2000.0 TT, increasing,
 * inside the trajectory's span), its mean rate, and the periodic part to remove from measurements
 * made under `convention`.
 */
export function relativisticAlong(trajectory: Trajectory, gravity: GravityModel, tTt: Float64Array, convention: PeriodicTerm): RelativisticAlong {
  const n = tTt.length;
  const first = tTt[0];
  const last = tTt[n - 1];
  const run = prepareSatelliteClock(trajectory.id, trajectory.id, trajectory, gravity, null, first, Math.max(last, first + 60));
  const block = allocStateBlock(n);
  trajectory.sampleInto(tTt, block);
  const p = block.positionM;
  const v = block.velocityMPerS;
  const rel = new Float64Array(n);
  const conv = new Float64Array(n);
  const secular = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    rel[i] = run.clock.relativisticNs(tTt[i]);
    conv[i] = 1e9 * conventionalPeriodicS(p[3 * i], p[3 * i + 1], p[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2]);
    secular[i] = rel[i] - conv[i];
  }
  const line = n >= 2 && last > first ? lineFit(tTt, secular) : { slope: 0, intercept: secular[0], tMean: first };
  const removeNs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const trend = line.intercept + line.slope * (tTt[i] - line.tMean);
    removeNs[i] = rel[i] - trend - (convention === 'excluded' ? conv[i] : 0);
  }
  return { removeNs, meanFractionalOffset: line.slope * 1e-9, conventionalNs: conv };
}

/** Options of {@link fitSeries}. */
export interface SeriesFitOptions extends Omit<FitOptions, 'periodicNs'> {
  /** Convention of the data for the periodic term; default the source's own. */
  periodic?: PeriodicTerm;
  /** Why `periodic` was chosen (for the note); default names the source's convention. */
  periodicReason?: string;
  /** Orbit of the clock, or null: then no relativistic split. */
  trajectory: Trajectory | null;
  /** Where to point an error about the orbit's span (default the trajectory id). */
  orbitWhere?: string;
  /** Gravity model of the clock rate along the orbit (needed with a trajectory). */
  gravity?: GravityModel;
  /** Use the file's sigmas as weights (default: only for CSV, whose sigmas the user wrote; products give formal sigmas). */
  useSigmas?: boolean;
}

const PERIODIC_REASONS: Record<string, string> = {
  'rinex-clock': 'precise clock products leave it out for the user to add (IGS convention)',
  sp3: 'precise clock products leave it out for the user to add (IGS convention)',
  tdm: 'onboard-versus-ground clock measurements contain it',
  csv: 'onboard-versus-ground clock measurements contain it',
};

/**
 * Fit one measured clock, with the relativistic split when an orbit is given. Samples outside the
 * orbit's span are left out (and said so in the notes).
 */
export function fitSeries(series: MeasurementSeries, o: SeriesFitOptions): FitResult {
  const notes: string[] = [];
  const periodic = o.periodic ?? series.periodicTerm;
  const reason = o.periodicReason ?? `the default for ${series.format}: ${PERIODIC_REASONS[series.format]}`;
  const useSigmas = o.useSigmas ?? series.format === 'csv';
  let rows = seriesRows(series).map((r) => (useSigmas ? r : { ...r, sigmaNs: null }));
  if (!useSigmas && series.sigmaNs !== null) notes.push('the file gives formal sigmas; the fit uses equal weights and takes its sigmas from the scatter');
  const traj = o.trajectory;
  let rel: RelativisticAlong | null = null;
  if (traj !== null) {
    const before = rows.length;
    rows = rows.filter((r) => r.ttJ2000S >= traj.validFromTtJ2000S - 1e-3 && r.ttJ2000S <= traj.validToTtJ2000S + 1e-3);
    // Products often run a few epochs past their orbit file; user measurements must lie inside it.
    const product = series.format === 'rinex-clock' || series.format === 'sp3';
    if (rows.length === 0 || (!product && rows.length < before)) {
      throw new InputError(`${before - rows.length} of ${before} samples of ${series.clock} lie outside the orbit source span`, o.orbitWhere ?? traj.id, 'use measurements inside the orbit source span, or an orbit that covers them');
    }
    if (rows.length < before) notes.push(`${before - rows.length} sample(s) outside the orbit's span left out`);
    if (o.gravity === undefined) throw new InputError('an orbit without a gravity model', 'fit', 'give the gravity model with the orbit');
    rel = relativisticAlong(traj, o.gravity, Float64Array.from(rows, (r) => r.ttJ2000S), periodic);
  }
  const removeByTime = new Map<number, number>();
  if (rel !== null) rows.forEach((r, i) => removeByTime.set(r.ttJ2000S, (rel as RelativisticAlong).removeNs[i]));
  const result = fitClock(rows, {
    ...o,
    ...(rel === null ? {} : { periodicNs: (t: number) => removeByTime.get(t) ?? 0 }),
  });
  if (rel === null) {
    notes.push(
      periodic === 'included'
        ? 'no orbit: the periodic relativistic term stays in the data and in the residuals; give --orbit to remove it and split the rate into relativity and hardware'
        : 'no orbit: no relativistic split; give --orbit to split the rate into relativity and hardware',
    );
  } else {
    notes.push(`periodic term −2r·v/c² ${periodic} in the data (${reason}); the fit removes the modelled periodic relativistic terms, so the rate is the mean relativistic rate plus the hardware`);
  }
  if (series.predicted > 0) notes.push(`${series.predicted} sample(s) are flagged as predicted`);
  if (series.skipped > 0) notes.push(`${series.skipped} absent or bad value(s) skipped (first on line ${series.skippedLines[0]})`);
  const relMean = rel === null ? null : rel.meanFractionalOffset;
  return {
    ...result,
    source: {
      format: series.format,
      satellite: series.clock,
      samples: rows.length,
      skipped: series.skipped,
      segments: segmentCount(series),
      periodicTerm: periodic,
      timeScale: series.timeScale,
      predicted: series.predicted,
      statedDrift: series.statedDrift,
    },
    relativisticMeanFractionalOffset: relMean,
    hardwareFractionalOffset: relMean === null || result.fractionalFrequency === null ? null : result.fractionalFrequency - relMean,
    notes: [...result.notes, ...notes],
  };
}
