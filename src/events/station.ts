/**
 * Ground stations and WGS-84 geodetic ↔ earth-fixed conversion.
 *
 * Frame: ECEF here is tauplan's pseudo earth-fixed frame (GMST rotation of TEME; polar motion
 * neglected, < 15 m at the surface). Heights are above the WGS-84 ellipsoid, not the geoid.
 */
import { WGS84_A_M, WGS84_INV_F } from '../constants.ts';
import { InputError, InternalError } from '../errors.ts';
import { vec3, type Vec3 } from '../orbit/vec.ts';
import type { Station } from '../model/station.ts';

export type { Station };

const DEG = Math.PI / 180;
/** WGS-84 flattening and first eccentricity squared [1]. Derived from WGS84_INV_F. */
const WGS84_F = 1 / WGS84_INV_F;
const WGS84_E2 = WGS84_F * (2 - WGS84_F);


/**
 * Refuse a station whose numbers cannot describe a site. `where` is the JSON path used in messages,
 * e.g. `stations[1]`.
 */
export function checkStation(station: Station, where = `station ${station.id}`): void {
  const bad = (field: string, value: unknown, fix: string): never => {
    throw new InputError(`${field} ${String(value)} is not valid`, `${where}.${field}`, fix);
  };
  if (!Number.isFinite(station.latDeg) || Math.abs(station.latDeg) > 90) bad('latDeg', station.latDeg, 'give a geodetic latitude in degrees, −90 to 90');
  if (!Number.isFinite(station.lonDeg)) bad('lonDeg', station.lonDeg, 'give a longitude in degrees, east positive');
  if (!Number.isFinite(station.heightM) || station.heightM < -12_000 || station.heightM > 100_000) {
    bad('heightM', station.heightM, 'give the height above the WGS-84 ellipsoid in metres (−12 km to 100 km)');
  }
  if (!Number.isFinite(station.maskDeg) || station.maskDeg < -90 || station.maskDeg >= 90) bad('maskDeg', station.maskDeg, 'give an elevation mask in degrees, e.g. 10');
  if (!Number.isFinite(station.minPassS) || station.minPassS < 0) bad('minPassS', station.minPassS, 'give the shortest useful pass in seconds, ≥ 0, e.g. 300');
}

/**
 * Earth-fixed position [m] of a WGS-84 geodetic point.
 * @param latDeg geodetic latitude [deg]
 * @param lonDeg longitude [deg], east positive
 * @param heightM height above the ellipsoid [m]
 */
export function geodeticToEcefM(latDeg: number, lonDeg: number, heightM: number): Vec3<'ECEF'> {
  const phi = latDeg * DEG;
  const lam = lonDeg * DEG;
  const sinPhi = Math.sin(phi);
  const cosPhi = Math.cos(phi);
  // Radius of curvature in the prime vertical.
  const nM = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sinPhi * sinPhi);
  return vec3<'ECEF'>((nM + heightM) * cosPhi * Math.cos(lam), (nM + heightM) * cosPhi * Math.sin(lam), (nM * (1 - WGS84_E2) + heightM) * sinPhi);
}

/** Geodetic coordinates of an earth-fixed point: latitude and longitude [deg], height above the WGS-84 ellipsoid [m]. */
export interface Geodetic {
  latDeg: number;
  lonDeg: number;
  heightM: number;
}

/**
 * Inverse of {@link geodeticToEcefM}: fixed-point iteration on latitude, capped at 50 steps
 * (converges to < 1e-12 rad in a handful for points from the Earth's centre region outward to GEO;
 * not meant for points within ~50 km of the centre).
 */
export function ecefToGeodetic(r: Vec3<'ECEF'>): Geodetic {
  const [x, y, z] = r;
  const p = Math.hypot(x, y);
  const lonDeg = Math.atan2(y, x) / DEG;
  if (p < 1e-9) {
    // On the polar axis: latitude ±90°, height from the polar radius.
    const b = WGS84_A_M * (1 - WGS84_F);
    return { latDeg: z >= 0 ? 90 : -90, lonDeg, heightM: Math.abs(z) - b };
  }
  let phi = Math.atan2(z, p * (1 - WGS84_E2));
  for (let k = 0; k < 50; k++) {
    const s = Math.sin(phi);
    const nM = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * s * s);
    const next = Math.atan2(z + WGS84_E2 * nM * s, p);
    if (Math.abs(next - phi) < 1e-14) {
      phi = next;
      const sn = Math.sin(phi);
      const nn = WGS84_A_M / Math.sqrt(1 - WGS84_E2 * sn * sn);
      // Height: the better-conditioned of the two forms for this latitude.
      const heightM = Math.abs(phi) < Math.PI / 4 ? p / Math.cos(phi) - nn : z / sn - nn * (1 - WGS84_E2);
      return { latDeg: phi / DEG, lonDeg, heightM };
    }
    phi = next;
  }
  throw new InternalError(`geodetic latitude did not converge in 50 iterations for (${x}, ${y}, ${z}) m`, 'latDeg');
}

/** Earth-fixed position [m] of a station's antenna reference point (WGS-84, height above the ellipsoid). */
export function stationEcefM(station: Station): Vec3<'ECEF'> {
  return geodeticToEcefM(station.latDeg, station.lonDeg, station.heightM);
}
