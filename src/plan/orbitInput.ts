/**
 * Orbits given directly rather than through a scenario: osculating Keplerian elements, or a parsed
 * element set (TLE / OMM) for SGP4. The edge parses text and files; this builds the trajectory.
 */
import { WGS84_A_M } from '../constants.ts';
import { InputError } from '../errors.ts';
import type { ElementSetRecord } from '../model/elementSet.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import { elementsFromDegKm } from '../orbit/keplerian.ts';
import { Sgp4Trajectory } from '../orbit/sgp4.ts';
import type { ResolvedOrbit, Span } from '../orbit/source.ts';
import { trajectoryFromKeplerian } from '../orbit/stateVector.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

/** Osculating Keplerian elements (the `size` flags). Give exactly one of `aKm` and `altitudeKm`. */
export interface KeplerianInput {
  /** Semi-major axis from the Earth's centre [km]. */
  aKm?: number;
  /** Altitude above the WGS-84 equatorial radius 6378.137 km [km]; a = 6378.137 km + altitudeKm. */
  altitudeKm?: number;
  /** Eccentricity [1], 0 ≤ e < 1. Default 0. */
  e?: number;
  /** Inclination [deg]. Default 0. */
  iDeg?: number;
  /** Right ascension of the ascending node [deg]. Default 0. */
  raanDeg?: number;
  /** Argument of perigee [deg]. Default 0. */
  argpDeg?: number;
  /** Mean anomaly at the epoch [deg]. Default 0. */
  mDeg?: number;
}

/** Span wanted by the caller, given the orbit's epoch (s since J2000.0 TT; null when the source has none). */
export type SpanFor = (epochTtJ2000S: number | null) => Span;

/** SGP4 span: the wanted span, widened to hold the element-set epoch, so sizing from the epoch works. */
export function sgp4Span(epochTt: number, span: Span): Span {
  return { fromTtJ2000S: Math.min(span.fromTtJ2000S, epochTt), toTtJ2000S: Math.max(span.toTtJ2000S, epochTt) };
}

/** Display label of an element set. */
export function labelOf(r: ElementSetRecord): string {
  if (r.kind === 'tle') return r.name ?? r.catalogNumber.trim();
  return r.objectName ?? r.objectId ?? String(r.noradCatId ?? '?');
}

/** Stable id of an element set (catalogue number when there is one). */
export function idOf(r: ElementSetRecord): string {
  if (r.kind === 'tle') return String(r.catalogNumberValue);
  return r.noradCatId !== null && r.noradCatId !== undefined ? String(r.noradCatId) : (r.objectId ?? r.objectName ?? 'omm');
}

/** SGP4 orbit of a parsed element set, its span covering what `spanFor` asks. */
export function orbitFromElementSet(rec: ElementSetRecord, ts: TimeSystem, spanFor: SpanFor): ResolvedOrbit {
  const trajectory = new Sgp4Trajectory(rec, ts, { id: idOf(rec), spanFor: (epoch) => sgp4Span(epoch, spanFor(epoch)) });
  return { trajectory, name: labelOf(rec) };
}

/** Exactly one of `aKm` and `altitudeKm` must be given. */
export function checkKeplerianInput(k: KeplerianInput): void {
  if (k.aKm !== undefined && k.altitudeKm !== undefined) {
    throw new InputError('both --a-km and --altitude-km given', '--a-km/--altitude-km', 'give one of them');
  }
  if (k.aKm === undefined && k.altitudeKm === undefined) {
    throw new InputError('no orbit given', 'command line', 'give --a-km or --altitude-km (with --e, --i-deg ...), or --tle, --omm or --scenario with --sat');
  }
}

/**
 * Two-body or Cowell orbit (by `gravity`) of osculating elements at `epochTtJ2000S`, covering the
 * span and the epoch. Faults name the `size` flags (`--a-km`, `--e`, ...).
 */
export function orbitFromKeplerian(k: KeplerianInput, epochTtJ2000S: number, gravity: GravityModel, spanFor: SpanFor): ResolvedOrbit {
  checkKeplerianInput(k);
  const aKm = k.aKm ?? WGS84_A_M / 1000 + (k.altitudeKm as number);
  const span = spanFor(epochTtJ2000S);
  const full = { fromTtJ2000S: Math.min(span.fromTtJ2000S, epochTtJ2000S), toTtJ2000S: Math.max(span.toTtJ2000S, epochTtJ2000S) };
  const build = (deltaAKm: number): Trajectory => {
    const el = elementsFromDegKm(
      { epochTtJ2000S, aKm: aKm + deltaAKm, e: k.e ?? 0, iDeg: k.iDeg ?? 0, raanDeg: k.raanDeg ?? 0, argpDeg: k.argpDeg ?? 0, meanAnomalyDeg: k.mDeg ?? 0 },
      { a: k.aKm !== undefined ? '--a-km' : '--altitude-km', e: '--e' },
    );
    return trajectoryFromKeplerian(el, gravity, full, 'keplerian');
  };
  return { trajectory: build(0), name: 'Keplerian orbit from flags', rebuildWithDeltaAKm: build };
}
