/**
 * Moon-centred frames and elements.
 *
 * - LCRS: the Moon-centred frame with ICRS axes (as GCRS is the Earth-centred one). A state in LCRS
 *   becomes geocentric GCRF by adding the Moon's geocentric state (translation only: the axes are
 *   the same; relativistic scale and Lorentz contraction, parts in 1e-11 over a lunar orbit's size,
 *   are left out).
 * - Lunar Keplerian elements are referred to the Moon's mean equator of the epoch (IAU pole,
 *   ./moonBody.ts icrfToMoonEquatorInto): a frozen orbit's inclination and argument of periselene are
 *   angles to the lunar equator. The node is measured from the ascending node of the lunar equator on
 *   the ICRF equator.
 */
import { InputError } from '../errors.ts';
import { elementsFromState, keplerState, type KeplerianElements } from './keplerian.ts';
import { moonStateGcrfInto } from './lunarEphemeris.ts';
import { IAU_MOON_MEAN_RADIUS_M, icrfToMoonEquatorInto } from './moonBody.ts';

const DEG = Math.PI / 180;

/** Moon-centred elements in the user's degree/km form. */
export interface LunarElementsDegKm {
  epochTtJ2000S: number;
  aKm: number;
  e: number;
  iDeg: number;
  raanDeg: number;
  argpDeg: number;
  meanAnomalyDeg: number;
}

/** A Moon-centred state [m, m/s] in LCRS. */
export interface LcrsState {
  positionM: [number, number, number];
  velocityMPerS: [number, number, number];
}

/** Refuse impossible lunar elements; `where` names the fields' prefix (a flag or a JSON path). */
export function checkLunarElements(p: LunarElementsDegKm, where: { a: string; e: string }): void {
  if (!Number.isFinite(p.e) || p.e < 0 || p.e >= 1) throw new InputError(`eccentricity ${p.e} is not in [0, 1)`, where.e, 'give 0 ≤ e < 1 (closed orbits only)');
  if (!Number.isFinite(p.aKm) || p.aKm <= 0) throw new InputError(`semi-major axis ${p.aKm} km is not positive`, where.a, 'give a in km from the Moon\'s centre, e.g. 6142 for a 12-hour frozen orbit');
  const periKm = p.aKm * (1 - p.e);
  if (periKm * 1000 < IAU_MOON_MEAN_RADIUS_M) {
    throw new InputError(`periselene radius ${periKm.toFixed(3)} km is below the Moon's surface (1737.4 km): the orbit intersects the Moon`, where.a, 'raise a or lower e so that a·(1 − e) > 1737.4 km');
  }
}

/** Lunar elements (Moon mean equator of epoch) → LCRS state at the epoch, two-body about GM [m³/s²]. */
export function lunarElementsToLcrs(p: LunarElementsDegKm, gmM3PerS2: number): LcrsState {
  const el: KeplerianElements = {
    epochTtJ2000S: p.epochTtJ2000S,
    aM: p.aKm * 1000,
    e: p.e,
    iRad: p.iDeg * DEG,
    raanRad: p.raanDeg * DEG,
    argpRad: p.argpDeg * DEG,
    meanAnomalyRad: p.meanAnomalyDeg * DEG,
  };
  const { r, v } = keplerState(el, gmM3PerS2, 0);
  const m = icrfToMoonEquatorInto(p.epochTtJ2000S, new Float64Array(9));
  // r_ICRF = Mᵀ·r_equator
  const back = (a: readonly number[]): [number, number, number] => [m[0] * a[0] + m[3] * a[1] + m[6] * a[2], m[1] * a[0] + m[4] * a[1] + m[7] * a[2], m[2] * a[0] + m[5] * a[1] + m[8] * a[2]];
  return { positionM: back(r), velocityMPerS: back(v) };
}

/** LCRS state → lunar elements (Moon mean equator of `ttJ2000S`), two-body about GM. */
export function lcrsToLunarElements(s: LcrsState, gmM3PerS2: number, ttJ2000S: number): KeplerianElements {
  const m = icrfToMoonEquatorInto(ttJ2000S, new Float64Array(9));
  const fwd = (a: readonly number[]): number[] => [m[0] * a[0] + m[1] * a[1] + m[2] * a[2], m[3] * a[0] + m[4] * a[1] + m[5] * a[2], m[6] * a[0] + m[7] * a[1] + m[8] * a[2]];
  return elementsFromState(fwd(s.positionM), fwd(s.velocityMPerS), gmM3PerS2, ttJ2000S);
}

/** LCRS state → geocentric GCRF state [m, m/s] at an instant. */
export function lcrsToGcrf(ttJ2000S: number, s: LcrsState): LcrsState {
  const m = moonStateGcrfInto(ttJ2000S, new Float64Array(6), 0);
  return {
    positionM: [s.positionM[0] + m[0], s.positionM[1] + m[1], s.positionM[2] + m[2]],
    velocityMPerS: [s.velocityMPerS[0] + m[3], s.velocityMPerS[1] + m[4], s.velocityMPerS[2] + m[5]],
  };
}

/** Geocentric GCRF state → LCRS at an instant. */
export function gcrfToLcrs(ttJ2000S: number, s: LcrsState): LcrsState {
  const m = moonStateGcrfInto(ttJ2000S, new Float64Array(6), 0);
  return {
    positionM: [s.positionM[0] - m[0], s.positionM[1] - m[1], s.positionM[2] - m[2]],
    velocityMPerS: [s.velocityMPerS[0] - m[3], s.velocityMPerS[1] - m[4], s.velocityMPerS[2] - m[5]],
  };
}
