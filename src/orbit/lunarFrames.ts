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
import { checkElementsDegKm, elementsFromState, elementsInRadM, keplerState, type CentralBodySurface, type KeplerianDegKm, type KeplerianElements } from './keplerian.ts';
import { moonStateGcrfInto } from './lunarEphemeris.ts';
import { IAU_MOON_MEAN_RADIUS_M, icrfToMoonEquatorInto } from './moonBody.ts';

/** Moon-centred elements in the user's degree/km form (Moon mean equator of the epoch). */
export type LunarElementsDegKm = KeplerianDegKm;

/** A Moon-centred state [m, m/s] in LCRS. */
export interface LcrsState {
  positionM: [number, number, number];
  velocityMPerS: [number, number, number];
}

/** The Moon's reference sphere, for the checks of elements about it. */
const MOON_SURFACE: CentralBodySurface = {
  radiusM: IAU_MOON_MEAN_RADIUS_M,
  periapsisWord: 'periselene',
  surface: "the Moon's surface (1737.4 km): the orbit intersects the Moon",
  aHint: "give a in km from the Moon's centre, e.g. 6142 for a 12-hour frozen orbit",
};

/** Refuse impossible lunar elements; `where` names the fields' prefix (a flag or a JSON path). */
export function checkLunarElements(p: LunarElementsDegKm, where: { a: string; e: string }): void {
  checkElementsDegKm(p, where, MOON_SURFACE);
}

/** Lunar elements (Moon mean equator of epoch) → LCRS state at the epoch, two-body about GM [m³/s²]. */
export function lunarElementsToLcrs(p: LunarElementsDegKm, gmM3PerS2: number): LcrsState {
  const el = elementsInRadM(p);
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
