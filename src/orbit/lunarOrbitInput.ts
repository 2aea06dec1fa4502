/**
 * Lunar orbits from user input (Keplerian elements about the Moon, or an LCRS state) for the use
 * cases: the checks, the propagation, and the ±1 km rebuild for the measured sensitivity.
 */
import { checkLunarElements, lunarElementsToLcrs, type LcrsState, type LunarElementsDegKm } from './lunarFrames.ts';
import { LunarOrbitTrajectory, type LunarForces } from './lunarOrbit.ts';
import { MOON_DEGREE_2, MOON_POINT_MASS } from './moonGravity.ts';

/** Named force models of a lunar orbit: `point` (two-body, exact) or `full` (J2, C22, Earth, Sun; the default). */
export type LunarForceModelName = 'point' | 'full';

/** The forces behind a model name. */
export function lunarForces(name: LunarForceModelName): LunarForces {
  return name === 'point' ? { moon: MOON_POINT_MASS, earth: false, sun: false } : { moon: MOON_DEGREE_2, earth: true, sun: true };
}

/** A lunar orbit from elements about the Moon (mean lunar equator of the epoch), with its ±Δa rebuild. */
export function lunarOrbitFromElements(
  id: string,
  elements: LunarElementsDegKm,
  forces: LunarForces,
  span: { fromTtJ2000S: number; toTtJ2000S: number },
  where: { a: string; e: string } = { a: '--a-km', e: '--e' },
): { trajectory: LunarOrbitTrajectory; rebuildWithDeltaAKm: (deltaAKm: number) => LunarOrbitTrajectory } {
  checkLunarElements(elements, where);
  const build = (el: LunarElementsDegKm): LunarOrbitTrajectory => {
    const s = lunarElementsToLcrs(el, forces.moon.gmM3PerS2);
    return new LunarOrbitTrajectory({ id, epochTtJ2000S: el.epochTtJ2000S, positionM: s.positionM, velocityMPerS: s.velocityMPerS, fromTtJ2000S: span.fromTtJ2000S, toTtJ2000S: span.toTtJ2000S, forces });
  };
  return { trajectory: build(elements), rebuildWithDeltaAKm: (d) => build({ ...elements, aKm: elements.aKm + d }) };
}

/** A lunar orbit from an LCRS state (Moon-centred, ICRS axes) [m, m/s] at an epoch. */
export function lunarOrbitFromState(id: string, epochTtJ2000S: number, state: LcrsState, forces: LunarForces, span: { fromTtJ2000S: number; toTtJ2000S: number }): LunarOrbitTrajectory {
  return new LunarOrbitTrajectory({ id, epochTtJ2000S, positionM: state.positionM, velocityMPerS: state.velocityMPerS, fromTtJ2000S: span.fromTtJ2000S, toTtJ2000S: span.toTtJ2000S, forces });
}
