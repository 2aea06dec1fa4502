/** Writers for `tauplan sweep --body moon`: JSON, CSV and a text table. They compute nothing physical. */
import type { LunarSweepResult } from '../plan/lunarSweep.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { fixed, sci, textTable } from './format.ts';

const NOTE = 'Altitude of the semi-major axis above the 1737.4 km lunar reference sphere; elements osculating about the Moon; each row integrated over two periods (at most one day) against the lunar surface reference over the same span; the rate against TT adds the reference\'s rate over one anomalistic month.';

export function lunarSweepToJson(r: LunarSweepResult, meta: { e: number; iDeg: number; forces: string; gravity: string }) {
  return {
    body: 'moon' as const,
    gravity: meta.gravity,
    lunarForces: meta.forces,
    e: meta.e,
    iDeg: meta.iDeg,
    rows: r.rows.map((x) => ({ altitudeKm: x.altitudeKm, meanFractionalOffset: x.meanFractionalOffset, meanFractionalOffsetVsLunarSurface: x.meanFractionalOffsetVsLunarSurface, gravitational: x.gravitational, velocity: x.velocity })),
    // Against TT no lunar orbit matches a geoid clock (all run about 55–58 µs/day fast).
    breakEvenAltitudeKm: null,
    surfaceMatchAltitudeKm: r.surfaceMatchAltitudeKm,
    lunarSurfaceReferenceFractionalOffset: r.referenceFractionalOffset,
    note: NOTE,
  };
}

export type LunarSweepJson = ReturnType<typeof lunarSweepToJson>;

export function lunarSweepToCsv(r: LunarSweepResult): string {
  return toCsv(['altitudeKm', 'meanFractionalOffset', 'meanFractionalOffsetVsLunarSurface', 'gravitational', 'velocity'], r.rows.map((x) => [x.altitudeKm, x.meanFractionalOffset, x.meanFractionalOffsetVsLunarSurface, x.gravitational, x.velocity]));
}

export function lunarSweepToText(r: LunarSweepResult): string {
  return [
    'Clock rate against altitude above the Moon',
    '',
    textTable(
      ['altitude km', 'vs TT', 'µs/day', 'vs lunar surface', 'µs/day'],
      r.rows.map((x) => [fixed(x.altitudeKm, 1), sci(x.meanFractionalOffset, 6), fixed(x.meanFractionalOffset * 86400e6, 4), sci(x.meanFractionalOffsetVsLunarSurface, 5), fixed(x.meanFractionalOffsetVsLunarSurface * 86400e6, 4)]),
    ),
    '',
    r.surfaceMatchAltitudeKm === null ? 'No altitude in the range keeps the lunar surface reference\'s rate.' : `An orbiting clock keeps the lunar surface reference's rate at ${fixed(r.surfaceMatchAltitudeKm, 1)} km altitude.`,
    NOTE,
    PLANNING_CAUTION,
    '',
  ].join('\n');
}
