/** Library use case: frequency-offset sizing for one orbit (command `size`). */
import { GNSS_NOMINAL_HZ } from '../constants.ts';
import { InputError } from '../errors.ts';
import type { ElementSetRecord } from '../model/elementSet.ts';
import type { SatelliteSpec, ScenarioSpec } from '../model/scenario.ts';
import type { GravityModelName } from '../orbit/gravity.ts';
import type { ResolvedOrbit } from '../orbit/source.ts';
import { checkKeplerianInput, orbitFromElementSet, orbitFromKeplerian, type KeplerianInput } from '../plan/orbitInput.ts';
import type { SizeResult } from '../plan/size.ts';
import { isLunarOrbiter } from '../orbit/lunarOrbit.ts';
import { sizeLunarClock, type LunarSizeResult } from '../plan/lunarSize.ts';
import { lunarSizeToJson, type LunarSizeJson } from '../report/lunarSizeReport.ts';
import { sizeResolvedOrbit, spanStart } from '../plan/sizeOrbit.ts';
import type { ScenarioContext } from '../plan/scenarioRuns.ts';
import { sizeScenarioRuns } from '../plan/scenarioSizes.ts';
import { sizeToJson, type SizeJson } from '../report/sizeReport.ts';
import { DEFAULT_ELEMENTS_EPOCH, durationArg, gravityArg, timeArg, timeSystemOf, type CommonOptions, type DurationInput, type TimeInput } from './common.ts';
import { resolveOrbit } from './scenario.ts';

/** Osculating Keplerian elements with their epoch (default 2027-01-01T00:00:00Z), as the `size` flags give them. */
export interface KeplerianOrbit extends KeplerianInput {
  /** Epoch of the elements. */
  epoch?: TimeInput;
}

/** A satellite of a loaded scenario; `scenario` names it in messages (and resolves SP3 files). */
export interface ScenarioSatellite {
  satellite: SatelliteSpec;
  scenario: ScenarioSpec;
}

/**
 * An orbit already resolved to a trajectory (for example a CCSDS OEM read by the CLI's file
 * readers), with its display name.
 */
export type PreparedOrbit = ResolvedOrbit;

/** What {@link sizeOrbit} sizes: Keplerian elements, a parsed TLE/OMM element set, a scenario satellite, or a prepared trajectory. */
export type OrbitInput = KeplerianOrbit | ElementSetRecord | ScenarioSatellite | PreparedOrbit;

/** Options of {@link sizeOrbit}: the `size` flags in camelCase. */
export interface SizeOptions extends CommonOptions {
  /** Gravity model: point, j2 or zonal (default zonal: EGM2008 J2…J6). */
  gravity?: GravityModelName;
  /** Add the solar and lunar tidal potential (below 1e-15 up to GNSS altitude). Default false. */
  tides?: boolean;
  /** Start of the span (default: the orbit's epoch). */
  from?: TimeInput;
  /** Length of the span (default 1 d). */
  span?: DurationInput;
  /** Nominal oscillator frequency [Hz] (default 10.23e6). */
  nominalHz?: number;
}

/** Default epoch of Keplerian elements (contract `size --epoch`). */
export { DEFAULT_ELEMENTS_EPOCH };

function isElementSet(o: OrbitInput): o is ElementSetRecord {
  return 'kind' in o && (o.kind === 'tle' || o.kind === 'omm');
}

function isScenarioSatellite(o: OrbitInput): o is ScenarioSatellite {
  return 'satellite' in o && 'scenario' in o;
}

function isPrepared(o: OrbitInput): o is PreparedOrbit {
  return 'trajectory' in o && 'name' in o;
}

/**
 * Size the clock on an orbit (the writers' input; {@link sizeOrbit} gives the JSON). The orbit may
 * be given as a function, called once the options are checked (the CLI reads its files then).
 */
export function runSize(orbitOrReader: OrbitInput | (() => OrbitInput), options?: SizeOptions): SizeResult {
  const ts = timeSystemOf(options);
  const gravity = gravityArg(options?.gravity ?? 'zonal', options?.tides === true, ts);
  const spanS = durationArg(options?.span ?? '1d', '--span');
  const nominalHz = options?.nominalHz ?? GNSS_NOMINAL_HZ;
  if (!(nominalHz > 0)) throw new InputError(`nominal frequency ${nominalHz} Hz is not positive`, '--nominal-hz', 'give e.g. 10.23e6');
  const fromGiven = timeArg(ts, options?.from, '--from');
  const spanFor = (epoch: number | null) => {
    const start = spanStart(fromGiven, epoch);
    return { fromTtJ2000S: start, toTtJ2000S: start + spanS };
  };
  const orbit = typeof orbitOrReader === 'function' ? orbitOrReader() : orbitOrReader;
  let resolved: ResolvedOrbit;
  if (isPrepared(orbit)) resolved = orbit;
  else if (isElementSet(orbit)) resolved = orbitFromElementSet(orbit, ts, spanFor);
  else if (isScenarioSatellite(orbit)) {
    const o = orbit.satellite.orbit;
    const epoch = o.kind === 'keplerian' || o.kind === 'state' ? o.epoch.ttJ2000S : orbit.scenario.window.start.ttJ2000S;
    resolved = resolveOrbit(orbit.satellite, orbit.scenario, ts, gravity, spanFor(epoch));
  } else {
    checkKeplerianInput(orbit);
    const epoch = timeArg(ts, orbit.epoch ?? DEFAULT_ELEMENTS_EPOCH, '--epoch') as number;
    resolved = orbitFromKeplerian(orbit, epoch, gravity, spanFor);
  }
  // About the Moon (a scenario's lunar satellite, a Moon-centred OEM): the lunar sizing (size --body moon).
  if (isLunarOrbiter(resolved.trajectory)) {
    const traj = resolved.trajectory;
    const from = fromGiven ?? traj.epochTtJ2000S ?? traj.validFromTtJ2000S;
    return sizeLunarClock({ trajectory: traj, earthGravity: gravity, fromTtJ2000S: from, spanS, nominalHz, rebuildWithDeltaAKm: resolved.rebuildWithDeltaAKm });
  }
  return sizeResolvedOrbit(resolved, gravity, fromGiven, spanS, nominalHz, ts);
}

/**
 * Frequency-offset sizing: the mean fractional offset [1] of the onboard clock against TT with the
 * conventional −2r·v/c² term removed, its gravitational and velocity parts, the drift [ns/day], the
 * frequency to set on the ground [Hz], the eccentricity amplitude [ns] and the sensitivity to the
 * semi-major axis [1/km]: the object `tauplan size --format json` prints.
 */
export function sizeOrbit(orbit: OrbitInput, options?: SizeOptions): SizeJson | LunarSizeJson {
  const r = runSize(orbit, options);
  return 'body' in r && r.body === 'moon' ? lunarSizeToJson(r as LunarSizeResult, timeSystemOf(options)) : sizeToJson(r, timeSystemOf(options));
}

/**
 * Size every satellite of a prepared scenario run (the `context` of `runPasses` or
 * runResets) over one day from the window start, or the part of it its orbit covers: what the
 * whole-job report shows. `notes` say which satellites were shortened or left out.
 */
export function sizeScenarioSatellites(context: ScenarioContext, nominalHz: number = GNSS_NOMINAL_HZ): { sizes: { result: SizeResult; title: string }[]; notes: string[] } {
  return sizeScenarioRuns(context, nominalHz);
}
