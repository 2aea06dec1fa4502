/**
 * Geocentric positions and velocities of the Moon and the Sun, in GCRF axes, from astronomy-engine
 * (the one dependency used for them; geometric, no light time or aberration).
 *
 * Sources and accuracy:
 * - Moon: `GeoMoonState`, the Improved Lunar Ephemeris of 1954 (E. W. Brown's theory) as coded by
 *   Montenbruck & Pfleger. Of order a few arcseconds in direction and a few km in distance over the
 *   years 1900–2100 (from memory; astronomy-engine states ±1 arcminute for all its bodies as its
 *   goal). Effect on clock rates: a 10 km error in the Earth–Moon distance changes GM_E/r by
 *   27 m²/s², 3e-16 in rate (0.03 ns/day); the matching velocity error (~0.03 m/s) is v_M·δv/c² ≈
 *   3e-16. Both are far below the 0.05 µs/day (5.8e-13) the published checks need, and they are
 *   common to a lunar orbiter and a lunar surface clock, so rates against the lunar surface
 *   reference barely see them.
 * - Sun: minus the Earth's heliocentric `HelioState` (VSOP87 truncated), for the Sun's tidal
 *   potential only (6 m²/s² at the Moon, < 1e-16 in rate).
 * - EQJ (astronomy-engine's J2000 mean equator) is taken as GCRF: they differ by the 23 mas frame
 *   bias, 40 m at the Moon's distance, below every effect here.
 *
 * Time: TT, passed straight to astronomy-engine (`AstroTime.FromTerrestrialTime`), so no ΔT model
 * enters. States are tabulated every {@link NODE_S} s and interpolated by cubic Hermite polynomials
 * (error about 0.1 m in the Moon's position, below 1e-7 m/s in velocity).
 *
 * Validity: tauplan accepts instants in 1900–2100 TT ({@link LUNAR_EPHEMERIS_VALID_FROM_TT_J2000_S});
 * the series degrade outside it. Requests outside are a SpanError.
 */
import { lazyPackage } from '../lazyPackage.ts';
import { IAU2012_AU_M } from '../constants.ts';
import { SpanError } from '../errors.ts';

const astronomy = lazyPackage<typeof import('astronomy-engine')>('astronomy-engine');

/** Earliest instant served: 1900-01-01T12:00 TT, seconds since J2000.0 TT (tauplan's choice). */
export const LUNAR_EPHEMERIS_VALID_FROM_TT_J2000_S = -36_525 * 86_400;
/** Latest instant served: 2100-01-01T12:00 TT, seconds since J2000.0 TT (tauplan's choice). */
export const LUNAR_EPHEMERIS_VALID_TO_TT_J2000_S = 36_525 * 86_400;

/** Node spacing of the tables [s]. */
const NODE_S = 1200;
/** Most nodes cached (about 1 year); past it the cache starts afresh. */
const MAX_NODES = 30_000;
const AU_PER_DAY_M_PER_S = IAU2012_AU_M / 86_400;

/** Geocentric Moon and Sun states at one node: 12 numbers (Moon r, v; Sun r, v) [m, m/s], GCRF. */
const cache = new Map<number, Float64Array>();

function nodeAt(k: number): Float64Array {
  let n = cache.get(k);
  if (n === undefined) {
    if (cache.size >= MAX_NODES) cache.clear();
    const { AstroTime, Body, GeoMoonState, HelioState } = astronomy();
    const time = AstroTime.FromTerrestrialTime((k * NODE_S) / 86_400);
    const m = GeoMoonState(time);
    const e = HelioState(Body.Earth, time);
    const au = IAU2012_AU_M;
    const v = AU_PER_DAY_M_PER_S;
    n = Float64Array.of(m.x * au, m.y * au, m.z * au, m.vx * v, m.vy * v, m.vz * v, -e.x * au, -e.y * au, -e.z * au, -e.vx * v, -e.vy * v, -e.vz * v);
    cache.set(k, n);
  }
  return n;
}

/** A TT instant as a calendar date and time (seconds since J2000.0 TT → `YYYY-MM-DDThh:mm:ss TT`), for messages. */
function ttText(ttJ2000S: number): string {
  const ms = Date.UTC(2000, 0, 1, 12) + ttJ2000S * 1000;
  return Number.isFinite(ms) && Math.abs(ms) < 8.64e15 ? `${new Date(ms).toISOString().slice(0, 19)} TT` : `${ttJ2000S} s from J2000.0 TT`;
}

/** Refuse an instant outside the served span. */
export function checkLunarEphemerisSpan(ttJ2000S: number, where: string, format: (t: number) => string = ttText): void {
  if (!(ttJ2000S >= LUNAR_EPHEMERIS_VALID_FROM_TT_J2000_S && ttJ2000S <= LUNAR_EPHEMERIS_VALID_TO_TT_J2000_S)) {
    throw new SpanError(
      `time ${format(ttJ2000S)} is outside the Moon ephemeris' span 1900-01-01 to 2100-01-01 (TT)`,
      where,
      format(LUNAR_EPHEMERIS_VALID_FROM_TT_J2000_S),
      format(LUNAR_EPHEMERIS_VALID_TO_TT_J2000_S),
      'choose a window between 1900 and 2100',
    );
  }
}

/**
 * Cubic Hermite interpolation of body `b` (0 Moon, 1 Sun) into out[o..o+5] (r [m], v [m/s], GCRF).
 * No span check here (hot path): callers check their window once with {@link checkLunarEphemerisSpan}.
 */
export function bodyStateGcrfInto(b: 0 | 1, ttJ2000S: number, out: Float64Array, o = 0): Float64Array {
  const x = ttJ2000S / NODE_S;
  const k = Math.floor(x);
  const s = x - k;
  const n0 = nodeAt(k);
  const n1 = nodeAt(k + 1);
  const base = 6 * b;
  const h = NODE_S;
  const s2 = s * s;
  const s3 = s2 * s;
  const h00 = 2 * s3 - 3 * s2 + 1;
  const h10 = s3 - 2 * s2 + s;
  const h01 = -2 * s3 + 3 * s2;
  const h11 = s3 - s2;
  const d00 = (6 * s2 - 6 * s) / h;
  const d10 = 3 * s2 - 4 * s + 1;
  const d01 = (-6 * s2 + 6 * s) / h;
  const d11 = 3 * s2 - 2 * s;
  for (let c = 0; c < 3; c++) {
    const p0 = n0[base + c];
    const v0 = n0[base + 3 + c];
    const p1 = n1[base + c];
    const v1 = n1[base + 3 + c];
    out[o + c] = h00 * p0 + h * h10 * v0 + h01 * p1 + h * h11 * v1;
    out[o + 3 + c] = d00 * p0 + d10 * v0 + d01 * p1 + d11 * v1;
  }
  return out;
}

/** The Moon's geocentric state [m, m/s], GCRF axes. */
export function moonStateGcrfInto(ttJ2000S: number, out: Float64Array, o = 0): Float64Array {
  return bodyStateGcrfInto(0, ttJ2000S, out, o);
}

/** The Sun's geocentric state [m, m/s], GCRF axes. */
export function sunStateGcrfInto(ttJ2000S: number, out: Float64Array, o = 0): Float64Array {
  return bodyStateGcrfInto(1, ttJ2000S, out, o);
}

/** The Moon's geocentric state straight from the series (no table), for checks of the interpolation. */
export function moonStateGcrfDirect(ttJ2000S: number): Float64Array {
  const { AstroTime, GeoMoonState } = astronomy();
  const time = AstroTime.FromTerrestrialTime(ttJ2000S / 86_400);
  const m = GeoMoonState(time);
  const au = IAU2012_AU_M;
  const v = AU_PER_DAY_M_PER_S;
  return Float64Array.of(m.x * au, m.y * au, m.z * au, m.vx * v, m.vy * v, m.vz * v);
}
