/**
 * A checked scenario as plain data (contract: scenario schema). `src/io/scenario.ts` reads it from
 * YAML or JSON; the use cases in `src/plan` take it. Times are instants, defaults applied.
 */
import type { Instant } from '../time/instant.ts';
import type { Station } from './station.ts';

/** Name of a gravity model for orbits and clock rates (physics.md §2); `src/orbit/gravity.ts` builds it. */
export type GravityModelName = 'point' | 'j2' | 'zonal';
/** Time scale that `offsetNs` is measured against. All three tick at the geoid rate. */
export type ReferenceScale = 'GPS' | 'TAI' | 'TT';
/** How the resets planner adjusts a clock (phase steps, frequency steps, or both together). */
export type AdjustmentKind = 'phase' | 'frequency' | 'combined';

/** A TLE, split but not parsed. Lines are kept as written (trailing spaces removed). */
export interface TleOrbitSpec {
  kind: 'tle';
  /** The name line (line 0) as written, or null for a two-line set. */
  nameLine: string | null;
  line1: string;
  line2: string;
  /** The set rejoined with `\n` (name line first when present), for a TLE text parser. */
  text: string;
}

/** A CCSDS OMM given inline, as JSON-OMM keys (e.g. `EPOCH`, `MEAN_MOTION`); parsed elsewhere. */
export interface OmmOrbitSpec {
  kind: 'omm';
  /** The keys and values exactly as given. */
  fields: Record<string, string | number>;
}

/** The body an orbit or a station belongs to (lunar issue). */
export type CentralBody = 'earth' | 'moon';

/**
 * Osculating Keplerian elements at `epoch`: about the WGS-84 GM (body earth, the default), or about
 * the Moon (body moon: GM_M of DE430, angles to the Moon's mean equator of the epoch; aKm from the
 * Moon's centre, periselene above the 1737.4 km sphere).
 */
export interface KeplerianOrbitSpec {
  kind: 'keplerian';
  /** Central body; absent means the Earth. */
  body?: CentralBody;
  epoch: Instant;
  /** Semi-major axis from the Earth's centre [km]. Perigee aKm·(1−e) is above 6378.137 km. */
  aKm: number;
  /** Eccentricity, 0 ≤ e < 1. */
  e: number;
  /** Inclination [deg], 0 … 180. */
  iDeg: number;
  /** Right ascension of the ascending node [deg]. */
  raanDeg: number;
  /** Argument of perigee [deg]. */
  argpDeg: number;
  /** Mean anomaly at epoch [deg]. */
  meanAnomalyDeg: number;
}

/** A Cartesian state at `epoch` in an inertial frame. May be sub-orbital (contract `compare`). */
export interface StateOrbitSpec {
  kind: 'state';
  epoch: Instant;
  /** GCRF and TEME are Earth-centred; LCRS is Moon-centred with ICRS axes (lunar orbits). */
  frame: 'GCRF' | 'TEME' | 'LCRS';
  /** Position [km] in `frame`; |r| is at least the WGS-84 polar radius (LCRS: the 1737.4 km lunar sphere). */
  positionKm: [number, number, number];
  /** Velocity [km/s] in `frame`. */
  velocityKmPerS: [number, number, number];
}

/** A satellite taken from an SP3 precise-orbit file. */
export interface Sp3OrbitSpec {
  kind: 'sp3';
  /** The path as written in the scenario. */
  file: string;
  /** `file` resolved against the scenario file's folder (absolute). */
  resolvedFile: string;
  /** Satellite id inside the SP3 file, e.g. `L51`. */
  id: string;
}

/** A satellite taken from a CCSDS OEM (KVN). */
export interface OemOrbitSpec {
  kind: 'oem';
  /** The path as written in the scenario. */
  file: string;
  /** `file` resolved against the scenario file's folder (absolute). */
  resolvedFile: string;
  /** OBJECT_NAME or OBJECT_ID in the OEM; null: the file's only object. */
  object: string | null;
}

/** Exactly one orbit source per satellite. */
export type OrbitSpec = TleOrbitSpec | OmmOrbitSpec | KeplerianOrbitSpec | StateOrbitSpec | Sp3OrbitSpec | OemOrbitSpec;

/** The orbit kinds a scenario may name, in the order the contract lists them. */
export const ORBIT_KINDS = ['tle', 'omm', 'keplerian', 'state', 'sp3', 'oem'] as const;

/** Allan-deviation noise levels (physics.md §6). A level left out is 0 (no contribution). */
export interface ClockNoiseSpec {
  /** White FM: σ_y(τ) = whiteFmAdev1s/√(τ/1 s) [1]. */
  whiteFmAdev1s: number;
  /** Flicker FM floor, constant σ_y [1]. */
  flickerFmFloor: number;
  /** Random-walk FM: σ_y(τ) = randomWalkFmAdev1d·√(τ/1 d) [1]. */
  randomWalkFmAdev1d: number;
}

/**
 * Onboard oscillator model: dx/dt = hardwareFractionalOffset + y_rel(t) + agingPerDay·(t − epoch)/1 d,
 * x(epoch) = offsetNs, x measured against the scenario's `reference` scale.
 */
export interface ClockSpec {
  /** Epoch of offsetNs and of the aging term. Default: window.start. */
  epoch: Instant;
  /** Clock reading minus reference at epoch [ns]. Default 0. */
  offsetNs: number;
  /** Factory detuning as a fractional frequency [1]. Default 0. */
  hardwareFractionalOffset: number;
  /** Change of fractional frequency per day [1/d]. Default 0. */
  agingPerDay: number;
  noise: ClockNoiseSpec;
  /** |offsetNs| must stay below this [ns]; null: no keep-in limit. */
  keepInNs: number | null;
  /** Extra key `clock.steps`: what the steering hardware can do (null fields: continuous, unlimited). */
  steps: ClockStepsSpec;
  /** Extra key `clock.nominalHz`: nominal oscillator frequency [Hz], for steps in Hz. Default 10.23e6. */
  nominalHz: number;
}

/** Hardware step sizes; `frequencyResolutionHz` in the file is converted with `nominalHz`. */
export interface ClockStepsSpec {
  /** Smallest phase step [ns], > 0. */
  phaseResolutionNs: number | null;
  /** Smallest fractional frequency step [1], > 0. */
  frequencyResolution: number | null;
  /** Largest fractional frequency step in size [1], ≥ frequencyResolution. */
  maxFrequencyStep: number | null;
}

/** One satellite. */
export interface SatelliteSpec {
  id: string;
  /**
   * Display name: as given; else the TLE name line (a leading `0 ` removed) or the OMM
   * OBJECT_NAME; else null (callers then show `id`).
   */
  name: string | null;
  orbit: OrbitSpec;
  /** Null: no oscillator model, offsets are relativistic only. */
  clock: ClockSpec | null;
  /**
   * Extra key `measurements`: a CSV of measured offsets of this satellite's clock (`time,offsetNs[,sigmaNs]`),
   * resolved against the scenario's folder; `tauplan report` fits it. Null when not given.
   */
  measurementsFile: string | null;
  /** JSON path of this entry (`satellites[2]`), for messages from later stages. */
  path: string;
}

/**
 * An earth-fixed ground station as checked here (ranges: latitude −90 … 90°, longitude −180 ≤ lon < 360°
 * as given, height −500 … 10 000 m, geoid undulation −150 … 150 m, mask −5 ≤ mask < 90°, minPassS ≥ 0;
 * defaults geoidHeightM 0, maskDeg 10, minPassS 300).
 */
export interface StationSpec extends Station {
  /**
   * Extra key `body`: `moon` for a station on the Moon (latDeg, lonDeg selenographic in the
   * mean-Earth/polar-axis frame, heightM above the 1737.4 km sphere, geoidHeightM unused). Absent: the Earth.
   */
  body?: CentralBody;
  /** Extra key `uplink`: the station can send adjustments (default true). Passes list every station. */
  uplink: boolean;
  /** JSON path of this entry (`stations[0]`), for messages from later stages. */
  path: string;
  /** False when the scenario left geoidHeightM out (0 is then assumed; reports carry a note). */
  geoidHeightGiven: boolean;
}

/** Policy for keep-in adjustments (contract `resets`, physics.md §7). */
export interface ResetPolicySpec {
  /** Adjust no later than the predicted crossing minus this [ns of offset], ≥ 0, below every keepInNs. Default 0. */
  marginNs: number;
  /** `policy.leadTime` in seconds, ≥ 0; null when not given (the planner decides). */
  leadTimeS: number | null;
  /** Strategy. Default combined. */
  prefer: AdjustmentKind;
  /** Extra key `policy.target.offsetNs`: the offset to steer toward [ns]. Default 0; inside every limit minus the margin. */
  targetNs: number;
  /** Extra key `policy.blackouts`: spans with no adjustment, for the listed satellites (null: all). End after start. */
  blackouts: { start: Instant; end: Instant; satellites: string[] | null }[];
  /** Extra key `policy.minSpacing`: shortest time between two adjustments of one satellite [s], ≥ 0. Default 0. */
  minSpacingS: number;
  /** Extra key `policy.horizon`: how far ahead `resets` looks [s]. Default 180 d; `--horizon` overrides. */
  horizonS: number;
}

/** A checked scenario, times parsed, defaults applied. */
export interface ScenarioSpec {
  /** Scenario name; default the file name without its extension. */
  name: string;
  /** The file name given to the parser (used in messages). */
  fileName: string;
  /** Absolute folder of the scenario file; relative file paths inside resolve against it. */
  folder: string;
  /** Planning window; end is after start. */
  window: { start: Instant; end: Instant };
  /** Default zonal (EGM2008 J2..J6). */
  gravity: GravityModelName;
  /** Extra key `tides`: add the solar and lunar tidal potential to clock rates. Default false. */
  tides: boolean;
  /** Default GPS. */
  reference: ReferenceScale;
  /** At least one; ids unique across satellites and stations. */
  satellites: SatelliteSpec[];
  /** Possibly empty. */
  stations: StationSpec[];
  /** Always present; defaults when the file has no `policy`. */
  policy: ResetPolicySpec;
}
