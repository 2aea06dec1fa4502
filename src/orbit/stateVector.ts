/**
 * Trajectories from a user's state vector (scenario `orbit.state`) or from osculating Keplerian
 * elements, built on {@link NumericalTrajectory} (or the exact two-body path for point gravity).
 *
 * Frames: every state is integrated in GCRF (a TEME state is rotated to GCRF at its epoch) with the
 * zonal field about the true pole of each instant; states are served in TEME of date (numerical.ts).
 * Times are TT seconds since J2000.0; the UTC Julian date of the epoch is passed in by the caller
 * (the core reads no time tables).
 */
import { WGS84_A_M, WGS84_INV_F } from '../constants.ts';
import { InputError } from '../errors.ts';
import type { GravityModel } from './gravity.ts';
import { KeplerianTrajectory, keplerState, type KeplerianElements } from './keplerian.ts';
import { NumericalTrajectory } from './numerical.ts';
import type { Trajectory } from './trajectory.ts';

/** WGS-84 polar radius [m], a(1 − f) = 6356.752 km: no point of the surface is closer to the centre. */
const WGS84_POLAR_RADIUS_M = WGS84_A_M * (1 - 1 / WGS84_INV_F);

/** Input of {@link trajectoryFromStateVector}. */
export interface StateVectorInput {
  /** Satellite id, used in messages. */
  id: string;
  /** Epoch of the state, TT seconds since J2000.0. */
  epochTtJ2000S: number;
  /** `GCRF` (rotated to TOD of the epoch) or `TEME` (used as is). */
  frame: 'GCRF' | 'TEME';
  /** Geocentric position [km]. */
  positionKm: readonly number[];
  /** Inertial velocity [km/s], same frame. */
  velocityKmPerS: readonly number[];
  gravity: GravityModel;
  /** Span wanted, TT seconds since J2000.0 (may start before the epoch). */
  fromTtJ2000S: number;
  toTtJ2000S: number;
  /** UTC Julian date of the epoch (no longer used: the frame chain runs on TT; kept for callers). */
  jdUtcAtEpoch: number;
  /** Path of the state in the user's input for messages, e.g. `satellites[2].orbit.state`; default `state of <id>`. */
  where?: string;
  /** Integrator relative tolerance; default 1e-12. */
  relTol?: number;
}

/**
 * Two-body perigee radius [m] of a state (r [m], v [m/s]); null when the orbit is not bound
 * (energy ≥ 0). Used to tell a sub-orbital flight from an orbit.
 */
export function twoBodyPerigeeRadiusM(r: readonly number[], v: readonly number[], gmM3PerS2: number): number | null {
  const rn = Math.hypot(r[0], r[1], r[2]);
  const v2 = v[0] * v[0] + v[1] * v[1] + v[2] * v[2];
  const energy = v2 / 2 - gmM3PerS2 / rn;
  if (!(energy < 0)) return null;
  const aM = -gmM3PerS2 / (2 * energy);
  const h2 = (r[1] * v[2] - r[2] * v[1]) ** 2 + (r[2] * v[0] - r[0] * v[2]) ** 2 + (r[0] * v[1] - r[1] * v[0]) ** 2;
  const e = Math.sqrt(Math.max(0, 1 - h2 / (gmM3PerS2 * aM)));
  return aM * (1 - e);
}

/**
 * A numerical trajectory from a state vector [km, km/s], integrated in GCRF, served in TEME of date.
 *
 * - GCRF: integrated as given.
 * - TEME (of the epoch): rotated to GCRF at the epoch (IAU 2006/2000A with the equation of the
 *   equinoxes). The velocity is the inertial one expressed in TEME axes, as SGP4 gives it.
 * - A position inside the polar radius 6356.752 km is refused (InputError on `<where>.positionKm`).
 * - Sub-orbital states (bound, two-body perigee below the 6378.137 km equatorial radius) are
 *   followed as a ballistic flight from the epoch until they come back down to their starting
 *   radius, whatever the span: `validFrom` is the epoch, `validTo` = `flightEndTtJ2000S`. Such a
 *   state must be moving upwards at its epoch (the launch), otherwise InputError.
 * - An orbit that reaches the surface inside the span throws {@link SurfaceImpactError}.
 */
export function trajectoryFromStateVector(p: StateVectorInput): NumericalTrajectory {
  const where = p.where ?? `state of ${p.id}`;
  if (p.frame !== 'GCRF' && p.frame !== 'TEME') {
    throw new InputError(`unknown state frame ${JSON.stringify(p.frame)}`, `${where}.frame`, 'use GCRF or TEME');
  }
  for (const [name, vec] of [
    ['positionKm', p.positionKm],
    ['velocityKmPerS', p.velocityKmPerS],
  ] as const) {
    if (!Array.isArray(vec) || vec.length !== 3 || !vec.every((x) => typeof x === 'number' && Number.isFinite(x))) {
      throw new InputError(`${name} is not three finite numbers`, `${where}.${name}`, `give ${name}: [x, y, z]`);
    }
  }
  const rKm = Math.hypot(p.positionKm[0], p.positionKm[1], p.positionKm[2]);
  if (rKm * 1000 < WGS84_POLAR_RADIUS_M) {
    throw new InputError(
      `position is ${rKm.toFixed(3)} km from the Earth's centre, inside the Earth (polar radius ${(WGS84_POLAR_RADIUS_M / 1000).toFixed(3)} km)`,
      `${where}.positionKm`,
      'give the geocentric position in km (not metres, not altitude)',
    );
  }
  // GCRF states are integrated as given; TEME states are taken to GCRF at their epoch by the
  // integrator (axes 'gcrf'). Either way the states come out in TEME of date.
  const r = [p.positionKm[0] * 1000, p.positionKm[1] * 1000, p.positionKm[2] * 1000];
  const v = [p.velocityKmPerS[0] * 1000, p.velocityKmPerS[1] * 1000, p.velocityKmPerS[2] * 1000];
  const gm = p.gravity.gmM3PerS2;
  const perigeeM = twoBodyPerigeeRadiusM(r, v, gm);
  const subOrbital = perigeeM !== null && perigeeM < WGS84_A_M;
  const source = `numerical integration (Cowell, ${p.gravity.name} gravity) from a ${p.frame} state vector`;
  if (subOrbital) {
    const rDotV = r[0] * v[0] + r[1] * v[1] + r[2] * v[2];
    if (!(rDotV > 0)) {
      throw new InputError(
        'state is sub-orbital (falls back to the Earth) and is not moving upwards at its epoch',
        `${where}.velocityKmPerS`,
        'give the launch state of a ballistic flight (radial velocity > 0), or an orbit whose perigee is above the surface',
      );
    }
  }
  // A sub-orbital state is followed from its epoch until it comes back to its starting radius.
  return new NumericalTrajectory({
    id: p.id,
    frame: p.frame,
    axes: 'gcrf',
    epochTtJ2000S: p.epochTtJ2000S,
    positionM: r,
    velocityMPerS: v,
    gravity: p.gravity,
    fromTtJ2000S: subOrbital ? p.epochTtJ2000S : p.fromTtJ2000S,
    toTtJ2000S: subOrbital ? p.epochTtJ2000S : p.toTtJ2000S,
    ...(subOrbital ? { stopAtRadiusM: Math.hypot(r[0], r[1], r[2]) } : {}),
    relTol: p.relTol,
    sourceLabel: subOrbital ? `${source}, ballistic flight until it returns to its starting radius` : source,
  });
}

/**
 * A trajectory from osculating Keplerian elements (true-of-date axes of the epoch).
 * Point gravity: the exact two-body {@link KeplerianTrajectory}. Otherwise a {@link NumericalTrajectory}
 * started from the two-body state at the epoch: the elements are osculating by contract, so the
 * mean motion under J2 differs from √(GM/a³) (a few km in mean a at GNSS radius; physics.md §3).
 */
export function trajectoryFromKeplerian(
  elements: KeplerianElements,
  gravity: GravityModel,
  span: { fromTtJ2000S: number; toTtJ2000S: number },
  id: string,
): Trajectory {
  if (gravity.name === 'point' || gravity.j.length <= 2) {
    return new KeplerianTrajectory(id, elements, gravity.gmM3PerS2, span.fromTtJ2000S, span.toTtJ2000S);
  }
  const { r, v } = keplerState(elements, gravity.gmM3PerS2, 0);
  return new NumericalTrajectory({
    id,
    frame: 'TOD',
    axes: 'gcrf',
    epochTtJ2000S: elements.epochTtJ2000S,
    positionM: r,
    velocityMPerS: v,
    gravity,
    fromTtJ2000S: span.fromTtJ2000S,
    toTtJ2000S: span.toTtJ2000S,
    sourceLabel: `numerical integration (Cowell, ${gravity.name} gravity) from osculating Keplerian elements`,
  });
}
