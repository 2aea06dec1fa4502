/**
 * Navigation-message clock parameter sets (`tauplan navclock`), pure: no I/O.
 *
 * For each satellite, sets at toc every `intervalS`, each a least-squares polynomial (degree 1 or 2)
 * in t − toc fitted to the predicted clock over the fit interval centred on toc, with the periodic
 * relativistic term −2 r·v/c² removed first (the receiver adds it back as Δt_r, IS-GPS-200
 * §20.3.3.3.3.1). Coefficients are quantised to the message's scale factors and bit widths; a value
 * that does not fit is refused with {@link NavFieldOverflowError}.
 *
 * Fit-interval convention: toc at the centre of the fit interval, as in GPS LNAV where the curve
 * fit starts with the transmission interval and toc lies half a fit interval later (IS-GPS-200
 * §20.3.4.4–5; from memory). Only sets whose whole fit interval lies inside the window are made.
 *
 * Age of data: time since the set was generated from a fresh clock estimate. The expected error at
 * an age is the set's representation error (largest fit residual + largest quantisation error over
 * the fit interval, added linearly: a bound) plus the 95 % prediction band at that age.
 */
import { InputError, NavFieldOverflowError } from '../errors.ts';
import { SPEED_OF_LIGHT_M_PER_S } from '../constants.ts';
import { clockPolynomialS, navClockFormat, quantise, type ClockPolynomial, type FieldFormat, type NavSystem } from '../clock/navMessage.ts';
import { fitClockPolynomial } from '../clock/navFit.ts';

/** A predicted clock with the periodic relativistic term already removed. */
export interface PredictedClock {
  satellite: string;
  /** Fills `outNs[i]` with the prediction [ns] (reading minus reference, −2 r·v/c² removed) at `ttJ2000S[i]`. */
  sampleNs(ttJ2000S: Float64Array, outNs: Float64Array): void;
  /** 95 % prediction band [ns] after an age of data [s] (0 at age 0). */
  bandNs(ageS: number): number;
  /** Last instant the prediction may be sampled (s since J2000.0 TT); the window end, or earlier (decay). */
  endTtJ2000S: number;
}

/** Options of {@link navigationClockSets}. */
export interface NavClockOptions {
  system: NavSystem;
  degree: 1 | 2;
  /** Spacing of successive toc [s]. */
  intervalS: number;
  /** Fit interval centred on toc [s]. */
  fitIntervalS: number;
  /** Spacing of the prediction samples the polynomial is fitted to [s]. */
  spacingS: number;
  fromTtJ2000S: number;
  toTtJ2000S: number;
  /** GPS week and seconds of week of an instant (s since J2000.0 TT); Galileo shares the GPS second count of week. */
  gpsWeekOf(ttJ2000S: number): { week: number; secondsOfWeek: number };
  /** UTC text of an instant, for error messages. */
  utcOf(ttJ2000S: number): string;
}

/** Expected error at the four ages of data the issue names. */
export interface AgeErrors {
  age0: number;
  ageInterval: number;
  ageFitInterval: number;
  age24h: number;
}

/** One quantised parameter set. */
export interface NavClockSet {
  tocTtJ2000S: number;
  tocGpsWeek: number;
  tocGpsSecondsOfWeek: number;
  /** Quantised coefficients, as the message carries them. */
  af0S: number;
  af1: number;
  af2PerS: number;
  fitIntervalS: number;
  /** Largest |prediction − unquantised polynomial| over the fit interval [ns]. */
  fitResidualMaxNs: number;
  /** Largest |quantised − unquantised polynomial| over the fit interval [ns]. */
  quantisationErrorMaxNs: number;
  expectedErrorNs: AgeErrors;
  /** The same as a range error [m] (× c). */
  expectedErrorM: AgeErrors;
}

/** Expected error against age of data for one satellite (largest over its sets). */
export interface AgeCurvePoint {
  ageS: number;
  errorNs: number;
  errorM: number;
}

export interface SatelliteNavClock {
  satellite: string;
  sets: NavClockSet[];
  errorAgainstAge: AgeCurvePoint[];
}

export interface NavClockResult {
  system: NavSystem;
  message: string;
  degree: 1 | 2;
  intervalS: number;
  fitIntervalS: number;
  spacingS: number;
  satellites: SatelliteNavClock[];
}

const DAY_S = 86_400;
/** Points of the error-against-age curve: every hour from 0 to 24 h. */
const AGE_CURVE_STEP_S = 3600;
/** Most sets per satellite in one run (one every 16 s for ten years is far beyond any use). */
const MAX_SETS_PER_SATELLITE = 200_000;

/** Check the options before any work: one-line errors naming the flag. */
export function checkNavClockOptions(o: NavClockOptions): void {
  const fmt = navClockFormat(o.system);
  if (!(o.spacingS > 0)) throw new InputError(`prediction spacing ${o.spacingS} s`, '--spacing', 'give a positive spacing');
  if (!(o.fitIntervalS >= o.spacingS * o.degree)) {
    throw new InputError(
      `fit interval ${o.fitIntervalS} s holds fewer than ${o.degree + 1} samples at the prediction spacing of ${o.spacingS} s`,
      '--fit-interval',
      `give a fit interval of at least ${o.spacingS * o.degree} s (the prediction is sampled every ${o.spacingS} s), e.g. 4h`,
    );
  }
  if (o.intervalS > o.fitIntervalS) {
    throw new InputError(`interval ${o.intervalS} s is longer than the fit interval ${o.fitIntervalS} s`, '--interval', 'give an interval no longer than --fit-interval, or the sets would leave gaps');
  }
  if (!(o.intervalS > 0) || o.intervalS % fmt.toc.scale !== 0) {
    throw new InputError(`interval ${o.intervalS} s is not a positive multiple of the ${fmt.toc.scale}-s toc resolution`, '--interval', `give a multiple of ${fmt.toc.scale} s, e.g. 2h`);
  }
  if (o.toTtJ2000S - o.fromTtJ2000S < o.fitIntervalS) {
    throw new InputError(`window of ${o.toTtJ2000S - o.fromTtJ2000S} s is shorter than the fit interval ${o.fitIntervalS} s`, '--from/--to', 'widen the window or shorten --fit-interval');
  }
}

/**
 * Parameter sets for every predicted clock. Tocs are the first whole multiple of the interval in
 * seconds of week at or after window start + fit/2, then every interval while the fit interval
 * stays inside the window.
 * @throws NavFieldOverflowError when a coefficient does not fit its bits
 */
export function navigationClockSets(clocks: readonly PredictedClock[], o: NavClockOptions): NavClockResult {
  checkNavClockOptions(o);
  const fmt = navClockFormat(o.system);
  const half = o.fitIntervalS / 2;
  const firstCentre = o.fromTtJ2000S + half;
  const { secondsOfWeek } = o.gpsWeekOf(firstCentre);
  // On a whole multiple of the interval in seconds of week (the interval is a multiple of the toc resolution).
  const firstToc = firstCentre + (Math.ceil(secondsOfWeek / o.intervalS - 1e-9) * o.intervalS - secondsOfWeek);
  const n = Math.max(2, Math.ceil(o.fitIntervalS / o.spacingS));
  const u = Float64Array.from({ length: n + 1 }, (_, j) => -1 + (2 * j) / n);
  const times = new Float64Array(n + 1);
  const values = new Float64Array(n + 1);

  const satellites = clocks.map((clock): SatelliteNavClock => {
    const sets: NavClockSet[] = [];
    const end = Math.min(o.toTtJ2000S, clock.endTtJ2000S);
    for (let k = 0, toc = firstToc; toc + half <= end + 1e-6; k++, toc = firstToc + k * o.intervalS) {
      if (k >= MAX_SETS_PER_SATELLITE) throw new InputError(`more than ${MAX_SETS_PER_SATELLITE} sets for ${clock.satellite}`, '--interval', 'lengthen --interval or shorten the window');
      for (let j = 0; j <= n; j++) times[j] = toc + u[j] * half;
      clock.sampleNs(times, values);
      sets.push(oneSet(clock, toc, u, half, values, o, fmt.af0, fmt.af1, fmt.af2, fmt.toc));
    }
    const rep = sets.reduce((m, s) => Math.max(m, s.fitResidualMaxNs + s.quantisationErrorMaxNs), 0);
    const errorAgainstAge: AgeCurvePoint[] = [];
    for (let age = 0; age <= DAY_S; age += AGE_CURVE_STEP_S) {
      const e = rep + clock.bandNs(age);
      errorAgainstAge.push({ ageS: age, errorNs: e, errorM: e * 1e-9 * SPEED_OF_LIGHT_M_PER_S });
    }
    return { satellite: clock.satellite, sets, errorAgainstAge };
  });
  return { system: o.system, message: fmt.label, degree: o.degree, intervalS: o.intervalS, fitIntervalS: o.fitIntervalS, spacingS: o.spacingS, satellites };
}

function oneSet(
  clock: PredictedClock,
  toc: number,
  u: Float64Array,
  half: number,
  valuesNs: Float64Array,
  o: NavClockOptions,
  f0: FieldFormat,
  f1: FieldFormat,
  f2: FieldFormat,
  fToc: FieldFormat,
): NavClockSet {
  const fit = fitClockPolynomial(u, valuesNs, half, o.degree);
  const at = (): string => o.utcOf(toc);
  const q = (value: number, field: string, f: FieldFormat): number => {
    const r = quantise(value, f);
    if (!r.ok) throw new NavFieldOverflowError(clock.satellite, at(), field, value, r.limit, f.bits);
    return r.value;
  };
  const week = o.gpsWeekOf(toc);
  const tocSow = Math.round(week.secondsOfWeek / fToc.scale) * fToc.scale;
  q(tocSow, 'toc', fToc);
  const quantised: ClockPolynomial = { af0S: q(fit.af0S, 'af0', f0), af1: q(fit.af1, 'af1', f1), af2PerS: o.degree === 2 ? q(fit.af2PerS, 'af2', f2) : 0 };
  let residualMax = 0;
  let quantMax = 0;
  for (let j = 0; j < u.length; j++) {
    const dt = u[j] * half;
    const exactNs = clockPolynomialS(fit, dt) * 1e9;
    residualMax = Math.max(residualMax, Math.abs(valuesNs[j] - exactNs));
    quantMax = Math.max(quantMax, Math.abs(clockPolynomialS(quantised, dt) * 1e9 - exactNs));
  }
  const rep = residualMax + quantMax;
  const ages: AgeErrors = {
    age0: rep + clock.bandNs(0),
    ageInterval: rep + clock.bandNs(o.intervalS),
    ageFitInterval: rep + clock.bandNs(o.fitIntervalS),
    age24h: rep + clock.bandNs(DAY_S),
  };
  const toM = (ns: number): number => ns * 1e-9 * SPEED_OF_LIGHT_M_PER_S;
  return {
    tocTtJ2000S: toc,
    tocGpsWeek: week.week,
    tocGpsSecondsOfWeek: tocSow,
    af0S: quantised.af0S,
    af1: quantised.af1,
    af2PerS: quantised.af2PerS,
    fitIntervalS: o.fitIntervalS,
    fitResidualMaxNs: residualMax,
    quantisationErrorMaxNs: quantMax,
    expectedErrorNs: ages,
    expectedErrorM: { age0: toM(ages.age0), ageInterval: toM(ages.ageInterval), ageFitInterval: toM(ages.ageFitInterval), age24h: toM(ages.age24h) },
  };
}
