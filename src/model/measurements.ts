/**
 * A clock's measured offsets as every reader returns them (CSV, RINEX clock, SP3 clock column,
 * CCSDS TDM): one series per clock, in strictly increasing time, with the scale the file wrote its
 * times in, the source's convention for the periodic relativistic term, and counts of what was
 * left out. Plain arrays of numbers so a series crosses to a worker thread unchanged.
 */
import type { TimeScale } from '../time/instant.ts';

/** Formats the readers know; `--input-format` takes the same names. */
export type MeasurementFormat = 'csv' | 'rinex-clock' | 'sp3' | 'tdm';

/** Whether the offsets contain the periodic relativistic term −2 r·v/c² (IS-GPS-200 §20.3.3.3.3.1). */
export type PeriodicTerm = 'included' | 'excluded';

/** The measured offsets of one clock. */
export interface MeasurementSeries {
  /** Clock name as in the file: a satellite (`E14`) or a station (`BRUX`); `clock` for a CSV. */
  clock: string;
  /** `satellite` for AS records, SP3 and TDM spacecraft; `receiver` for AR records; `unknown` for a CSV. */
  kind: 'satellite' | 'receiver' | 'unknown';
  format: MeasurementFormat;
  /** Scale the file's times are written in (for display; `ttJ2000S` is already converted). */
  timeScale: TimeScale;
  /** Convention of the source for the periodic term (products exclude it, onboard-versus-ground measurements include it). */
  periodicTerm: PeriodicTerm;
  /** Times, s since J2000.0 TT, strictly increasing. */
  ttJ2000S: number[];
  /** Clock reading minus the reference scale, ns. */
  offsetNs: number[];
  /** 1-σ of each offset, ns, or null when the file gives none (then no sample has one). */
  sigmaNs: number[] | null;
  /** 1-based line of each sample in the file. */
  line: number[];
  /** Segment of each sample (0, 1, ...): a clock event starts a new one; each gets its own offset in a fit. */
  segment: number[];
  /** Samples the file marks as predicted (SP3 column 76 `P`); kept, and counted for the report. */
  predicted: number;
  /** Values the file marks absent or bad (999999.999999, NaN), left out. */
  skipped: number;
  /** The first few lines of skipped values, for the report. */
  skippedLines: number[];
  /** Clock drift the file states beside the bias (TDM `CLOCK_DRIFT`, s/s), mean over the series; null when absent. */
  statedDrift: number | null;
}

/** A new, empty series. */
export function emptySeries(clock: string, kind: MeasurementSeries['kind'], format: MeasurementFormat, timeScale: TimeScale, periodicTerm: PeriodicTerm, withSigma: boolean): MeasurementSeries {
  return { clock, kind, format, timeScale, periodicTerm, ttJ2000S: [], offsetNs: [], sigmaNs: withSigma ? [] : null, line: [], segment: [], predicted: 0, skipped: 0, skippedLines: [], statedDrift: null };
}

/** How many skipped lines a series keeps for its report. */
export const SKIPPED_LINES_KEPT = 10;

/** Count a skipped value on `line`. */
export function noteSkipped(s: MeasurementSeries, line: number): void {
  s.skipped++;
  if (s.skippedLines.length < SKIPPED_LINES_KEPT) s.skippedLines.push(line);
}

/** Number of segments in a series (0 when empty). */
export function segmentCount(s: MeasurementSeries): number {
  return s.segment.length === 0 ? 0 : s.segment[s.segment.length - 1] + 1;
}

/** Rows in the shape the fit takes. */
export function seriesRows(s: MeasurementSeries): { line: number; ttJ2000S: number; offsetNs: number; sigmaNs: number | null; segment: number }[] {
  return s.ttJ2000S.map((t, i) => ({ line: s.line[i], ttJ2000S: t, offsetNs: s.offsetNs[i], sigmaNs: s.sigmaNs === null ? null : s.sigmaNs[i], segment: s.segment[i] }));
}
