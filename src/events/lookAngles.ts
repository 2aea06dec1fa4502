/**
 * Topocentric look angles of a satellite from a ground station, in earth-fixed coordinates.
 *
 * Azimuth is measured from geodetic north through east, elevation from the plane normal to the
 * WGS-84 ellipsoid normal (geodetic horizon). Both are geometric: no atmospheric refraction, no
 * light-time (the satellite position is taken at the same instant as the station's).
 */
import { vec3, type Vec3 } from '../orbit/vec.ts';
import { geodeticToEcefM, type Station } from './station.ts';

const DEG = Math.PI / 180;

/** A station's earth-fixed position [m] and local east/north/up unit vectors (ECEF axes), computed once. */
export interface StationFrame {
  /** Earth-fixed position [m]. */
  readonly positionM: Vec3<'ECEF'>;
  /** Unit vector to local east. */
  readonly eastUnit: Vec3<'ECEF'>;
  /** Unit vector to local (geodetic) north. */
  readonly northUnit: Vec3<'ECEF'>;
  /** Unit vector along the ellipsoid normal (geodetic up). */
  readonly upUnit: Vec3<'ECEF'>;
}

/** Precompute the local frame of a WGS-84 geodetic site. */
export function stationFrameFromGeodetic(latDeg: number, lonDeg: number, heightM: number): StationFrame {
  const phi = latDeg * DEG;
  const lam = lonDeg * DEG;
  const sp = Math.sin(phi);
  const cp = Math.cos(phi);
  const sl = Math.sin(lam);
  const cl = Math.cos(lam);
  return {
    positionM: geodeticToEcefM(latDeg, lonDeg, heightM),
    eastUnit: vec3<'ECEF'>(-sl, cl, 0),
    northUnit: vec3<'ECEF'>(-sp * cl, -sp * sl, cp),
    upUnit: vec3<'ECEF'>(cp * cl, cp * sl, sp),
  };
}

/** Precompute the local frame of a {@link Station}. */
export function stationFrame(station: Station): StationFrame {
  return stationFrameFromGeodetic(station.latDeg, station.lonDeg, station.heightM);
}

/** Look angles of a satellite from a station at one instant. */
export interface LookAngles {
  /** Azimuth [deg], 0 ≤ az < 360, from geodetic north through east. */
  azimuthDeg: number;
  /** Elevation [deg] above the geodetic horizon, −90..90. */
  elevationDeg: number;
  /** Station-to-satellite distance [m]. */
  rangeM: number;
  /** Time derivative of the range [m/s]: positive when the satellite recedes. NaN without a velocity. */
  rangeRateMPerS: number;
}

/**
 * Look angles from an earth-fixed satellite position [m] and, optionally, earth-fixed velocity [m/s]
 * (the velocity relative to the rotating Earth, as `temeToEcef` returns it).
 */
export function lookAngles(frame: StationFrame, satPositionM: Vec3<'ECEF'>, satVelocityMPerS?: Vec3<'ECEF'>): LookAngles {
  const dx = satPositionM[0] - frame.positionM[0];
  const dy = satPositionM[1] - frame.positionM[1];
  const dz = satPositionM[2] - frame.positionM[2];
  const rangeM = Math.hypot(dx, dy, dz);
  const e = dx * frame.eastUnit[0] + dy * frame.eastUnit[1] + dz * frame.eastUnit[2];
  const n = dx * frame.northUnit[0] + dy * frame.northUnit[1] + dz * frame.northUnit[2];
  const u = dx * frame.upUnit[0] + dy * frame.upUnit[1] + dz * frame.upUnit[2];
  let az = Math.atan2(e, n) / DEG;
  if (az < 0) az += 360;
  if (az >= 360) az -= 360;
  // atan2 of up against the horizontal distance keeps full precision near the zenith.
  const elevationDeg = Math.atan2(u, Math.hypot(e, n)) / DEG;
  const rangeRateMPerS = satVelocityMPerS ? (dx * satVelocityMPerS[0] + dy * satVelocityMPerS[1] + dz * satVelocityMPerS[2]) / rangeM : Number.NaN;
  return { azimuthDeg: az, elevationDeg, rangeM, rangeRateMPerS };
}

/**
 * Elevation [rad] of an earth-fixed point (x, y, z) [m] from a station: no allocation, for searches.
 */
export function elevationRad(frame: StationFrame, xM: number, yM: number, zM: number): number {
  const dx = xM - frame.positionM[0];
  const dy = yM - frame.positionM[1];
  const dz = zM - frame.positionM[2];
  const up = frame.upUnit;
  const u = dx * up[0] + dy * up[1] + dz * up[2];
  const h2 = Math.max(0, dx * dx + dy * dy + dz * dz - u * u);
  return Math.atan2(u, Math.sqrt(h2));
}

/**
 * Sine of the elevation of an earth-fixed point (x, y, z) [m] from a station: no allocation and no
 * inverse trigonometry, for searches (sin is increasing on [−90°, 90°], so comparisons against a
 * mask and the roots of sin(el) − sin(mask) are those of the elevation itself).
 */
export function sinElevation(frame: StationFrame, xM: number, yM: number, zM: number): number {
  const dx = xM - frame.positionM[0];
  const dy = yM - frame.positionM[1];
  const dz = zM - frame.positionM[2];
  const up = frame.upUnit;
  return (dx * up[0] + dy * up[1] + dz * up[2]) / Math.sqrt(dx * dx + dy * dy + dz * dz);
}

/**
 * A quantity with the sign of the elevation rate, from earth-fixed position [m] and velocity [m/s]:
 * (û·v)|ρ|² − (û·ρ)(ρ·v), which is |ρ|³ cos(el) · d(el)/dt. Smooth through the zenith (unlike
 * d(el)/dt itself), so a root finder can locate culmination on it. Units m⁴/s.
 */
export function elevationRateSignM4PerS(frame: StationFrame, xM: number, yM: number, zM: number, vxMPerS: number, vyMPerS: number, vzMPerS: number): number {
  const dx = xM - frame.positionM[0];
  const dy = yM - frame.positionM[1];
  const dz = zM - frame.positionM[2];
  const up = frame.upUnit;
  const uRho = dx * up[0] + dy * up[1] + dz * up[2];
  const uV = vxMPerS * up[0] + vyMPerS * up[1] + vzMPerS * up[2];
  const rho2 = dx * dx + dy * dy + dz * dz;
  const rhoV = dx * vxMPerS + dy * vyMPerS + dz * vzMPerS;
  return uV * rho2 - uRho * rhoV;
}
