/**
 * A scenario made ready for the use cases: the window and selection checked, each selected
 * satellite's trajectory and clock prepared, the stations picked, and the Earth-rotation function.
 * Orbits come from an {@link OrbitResolver} passed in (the edge's, which may read SP3 files), so
 * nothing here reads a file.
 */
import { lunarAwareGravity } from './lunarScenario.ts';
import { gravityModel, type GravityModel } from '../orbit/gravity.ts';
import { TidalField } from '../clock/tides.ts';
import type { OscillatorParams } from '../clock/oscillator.ts';
import { InputError, SpanError } from '../errors.ts';
import type { GmstRadAt } from '../events/passes.ts';
import type { Station } from '../events/station.ts';
import type { ClockSpec, SatelliteSpec, ScenarioSpec } from '../model/scenario.ts';
import type { OrbitResolver } from '../orbit/source.ts';
import { gmstRadAtTt } from '../orbit/sp3.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { NumericalTrajectory } from '../orbit/numerical.ts';
import { Sgp4Trajectory, SGP4_DEFAULT_HALF_SPAN_S } from '../orbit/sgp4.ts';
import { prepareSatelliteClock, usableEnd, type SatelliteClockRun } from './satelliteClock.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

/** The prepared scenario: what every scenario use case starts from. */
export interface ScenarioContext {
  scenario: ScenarioSpec;
  ts: TimeSystem;
  gravity: GravityModel;
  fromTtJ2000S: number;
  toTtJ2000S: number;
  runs: SatelliteClockRun[];
  stations: Station[];
  gmstRadAt: GmstRadAt;
  /** Satellite specs in the same order as runs. */
  satellites: SatelliteSpec[];
}

/** Which part of a scenario to use: the flags of the scenario commands, in camelCase. */
export interface ScenarioSelection {
  /** Window start: ISO text as `--from` takes it, or an Instant. Default: the scenario window. */
  from?: string | Instant;
  /** Window end, likewise. */
  to?: string | Instant;
  /** Comma-separated satellite ids or names. */
  sat?: string;
  /** Comma-separated station ids. */
  station?: string;
  /** Overrides the window end as start + horizon [s]. */
  horizonS?: number;
}

/** Oscillator parameters from a scenario clock block. */
export function oscillatorParams(c: ClockSpec | null): OscillatorParams | null {
  if (c === null) return null;
  return {
    epochTtJ2000S: c.epoch.ttJ2000S,
    offsetNs: c.offsetNs,
    hardwareFractionalOffset: c.hardwareFractionalOffset,
    agingPerDay: c.agingPerDay,
    noise: c.noise,
    ...(c.keepInNs === null ? {} : { keepInNs: c.keepInNs }),
  };
}

/**
 * A comma-separated list of names (`--station A,B`); refuses one that names nothing (`--station ,`).
 */
export function nameList(value: string, flag: string, what: string): string[] {
  const names = value.split(',').map((s) => s.trim());
  const kept = names.filter((s) => s.length > 0);
  if (kept.length === 0) throw new InputError(`${flag} ${JSON.stringify(value)} names no ${what}`, flag, `give one or more ${what} ids separated by commas`);
  if (kept.length < names.length) throw new InputError(`${flag} ${JSON.stringify(value)} has an empty name`, flag, `give ${what} ids separated by single commas`);
  return kept;
}

/** Items named in a comma-separated list (all when none is given), in list order; an unknown name is an input error. */
export function pick<T>(items: T[], wanted: string | undefined, keyOf: (t: T) => string[], flag: string, what: string): T[] {
  if (wanted === undefined) return items;
  const names = nameList(wanted, flag, what);
  const out: T[] = [];
  for (const n of names) {
    const found = items.find((t) => keyOf(t).includes(n)) ?? (/^0+\d+$/.test(n) ? items.find((t) => keyOf(t).includes(n.replace(/^0+(?=\d)/, ''))) : undefined);
    if (found === undefined) {
      const known = items.slice(0, 8).map((t) => keyOf(t)[0]).join(', ');
      throw new InputError(`no ${what} ${JSON.stringify(n)} in the scenario`, flag, `use one of ${known}`);
    }
    if (!out.includes(found)) out.push(found);
  }
  return out;
}

/** Refuse a window outside the trajectory's span, naming the span. */
export function checkWindowInSpan(traj: Trajectory, from: number, to: number, ts: TimeSystem, satPath: string, fix = 'shorten the window (--from/--to or window:) to the source span'): void {
  const f = (t: number): string => ts.format(Instant.fromTtJ2000S(t));
  if (from < traj.validFromTtJ2000S - 1e-3 || to > traj.validToTtJ2000S + 1e-3) {
    throw new SpanError(
      `window ${f(from)} to ${f(to)} goes beyond ${traj.id}'s orbit source span ${f(traj.validFromTtJ2000S)} to ${f(traj.validToTtJ2000S)}`,
      satPath,
      f(traj.validFromTtJ2000S),
      f(traj.validToTtJ2000S),
      fix,
    );
  }
}

/**
 * For a sub-orbital flight (a ballistic state that lands), the part of [from, to] it covers; null for
 * an orbit. A flight with less than a second inside the window is refused (SpanError on `satPath`).
 */
export function flightInWindow(traj: Trajectory, from: number, to: number, ts: TimeSystem, satPath: string): { fromTtJ2000S: number; toTtJ2000S: number; landTtJ2000S: number } | null {
  if (!(traj instanceof NumericalTrajectory) || traj.flightEndTtJ2000S === null) return null;
  const start = Math.max(from, traj.validFromTtJ2000S);
  const end = Math.min(to, traj.flightEndTtJ2000S);
  if (!(end - start >= 1)) {
    const f = (t: number): string => ts.format(Instant.fromTtJ2000S(t));
    const [launch, land] = [f(traj.validFromTtJ2000S), f(traj.flightEndTtJ2000S)];
    throw new SpanError(`the sub-orbital flight of ${traj.id} (${launch} to ${land}) has no part in the window ${f(from)} to ${f(to)}`, satPath, launch, land, 'give a window that holds part of the flight (--from/--to or window:), or the state of a flight inside the window');
  }
  return { fromTtJ2000S: start, toTtJ2000S: end, landTtJ2000S: traj.flightEndTtJ2000S };
}

/** The span an orbit must cover: the window, widened to hold the clock epoch (the clock is integrated from it). */
export function spanWithClockEpoch(from: number, to: number, params: OscillatorParams | null): { fromTtJ2000S: number; toTtJ2000S: number } {
  if (params === null) return { fromTtJ2000S: from, toTtJ2000S: to };
  return { fromTtJ2000S: Math.min(from, params.epochTtJ2000S), toTtJ2000S: Math.max(to, params.epochTtJ2000S + 1) };
}

/** A named gravity model, with the solar and lunar tidal potential when `tides` is true. */
export function gravityWithTides(name: string, tides: boolean, ts: TimeSystem, where = '--gravity'): GravityModel {
  const base = gravityModel(name, where);
  return tides ? { ...base, tides: new TidalField((t) => ts.jdUtcFromTtJ2000S(t)) } : base;
}

/** The scenario's gravity model, with the solar and lunar tides when it asks for them. */
export function scenarioGravity(scenario: ScenarioSpec, ts: TimeSystem, path: string, name: string = scenario.gravity): GravityModel {
  // With clocks near the Moon: the Moon taken exactly and the Sun's tide, for every clock (lunarScenario.ts).
  return lunarAwareGravity(scenario, gravityWithTides(name, scenario.tides, ts, `${path} gravity`));
}

/** Days from an element set's epoch to the farthest end of [from, to] when past SGP4's usual span, else null. */
function staleElementSetDays(traj: Trajectory, from: number, to: number): number | null {
  if (!(traj instanceof Sgp4Trajectory)) return null;
  const farS = Math.max(Math.abs(from - traj.epochTtJ2000S), Math.abs(to - traj.epochTtJ2000S));
  return farS > SGP4_DEFAULT_HALF_SPAN_S ? farS / 86400 : null;
}

/** Longest window or horizon handled in one run [days]; memory grows linearly with it. */
export const MAX_WINDOW_DAYS = 3660;

/** The window [from, to] (s since J2000.0 TT) a selection asks for, checked. */
export function resolveWindow(scenario: ScenarioSpec, ts: TimeSystem, sel: ScenarioSelection, path: string): { from: number; to: number } {
  const from = sel.from === undefined ? scenario.window.start.ttJ2000S : sel.from instanceof Instant ? sel.from.ttJ2000S : ts.parse(sel.from, '--from').ttJ2000S;
  let to = sel.to === undefined ? scenario.window.end.ttJ2000S : sel.to instanceof Instant ? sel.to.ttJ2000S : ts.parse(sel.to, '--to').ttJ2000S;
  if (sel.horizonS !== undefined) {
    if (sel.horizonS / 86400 > MAX_WINDOW_DAYS) throw new InputError(`horizon of ${(sel.horizonS / 86400).toFixed(0)} days exceeds the ${MAX_WINDOW_DAYS}-day limit`, '--horizon', 'plan in pieces of at most 10 years');
    to = from + sel.horizonS;
  }
  if (!(to > from)) throw new InputError('the window ends before it starts', sel.to !== undefined ? '--to' : sel.from !== undefined ? '--from' : `${path} window`, 'give an end after the start');
  if (sel.horizonS === undefined && (to - from) / 86400 > MAX_WINDOW_DAYS) {
    throw new InputError(`window of ${((to - from) / 86400).toFixed(0)} days exceeds the ${MAX_WINDOW_DAYS}-day limit`, sel.to !== undefined ? '--to' : `${path} window`, 'plan in pieces of at most 10 years');
  }
  return { from, to };
}

/** The satellites a selection names (all by default), in scenario order. */
export function selectSatellites(scenario: ScenarioSpec, sel: ScenarioSelection): SatelliteSpec[] {
  return pick(scenario.satellites, sel.sat, (s) => [s.id, ...(s.name === null ? [] : [s.name]), ...catalogueNumbers(s)], '--sat', 'satellite');
}

/** A TLE or OMM satellite's catalogue number as written and without leading zeros (as `size --sat` takes it). */
function catalogueNumbers(s: SatelliteSpec): string[] {
  const o = s.orbit;
  const raw = o.kind === 'tle' ? o.line1.slice(2, 7).trim() : o.kind === 'omm' ? String(o.fields.NORAD_CAT_ID ?? '').trim() : '';
  if (raw === '') return [];
  const bare = raw.replace(/^0+(?=\d)/, '');
  return bare === raw ? [raw] : [raw, bare];
}

/**
 * Prepare the selected satellites' trajectories and clocks over the selected window. `path` names
 * the scenario in messages (its file name).
 */
export function prepareScenario(scenario: ScenarioSpec, ts: TimeSystem, sel: ScenarioSelection, resolveOrbit: OrbitResolver, path: string = scenario.fileName): ScenarioContext {
  const gravity = scenarioGravity(scenario, ts, path);
  const { from, to } = resolveWindow(scenario, ts, sel, path);
  const satellites = selectSatellites(scenario, sel);
  const stationSpecs = pick(scenario.stations, sel.station, (s) => [s.id], '--station', 'station');
  const runs = satellites.map((sat) => {
    const params = oscillatorParams(sat.clock);
    const resolved = resolveOrbit(sat, scenario, ts, gravity, spanWithClockEpoch(from, to, params));
    const flight = flightInWindow(resolved.trajectory, from, to, ts, `${path} ${sat.path}`);
    if (flight !== null) {
      const f = (t: number): string => ts.format(Instant.fromTtJ2000S(t));
      // The clock is integrated from its epoch, and a flight has no states before launch or after landing.
      if (params !== null && (params.epochTtJ2000S < resolved.trajectory.validFromTtJ2000S - 1e-3 || params.epochTtJ2000S + 1 > flight.landTtJ2000S + 1e-3)) {
        const [launch, land] = [f(resolved.trajectory.validFromTtJ2000S), f(flight.landTtJ2000S)];
        throw new SpanError(`the clock epoch ${f(params.epochTtJ2000S)} of ${sat.id} is outside its sub-orbital flight ${launch} to ${land}`, `${path} ${sat.path}.clock.epoch`, launch, land, 'give a clock epoch from the state epoch to a second before landing (the clock is integrated from it)');
      }
      const run = prepareSatelliteClock(sat.id, resolved.name, resolved.trajectory, gravity, params, flight.fromTtJ2000S, flight.toTtJ2000S);
      const clipped = flight.fromTtJ2000S > resolved.trajectory.validFromTtJ2000S || flight.toTtJ2000S < flight.landTtJ2000S;
      const note = `${sat.id}: sub-orbital flight from ${f(resolved.trajectory.validFromTtJ2000S)} to ${f(flight.landTtJ2000S)}; reported over ${clipped ? `${f(flight.fromTtJ2000S)} to ${f(flight.toTtJ2000S)}` : 'its flight'} only`;
      return { ...run, startTtJ2000S: flight.fromTtJ2000S, endTtJ2000S: flight.toTtJ2000S, note };
    }
    checkWindowInSpan(resolved.trajectory, from, to, ts, `${path} ${sat.path}`);
    if (params !== null) checkWindowInSpan(resolved.trajectory, Math.min(from, params.epochTtJ2000S), Math.max(to, params.epochTtJ2000S), ts, `${path} ${sat.path}.clock.epoch`, 'give a clock epoch inside the orbit source span (the clock is integrated from it)');
    // An orbit that fails inside the window (an SGP4 decay) is reported up to the failure. The
    // integration samples the whole window anyway: only when it (or the window end) fails is the
    // failure located by a scan, instead of scanning every orbit first.
    let endTtJ2000S = to;
    let failure: Error | null = null;
    let run: SatelliteClockRun | null = null;
    try {
      resolved.trajectory.stateAt(to);
      run = prepareSatelliteClock(sat.id, resolved.name, resolved.trajectory, gravity, params, from, to);
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
    }
    if (run === null) {
      ({ endTtJ2000S, failure } = usableEnd(resolved.trajectory, from, to));
      if (failure !== null && endTtJ2000S - from < 60) throw failure;
      run = prepareSatelliteClock(sat.id, resolved.name, resolved.trajectory, gravity, params, from, endTtJ2000S);
    }
    const notes: string[] = [];
    const stale = staleElementSetDays(resolved.trajectory, from, endTtJ2000S);
    if (stale !== null) notes.push(`${sat.id}: the window reaches ${stale.toFixed(0)} days from its element-set epoch, beyond SGP4's ${SGP4_DEFAULT_HALF_SPAN_S / 86400}-day span — the orbit is extrapolated; use a newer element set`);
    if (failure !== null) {
      const at = ts.format(Instant.fromTtJ2000S(endTtJ2000S));
      const reason = failure instanceof InputError ? failure.what : String(failure);
      notes.push(`${sat.id}: ${reason} after ${at}; reported up to then`);
    }
    return notes.length === 0 ? run : { ...run, endTtJ2000S, note: notes.join('. ') };
  });
  const stations: Station[] = stationSpecs;
  return { scenario, ts, gravity, fromTtJ2000S: from, toTtJ2000S: to, runs, stations, gmstRadAt: (t) => gmstRadAtTt(ts, t), satellites };
}
