/**
 * `fit --all`: one survey row per clock of a file, from that clock's fit. Pure (no I/O); the CLI
 * runs it on worker threads.
 */
import type { FitResult } from './fit.ts';

/** Averaging times of the survey's stability columns [s]: 1000 s and one day. */
export const SURVEY_TAUS_S = [1000, 86400];

/** One clock of a survey (contract of `fit --all`). */
export interface FitSurveyRow {
  /** Clock name (satellite or station). */
  satellite: string;
  kind: 'satellite' | 'receiver' | 'unknown';
  samples: number;
  skipped: number;
  segments: number;
  /** Fitted fractional frequency (dimensionless), null on failure. */
  fractionalFrequency: number | null;
  relativisticMeanFractionalOffset: number | null;
  hardwareFractionalOffset: number | null;
  /** Change of fractional frequency per day (1/day). */
  driftPerDay: number | null;
  rmsNs: number | null;
  /** OADEV of the residuals near 1000 s and its exact τ (a multiple of the spacing); null where the data do not reach. */
  adev1000: number | null;
  adev1000TauS: number | null;
  /** OADEV of the residuals at one day; null where the data do not reach. */
  adev1d: number | null;
  /** Why this clock could not be fitted, or null. */
  error: string | null;
}

/** The survey row of a finished fit. */
export function surveyRow(kind: FitSurveyRow['kind'], r: FitResult): FitSurveyRow {
  const src = r.source;
  const at = (tau: number) => r.stabilityAtTaus.find((_, i) => SURVEY_TAUS_S[i] === tau) ?? null;
  const a1000 = at(1000);
  const a1d = at(86400);
  return {
    satellite: src?.satellite ?? '',
    kind,
    samples: src?.samples ?? r.used,
    skipped: src?.skipped ?? 0,
    segments: src?.segments ?? 1,
    fractionalFrequency: r.fractionalFrequency,
    relativisticMeanFractionalOffset: r.relativisticMeanFractionalOffset,
    hardwareFractionalOffset: r.hardwareFractionalOffset,
    driftPerDay: r.driftPerDay,
    rmsNs: r.rmsNs,
    adev1000: a1000?.oadev ?? null,
    adev1000TauS: a1000 === null || a1000.oadev === null ? null : a1000.tauS,
    adev1d: a1d?.oadev ?? null,
    error: null,
  };
}

/** The row of a clock that could not be fitted. */
export function failedRow(satellite: string, kind: FitSurveyRow['kind'], samples: number, skipped: number, error: string): FitSurveyRow {
  return { satellite, kind, samples, skipped, segments: 0, fractionalFrequency: null, relativisticMeanFractionalOffset: null, hardwareFractionalOffset: null, driftPerDay: null, rmsNs: null, adev1000: null, adev1000TauS: null, adev1d: null, error };
}
