/**
 * Use case `compare`: satellites and stations as clocks in one field, over one window
 * (contract `tauplan compare`; physics.md §4 and §11). Relativity only: no oscillator model.
 *
 * A sub-orbital trajectory (a flight that returns to its starting radius) is compared over the part
 * of its flight [epoch, flightEnd] inside the window only; so is every pair that includes it. Every
 * clock is thus integrated within the window, whose span every source covers.
 */
import { groundClockFractionalOffset } from '../clock/groundClock.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import { clockStepS, integrateAlong, type IntegratedTrack } from '../clock/integrate.ts';
import { conventionalPeriodicS, fractionalOffset } from '../clock/rate.ts';
import { SECONDS_PER_DAY } from '../constants.ts';
import { geodeticToEcefM, type Station } from '../events/station.ts';
import { allocStateBlock, type Trajectory } from '../orbit/trajectory.ts';
import { halfRangeAboutLine, lineFit, orbitSummaryAt } from './size.ts';
import { bodyOf, lunarFieldOf, lunarStationTrack, lunarTrackFigures, type BodyStation } from './lunarScenario.ts';
import type { CentralBody } from '../model/scenario.ts';
import { InputError } from '../errors.ts';

export interface CompareSatellite {
  id: string;
  trajectory: Trajectory;
  /** For a sub-orbital flight: [start, end] of the flight; null for an orbit. */
  flight: { startTtJ2000S: number; endTtJ2000S: number } | null;
}

export interface ClockComparison {
  id: string;
  kind: 'satellite' | 'station';
  /** Where the clock is: about or on the Earth, or the Moon. */
  body: CentralBody;
  /** Satellites: slope of the offset with −2r·v/c² removed (as in `size`); stations: their constant rate. */
  meanFractionalOffset: number;
  driftNsPerDay: number;
  /** Half peak-to-peak of the proper-time offset about its trend [ns] (0 for a station). */
  periodicAmplitudeNs: number;
  /** Proper time elapsed minus TT elapsed over the clock's interval [ns]. */
  elapsedOffsetNs: number;
  /** Interval the figures cover, seconds since J2000.0 TT (for a flight, its part inside the window). */
  fromTtJ2000S: number;
  toTtJ2000S: number;
  /** For a flight: its launch (the state epoch), seconds since J2000.0 TT; null for an orbit or a station. */
  flightStartTtJ2000S: number | null;
  flightEndTtJ2000S: number | null;
}

export interface PairComparison {
  a: string;
  b: string;
  /** Elapsed proper time of a minus that of b over their common interval [ns]. */
  elapsedDifferenceNs: number;
  fromTtJ2000S: number;
  toTtJ2000S: number;
}

/** One clock's offset against the reference over time (for the comparison figure). */
export interface CompareSeries {
  id: string;
  /** The reference clock's id, or `TT`. */
  against: string;
  /** Sample instants, seconds since J2000.0 TT, over the common interval of the clock and the reference. */
  tTtJ2000S: number[];
  /** Elapsed proper time of the clock minus that of the reference since the interval start [ns]. */
  offsetNs: number[];
}

export interface CompareResult {
  clocks: ClockComparison[];
  pairs: PairComparison[];
  /** Offset against time per clock (every clock but the reference). */
  series: CompareSeries[];
}

/** Samples per clock in {@link CompareSeries}. */
const SERIES_SAMPLES = 400;

/** ∫ y dt between two instants for a clock. */
type Elapsed = (from: number, to: number) => number;

/** Which clocks a comparison computes (e.g. one shard's): default every clock, each with its figures. */
export interface CompareSubset {
  /** Clocks to integrate; the pairs are formed among them. */
  clocks?: ReadonlySet<string>;
  /** Of those, the clocks that get a row in `clocks` (their figures); the others only serve in pairs. */
  figures?: ReadonlySet<string>;
}

/** A computed clock as the pairs and series see it. */
type Member = Pick<ClockComparison, 'id' | 'fromTtJ2000S' | 'toTtJ2000S' | 'flightEndTtJ2000S'>;

/** Shortest part of a flight inside the window that is compared [s] (as passes and resets take it). */
const MIN_FLIGHT_IN_WINDOW_S = 1;

/**
 * The part of a flight inside [from, to]; a flight with less than a second there is an InputError
 * (scenarioCompare.ts refuses it first with the times and the scenario path).
 */
export function flightPartInWindow(id: string, flight: { startTtJ2000S: number; endTtJ2000S: number }, fromTtJ2000S: number, toTtJ2000S: number): { fromTtJ2000S: number; toTtJ2000S: number } {
  const from = Math.max(fromTtJ2000S, flight.startTtJ2000S);
  const to = Math.min(toTtJ2000S, flight.endTtJ2000S);
  if (!(to - from >= MIN_FLIGHT_IN_WINDOW_S)) throw new InputError(`the sub-orbital flight of ${id} lies outside the window`, id, 'give a window that holds part of the flight');
  return { fromTtJ2000S: from, toTtJ2000S: to };
}

/**
 * Compare clocks over [from, to]. `against` names the reference clock of the offset series (a
 * satellite or station id); without it the series are against TT. With `subset`, only those clocks
 * (and the pairs among them) are computed; each figure equals the whole comparison's bit for bit.
 * A flight counts over its part inside the window; one with none there is an InputError.
 */
export function compareClocks(sats: CompareSatellite[], stations: BodyStation[], gravity: GravityModel, fromTtJ2000S: number, toTtJ2000S: number, against?: string, subset?: CompareSubset): CompareResult {
  const clocks: ClockComparison[] = [];
  const members: Member[] = [];
  const elapsed = new Map<string, Elapsed>();
  const only = subset?.clocks;
  const wantsFigures = (id: string): boolean => subset?.figures === undefined || subset.figures.has(id);
  // Every flight is checked, computed or not, so each shard of a run refuses the same input.
  const inWindow = new Map(sats.flatMap((s) => (s.flight === null ? [] : [[s.id, flightPartInWindow(s.id, s.flight, fromTtJ2000S, toTtJ2000S)] as const])));
  for (const s of sats) {
    if (only !== undefined && !only.has(s.id)) continue;
    // Orbits over the window; a flight over its part inside it (the orbit sources cover the window only).
    const part = inWindow.get(s.id);
    const from = part?.fromTtJ2000S ?? fromTtJ2000S;
    const to = part?.toTtJ2000S ?? toTtJ2000S;
    // A lunar orbit's step follows its period about the Moon, not its geocentric one.
    const orbit = orbitSummaryAt(s.trajectory, from, gravity.gmM3PerS2);
    const periodS = Number.isFinite(orbit.periodS) && orbit.periodS > 0 ? orbit.periodS : 6000;
    const maxStep = s.flight === null ? clockStepS(periodS, Math.min(orbit.e, 0.95)) : Math.min(10, (to - from) / 20);
    const [track] = integrateAlong(s.trajectory, from, to, maxStep, [(x, y, z, vx, vy, vz, t) => fractionalOffset(gravity, x, y, z, vx, vy, vz, t)]);
    elapsed.set(s.id, (a, b) => track.integralAt(b) - track.integralAt(a));
    members.push({ id: s.id, fromTtJ2000S: from, toTtJ2000S: to, flightEndTtJ2000S: s.flight?.endTtJ2000S ?? null });
    if (!wantsFigures(s.id)) continue; // a partner in pairs only: its figures (most of the cost) are not needed
    // A flight is no orbit: its mean is the plain average over the flight, not an orbit-mean slope.
    const body = bodyOf(s.trajectory);
    const fig = s.flight !== null ? flightFigures(track, from, to) : body === 'moon' ? lunarTrackFigures(s.trajectory, track, lunarFieldOf(gravity), from, to, true) : trackFigures(s.trajectory, track, from, to);
    clocks.push({
      id: s.id,
      kind: 'satellite',
      body,
      meanFractionalOffset: fig.slope,
      driftNsPerDay: fig.slope * SECONDS_PER_DAY * 1e9,
      periodicAmplitudeNs: fig.periodicNs,
      elapsedOffsetNs: (track.integralAt(to) - track.integralAt(from)) * 1e9,
      fromTtJ2000S: from,
      toTtJ2000S: to,
      flightStartTtJ2000S: s.flight?.startTtJ2000S ?? null,
      flightEndTtJ2000S: s.flight?.endTtJ2000S ?? null,
    });
  }
  for (const st of stations) {
    if (only !== undefined && !only.has(st.id)) continue;
    if (st.body === 'moon') {
      // A clock at rest on the Moon: its rate follows the Earth–Moon distance (monthly term), so it is integrated.
      const { trajectory, track } = lunarStationTrack(st, gravity, fromTtJ2000S, toTtJ2000S);
      elapsed.set(st.id, (a, b) => track.integralAt(b) - track.integralAt(a));
      members.push({ id: st.id, fromTtJ2000S, toTtJ2000S, flightEndTtJ2000S: null });
      if (!wantsFigures(st.id)) continue;
      const fig = lunarTrackFigures(trajectory, track, lunarFieldOf(gravity), fromTtJ2000S, toTtJ2000S, false);
      clocks.push({
        id: st.id,
        kind: 'station',
        body: 'moon',
        meanFractionalOffset: fig.slope,
        driftNsPerDay: fig.slope * SECONDS_PER_DAY * 1e9,
        periodicAmplitudeNs: fig.periodicNs,
        elapsedOffsetNs: track.total * 1e9,
        fromTtJ2000S,
        toTtJ2000S,
        flightStartTtJ2000S: null,
        flightEndTtJ2000S: null,
      });
      continue;
    }
    const r = geodeticToEcefM(st.latDeg, st.lonDeg, st.heightM);
    const y = groundClockFractionalOffset(gravity, r[0], r[1], r[2], st.geoidHeightM);
    elapsed.set(st.id, (a, b) => y * (b - a));
    members.push({ id: st.id, fromTtJ2000S, toTtJ2000S, flightEndTtJ2000S: null });
    if (!wantsFigures(st.id)) continue;
    clocks.push({
      id: st.id,
      kind: 'station',
      body: 'earth',
      meanFractionalOffset: y,
      driftNsPerDay: y * SECONDS_PER_DAY * 1e9,
      periodicAmplitudeNs: 0,
      elapsedOffsetNs: y * (toTtJ2000S - fromTtJ2000S) * 1e9,
      fromTtJ2000S,
      toTtJ2000S,
      flightStartTtJ2000S: null,
      flightEndTtJ2000S: null,
    });
  }
  const pairs: PairComparison[] = [];
  for (let i = 0; i < members.length; i++) {
    for (let j = i + 1; j < members.length; j++) {
      const a = members[i];
      const b = members[j];
      // Common interval: a flight's own interval when either is a flight, else the window.
      const flight = a.flightEndTtJ2000S !== null ? a : b.flightEndTtJ2000S !== null ? b : null;
      const from = flight === null ? fromTtJ2000S : flight.fromTtJ2000S;
      const to = flight === null ? toTtJ2000S : flight.toTtJ2000S;
      if (a.flightEndTtJ2000S !== null && b.flightEndTtJ2000S !== null && (a.fromTtJ2000S !== b.fromTtJ2000S || a.toTtJ2000S !== b.toTtJ2000S)) continue; // two different flights: no common interval
      const ea = elapsed.get(a.id)!(from, to);
      const eb = elapsed.get(b.id)!(from, to);
      pairs.push({ a: a.id, b: b.id, elapsedDifferenceNs: (ea - eb) * 1e9, fromTtJ2000S: from, toTtJ2000S: to });
    }
  }
  const ref = against === undefined ? null : (members.find((c) => c.id === against) ?? null);
  const series: CompareSeries[] = [];
  for (const c of members) {
    if (ref !== null && c.id === ref.id) continue;
    // Common interval with the reference (TT covers everything).
    const from = Math.max(c.fromTtJ2000S, ref?.fromTtJ2000S ?? c.fromTtJ2000S);
    const to = Math.min(c.toTtJ2000S, ref?.toTtJ2000S ?? c.toTtJ2000S);
    if (!(to > from)) continue;
    const ec = elapsed.get(c.id)!;
    const er = ref === null ? null : elapsed.get(ref.id)!;
    const tt: number[] = [];
    const off: number[] = [];
    for (let k = 0; k <= SERIES_SAMPLES; k++) {
      const t = from + ((to - from) * k) / SERIES_SAMPLES;
      tt.push(t);
      off.push((ec(from, t) - (er === null ? 0 : er(from, t))) * 1e9);
    }
    series.push({ id: c.id, against: ref?.id ?? 'TT', tTtJ2000S: tt, offsetNs: off });
  }
  return { clocks, pairs, series };
}

function trackFigures(traj: Trajectory, track: IntegratedTrack, from: number, to: number): { slope: number; periodicNs: number } {
  const m = Math.max(64, Math.min(20001, Math.ceil((to - from) / 30) + 1));
  const t = new Float64Array(m);
  for (let i = 0; i < m; i++) t[i] = from + ((to - from) * i) / (m - 1);
  const x = new Float64Array(m);
  const xc = new Float64Array(m);
  const block = allocStateBlock(m);
  traj.sampleInto(t, block);
  const r = block.positionM;
  const v = block.velocityMPerS;
  for (let i = 0; i < m; i++) {
    x[i] = track.integralAt(t[i]);
    xc[i] = x[i] - conventionalPeriodicS(r[3 * i], r[3 * i + 1], r[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2]);
  }
  // Trend: the line through the offset with −2r·v/c² removed (the `size` definition of the mean);
  // the periodic amplitude is what swings about that trend.
  const line = lineFit(t, xc);
  return { slope: line.slope, periodicNs: halfRangeAboutLine(t, x, line) * 1e9 };
}

/** A ballistic flight: mean rate = elapsed offset / duration; swing about that chord. */
function flightFigures(track: IntegratedTrack, from: number, to: number): { slope: number; periodicNs: number } {
  const x0 = track.integralAt(from);
  const slope = (track.integralAt(to) - x0) / (to - from);
  let lo = 0;
  let hi = 0;
  for (let i = 0; i <= 400; i++) {
    const t = from + ((to - from) * i) / 400;
    const d = track.integralAt(t) - x0 - slope * (t - from);
    lo = Math.min(lo, d);
    hi = Math.max(hi, d);
  }
  return { slope, periodicNs: ((hi - lo) / 2) * 1e9 };
}
