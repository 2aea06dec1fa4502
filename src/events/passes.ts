/**
 * Pass finding: when a satellite is above a station's elevation mask.
 *
 * Frames and time: the trajectory's inertial states (TEME or TOD) are turned earth-fixed with the
 * caller's sidereal angle `gmstRadAt(ttJ2000S)` (GMST of UTC-as-UT1, see src/orbit/frames.ts). A TOD
 * state is treated as TEME: the two differ by the equation of the equinoxes (< 1.2", about 40 m at
 * GNSS range and 4 m at LEO range), which moves AOS/LOS by well under 0.1 s; we accept that.
 * Elevations are geometric (no refraction) above the geodetic horizon. Times are seconds since
 * J2000.0 TT.
 *
 * Method:
 * 1. A coarse grid with step h = clamp(τp / 4, 10 s, 600 s), where τp = r_p / v_p is the time scale
 *    of perigee passage from the osculating state at the window start (vis-viva).
 *    Each grid sample gives sin(elevation) and the sign of its rate (from the earth-fixed velocity);
 *    the search compares sin(elevation) with sin(mask), which has the same signs and roots as
 *    elevation − mask (sin increases on [−90°, 90°]) and needs no inverse trigonometry. The Earth's
 *    rotation along the grid comes from exact anchors and the constant rate (./siderealGrid.ts).
 * 2. In every grid bin where the elevation rate changes sign from + to −, the maximum is located
 *    by a root finder on the (smooth) rate numerator; where it changes − to + and both ends are
 *    above the mask, the minimum is located too. This catches passes shorter than h (the rate
 *    turns inside the bin even when both ends are below the mask) and dips that would merge two
 *    passes, so a pass needs no grid point of its own and h does not depend on minPassS. The one
 *    assumption — at most one elevation extremum per bin — holds because h is a quarter of the
 *    fastest orbital time scale (elevation extrema are further apart: they follow the station-to-
 *    satellite geometry, whose time scale ρ/v is longer still above LEO). A maximum in a bin whose ends are both below the
 *    mask is not located when a bound on the satellite's earth-fixed speed shows that the
 *    elevation cannot reach the mask in between (./passScan.ts).
 * 3. Between consecutive knots (grid points and located extrema) the elevation is monotonic, so a
 *    sign change of (elevation − mask) holds exactly one AOS or LOS; it is refined to 1 ms.
 *    Refinement (./passScan.ts) is a Newton iteration on the state's own rate from the cubic
 *    Hermite guess of the bin, inside the sign bracket and capped: one or two states per root.
 * 4. TCA is the culmination: the highest located maximum in the pass (time of maximum elevation,
 *    located to 1 ms through the elevation-rate root; close to, but not exactly, the time of minimum
 *    range). A truncated pass may culminate at the window edge.
 *
 * Passes shorter than the station's `minPassS` are dropped, except truncated ones: their full length
 * is unknown from inside the window, so they are kept whatever their in-window length and flagged
 * (`truncated`). A planner that needs `minPassS` inside the window checks `durationS` itself.
 * Every iteration is capped; hitting a cap throws InternalError.
 */
import { WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../constants.ts';
import { InputError } from '../errors.ts';
import { allocStateBlock, checkSpan, type Trajectory } from '../orbit/trajectory.ts';
import { earthFixedSpeedBoundMPerS, EcefEvaluator } from './passEvaluator.ts';
import { StationScan } from './passScan.ts';
import { earthRotationAlongGrid } from './siderealGrid.ts';
import { checkStation, type Station } from './station.ts';

export { bracketedRoot } from './passRoots.ts';

/** Sidereal angle [rad] at an instant given in seconds since J2000.0 TT (inertial → earth-fixed rotation). */
export type GmstRadAt = (ttJ2000S: number) => number;

/** One pass of a satellite over a station. Times in seconds since J2000.0 TT. */
export interface Pass {
  satelliteId: string;
  stationId: string;
  /** Acquisition: elevation rises through the mask, or the window start when `aosTruncated`. */
  aosTtJ2000S: number;
  /** Culmination (time of maximum elevation within the pass and window). */
  tcaTtJ2000S: number;
  /** Loss: elevation falls through the mask, or the window end when `losTruncated`. */
  losTtJ2000S: number;
  /** Maximum geometric elevation [deg] reached in the pass (within the window). */
  maxElevationDeg: number;
  /** losTtJ2000S − aosTtJ2000S [s]. */
  durationS: number;
  /** aosTruncated || losTruncated. */
  truncated: boolean;
  /** The pass was in progress at the window start. */
  aosTruncated: boolean;
  /** The pass was in progress at the window end. */
  losTruncated: boolean;
}

export interface PassSearchOptions {
  /** Override the coarse grid step [s] (> 0). Tests use it; the default sizing is described above. */
  gridStepS?: number;
}

export interface PassSearchResult {
  /** Passes sorted by AOS (then station id). */
  passes: Pass[];
  /** Number of trajectory states computed: grid samples plus refinement evaluations. */
  statesEvaluated: number;
  /** Coarse grid step used [s]. */
  gridStepS: number;
}

/** Grid step bounds [s]. */
const MIN_GRID_STEP_S = 10;
const MAX_GRID_STEP_S = 600;
/** Samples per bulk `sampleInto` call; bounds memory for long windows. */
const CHUNK_SAMPLES = 4096;

/**
 * Coarse grid step [s] for a trajectory: clamp(min(minPassS / 2, τp / 4), 10, 600), with
 * τp = r_p / v_p from the osculating two-body orbit of `state` (position m, velocity m/s, inertial).
 * For an unbound or degenerate state τp falls back to r / v at the state. The lunar finder's step;
 * the Earth-station search uses {@link earthPassGridStepS}.
 */
export function passGridStepS(positionM: readonly number[], velocityMPerS: readonly number[], minPassS: number): number {
  const r = Math.hypot(positionM[0], positionM[1], positionM[2]);
  const v2 = velocityMPerS[0] ** 2 + velocityMPerS[1] ** 2 + velocityMPerS[2] ** 2;
  const gm = WGS84_GM_M3_PER_S2;
  const energy = v2 / 2 - gm / r;
  let timeScaleS = r / Math.sqrt(Math.max(v2, 1e-6));
  if (energy < 0) {
    const aM = -gm / (2 * energy);
    const hx = positionM[1] * velocityMPerS[2] - positionM[2] * velocityMPerS[1];
    const hy = positionM[2] * velocityMPerS[0] - positionM[0] * velocityMPerS[2];
    const hz = positionM[0] * velocityMPerS[1] - positionM[1] * velocityMPerS[0];
    const h2 = hx * hx + hy * hy + hz * hz;
    const e = Math.sqrt(Math.max(0, 1 - h2 / (gm * aM)));
    const rpM = aM * (1 - e);
    const vp = Math.sqrt((gm * (1 + e)) / Math.max(rpM, 1));
    timeScaleS = Math.min(timeScaleS, rpM / vp);
  }
  const wanted = Math.min(minPassS / 2, timeScaleS / 4);
  return Math.min(MAX_GRID_STEP_S, Math.max(MIN_GRID_STEP_S, wanted));
}

/**
 * Grid step [s] of the Earth-station search ({@link findPassesMany}): clamp(τp / 4, 10, 600), the
 * orbit's own time scale (see {@link passGridStepS}). Located extrema find passes of any length
 * (step 2 of the method), so no grid point is needed inside each pass; {@link passGridStepS} with a
 * `minPassS` keeps one there for finders that rely on it (the lunar one: its passes can end at an
 * occultation, which no elevation extremum announces).
 */
export function earthPassGridStepS(positionM: readonly number[], velocityMPerS: readonly number[]): number {
  return passGridStepS(positionM, velocityMPerS, Infinity);
}

/**
 * Passes of one trajectory over several stations in [fromTtJ2000S, toTtJ2000S], sharing one coarse
 * sampling of the trajectory ({@link earthPassGridStepS} unless `opts.gridStepS` is given).
 * Throws SpanError when the window leaves the trajectory's span, InputError for a bad window or station.
 */
export function findPassesMany(
  traj: Trajectory,
  stations: readonly Station[],
  gmstRadAt: GmstRadAt,
  fromTtJ2000S: number,
  toTtJ2000S: number,
  opts: PassSearchOptions = {},
): PassSearchResult {
  if (!Number.isFinite(fromTtJ2000S) || !Number.isFinite(toTtJ2000S) || toTtJ2000S < fromTtJ2000S) {
    throw new InputError(`pass window [${fromTtJ2000S}, ${toTtJ2000S}] s TT is empty or not finite`, 'window', 'give an end time after the start time');
  }
  for (const s of stations) checkStation(s);
  if (opts.gridStepS !== undefined && !(Number.isFinite(opts.gridStepS) && opts.gridStepS > 0)) {
    throw new InputError(`grid step ${opts.gridStepS} s is not positive`, 'gridStepS', 'give a positive step in seconds, or leave it out');
  }
  checkSpan(traj, fromTtJ2000S);
  checkSpan(traj, toTtJ2000S);
  const ev = new EcefEvaluator(traj, gmstRadAt);
  if (stations.length === 0 || toTtJ2000S === fromTtJ2000S) return { passes: [], statesEvaluated: 0, gridStepS: opts.gridStepS ?? 0 };

  let stepS = opts.gridStepS;
  if (stepS === undefined) {
    const s0 = traj.stateAt(fromTtJ2000S);
    ev.statesEvaluated++;
    stepS = earthPassGridStepS(s0.positionM, s0.velocityMPerS);
  }

  const scans = stations.map((s) => new StationScan(s, ev, traj.id));
  ev.gridStepS = stepS;
  const spanS = toTtJ2000S - fromTtJ2000S;
  const intervals = Math.max(1, Math.ceil(spanS / stepS - 1e-9));
  const total = intervals + 1;
  const chunk = Math.min(CHUNK_SAMPLES, total);
  const times = new Float64Array(chunk);
  const cosG = new Float64Array(chunk);
  const sinG = new Float64Array(chunk);
  const rateG = new Float64Array(chunk);
  const block = allocStateBlock(chunk);
  const w = WGS84_OMEGA_RAD_PER_S;
  for (let start = 0; start < total; start += chunk) {
    const n = Math.min(chunk, total - start);
    const ts = n === chunk ? times : times.subarray(0, n);
    for (let i = 0; i < n; i++) {
      const k = start + i;
      ts[i] = k === intervals ? toTtJ2000S : fromTtJ2000S + k * stepS;
    }
    traj.sampleInto(ts, block);
    ev.statesEvaluated += n;
    // The window end is off the even grid: its angle exactly.
    const even = start + n - 1 === intervals ? n - 1 : n;
    earthRotationAlongGrid(gmstRadAt, fromTtJ2000S + start * stepS, stepS, even, cosG, sinG, rateG);
    ev.useGridRotation(fromTtJ2000S + start * stepS, stepS, even, cosG, sinG, rateG);
    if (even < n) {
      const g = gmstRadAt(ts[n - 1]);
      cosG[n - 1] = Math.cos(g);
      sinG[n - 1] = Math.sin(g);
    }
    const p = block.positionM;
    const v = block.velocityMPerS;
    let v2Max = 0;
    let r2Min = Infinity;
    let r2Max = 0;
    for (let i = 0; i < n; i++) {
      // temeToEcef (src/orbit/frames.ts) in place.
      const c = cosG[i];
      const s = sinG[i];
      const j = 3 * i;
      const x = c * p[j] + s * p[j + 1];
      const y = -s * p[j] + c * p[j + 1];
      const vx = c * v[j] + s * v[j + 1] + w * y;
      const vy = -s * v[j] + c * v[j + 1] - w * x;
      p[j] = x;
      p[j + 1] = y;
      v[j] = vx;
      v[j + 1] = vy;
      const r2 = x * x + y * y + p[j + 2] * p[j + 2];
      const v2 = vx * vx + vy * vy + v[j + 2] * v[j + 2];
      if (v2 > v2Max) v2Max = v2;
      if (r2 < r2Min) r2Min = r2;
      if (r2 > r2Max) r2Max = r2;
    }
    ev.chunkSpeedBoundMPerS = earthFixedSpeedBoundMPerS(Math.sqrt(v2Max), Math.sqrt(r2Min), Math.sqrt(r2Max), 0.5 * stepS);
    ev.chunkEndTtJ2000S = ts[n - 1];
    for (let i = 0; i < n; i++) {
      const j = 3 * i;
      ev.advance();
      const e = ev.sample;
      e[0] = p[j];
      e[1] = p[j + 1];
      e[2] = p[j + 2];
      e[3] = v[j];
      e[4] = v[j + 1];
      e[5] = v[j + 2];
      const t = ts[i];
      for (let k = 0; k < scans.length; k++) scans[k].feed(t, e);
    }
  }
  for (const scan of scans) scan.finish();
  return { passes: mergeByAos(scans.map((s) => s.passes)), statesEvaluated: ev.statesEvaluated, gridStepS: stepS };
}

const byStationId = (a: Pass, b: Pass): number => (a.stationId < b.stationId ? -1 : a.stationId > b.stationId ? 1 : 0);

/**
 * Passes sorted by AOS, then station id, from per-station lists already in AOS order: a merge of
 * the lists taken in station-id order (a sort of the whole for many stations).
 */
function mergeByAos(lists: Pass[][]): Pass[] {
  const nonEmpty = lists.filter((l) => l.length > 0);
  if (nonEmpty.length > 16) return nonEmpty.flat().sort((a, b) => a.aosTtJ2000S - b.aosTtJ2000S || byStationId(a, b));
  nonEmpty.sort((a, b) => byStationId(a[0], b[0]));
  const heads = nonEmpty.map(() => 0);
  const total = nonEmpty.reduce((n, l) => n + l.length, 0);
  const out: Pass[] = new Array<Pass>(total);
  for (let k = 0; k < total; k++) {
    let best = -1;
    let bestAos = Infinity;
    for (let j = 0; j < nonEmpty.length; j++) {
      const list = nonEmpty[j];
      // Strictly earlier only: on a tie the list with the smaller station id (earlier) wins.
      if (heads[j] < list.length && list[heads[j]].aosTtJ2000S < bestAos) {
        best = j;
        bestAos = list[heads[j]].aosTtJ2000S;
      }
    }
    out[k] = nonEmpty[best][heads[best]++];
  }
  return out;
}

/**
 * Passes of one trajectory over one station in [fromTtJ2000S, toTtJ2000S] (seconds since J2000.0 TT).
 * See the module comment for the method and its guarantees.
 */
export function findPasses(
  traj: Trajectory,
  station: Station,
  gmstRadAt: GmstRadAt,
  fromTtJ2000S: number,
  toTtJ2000S: number,
  opts: PassSearchOptions = {},
): PassSearchResult {
  return findPassesMany(traj, [station], gmstRadAt, fromTtJ2000S, toTtJ2000S, opts);
}
