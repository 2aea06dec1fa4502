/**
 * Writers for `tauplan size --body moon`: the JSON object (the `size` fields plus `body`,
 * `meanFractionalOffsetVsLunarSurface`, `parts` and the lunar extras), a CSV row and the text
 * worksheet. They compute nothing physical.
 */
import type { LunarSizeResult } from '../plan/lunarSize.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { Instant } from '../time/instant.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { fixed, sci, signed } from './format.ts';
import { earthSizeJson } from './sizeReport.ts';

/** Notes every lunar sizing carries (JSON `notes`, CSV `#` lines, text NOTE lines). */
export function lunarSizeNotes(r: LunarSizeResult): string[] {
  return [
    'Lunar clock: rate against TT in the geocentric frame (IAU 2000) with the Moon\'s potential taken exactly (point mass + J2 + C22) and the Sun\'s tide; Moon and Sun positions from astronomy-engine (a few km; below 1e-15 in rate).',
    `The lunar surface reference is a clock at rest on the 1737.4 km sphere at selenographic (${r.lunarSurfaceReference.latDeg}°, ${r.lunarSurfaceReference.lonDeg}°); no lunar time scale was fixed when this was written, so rates are given against TT and against that reference.`,
    'Periodic terms removed before the mean: −2ρ·u/c² (Moon-centred) and the cross term −v_M·ρ/c² of the geocentric frame; the monthly variation (about 0.47 µs) is left in, so spans of whole anomalistic months give the long-term rate against TT.',
    'Lunar Keplerian elements are osculating at their epoch, about the Moon, referred to the Moon\'s mean equator of the epoch (IAU pole).',
  ];
}

/** The JSON object: the `size` fields (altitudes above 1737.4 km) plus the lunar ones. */
export function lunarSizeToJson(r: LunarSizeResult, ts: TimeSystem) {
  const { elementsNote: _omit, ...base } = earthSizeJson(r, ts) as ReturnType<typeof earthSizeJson> & { elementsNote?: string };
  return {
    ...base,
    body: r.body,
    keep: r.keep,
    meanFractionalOffsetVsLunarSurface: r.meanFractionalOffsetVsLunarSurface,
    driftVsLunarSurfaceNsPerDay: r.meanFractionalOffsetVsLunarSurface * 86400e9,
    lunarSurfaceReference: { ...r.lunarSurfaceReference, meanFractionalOffset: r.lunarSurfaceReferenceFractionalOffset },
    parts: { ...r.parts },
    crossTermAmplitudeNs: r.crossTermAmplitudeNs,
    altitudeReference: 'above the 1737.4 km lunar reference sphere',
    notes: lunarSizeNotes(r),
  };
}

/** The JSON object of a lunar sizing (plain data; times are UTC ISO strings). */
export type LunarSizeJson = ReturnType<typeof lunarSizeToJson>;

const LUNAR_CSV_COLUMNS = [
  'satellite', 'body', 'source', 'from', 'spanS', 'aKm', 'e', 'iDeg', 'meanFractionalOffset', 'driftNsPerDay', 'meanFractionalOffsetVsLunarSurface',
  'earth', 'moon', 'sun', 'velocity', 'keep', 'nominalHz', 'recommendedHz', 'recommendedOffsetHz', 'eccentricityAmplitudeNs', 'crossTermAmplitudeNs', 'sensitivityPerKm',
];

export function lunarSizeToCsv(r: LunarSizeResult, ts: TimeSystem): string {
  const row = [
    r.satellite, r.body, r.source, ts.format(Instant.fromTtJ2000S(r.fromTtJ2000S)), r.spanS, r.orbit.aKm, r.orbit.e, r.orbit.iDeg, r.meanFractionalOffset, r.driftNsPerDay,
    r.meanFractionalOffsetVsLunarSurface, r.parts.earth, r.parts.moon, r.parts.sun, r.parts.velocity, r.keep, r.nominalHz, r.recommendedHz, r.recommendedOffsetHz,
    r.eccentricityAmplitudeNs, r.crossTermAmplitudeNs, r.sensitivityPerKm,
  ];
  return toCsv(LUNAR_CSV_COLUMNS, [row]);
}

/** The engineer's worksheet for a lunar clock. */
export function lunarSizeToText(r: LunarSizeResult, ts: TimeSystem, title: string = r.satellite): string {
  const from = Instant.fromTtJ2000S(r.fromTtJ2000S);
  const to = from.plusS(r.spanS);
  const perDay = (y: number): string => `${signed(y * 86400e6, 4)} µs/day`;
  const ref = r.lunarSurfaceReference;
  const orbiting = Number.isFinite(r.orbit.aKm);
  const lines = [
    `Frequency-offset worksheet (lunar clock) — ${title}`,
    `${'='.repeat(48)}`,
    `Orbit source        ${r.source}`,
    `Field               ${r.gravity}`,
    `Span                ${ts.format(from)} to ${ts.format(to)} (${fixed(r.spanS / 86400, 3)} d)`,
    orbiting
      ? `About the Moon      a = ${fixed(r.orbit.aKm, 3)} km, e = ${fixed(r.orbit.e, 6)}, i = ${fixed(r.orbit.iDeg, 3)}° (lunar equator), period ${fixed(r.orbit.periodS / 3600, 3)} h`
      : `On the Moon         at rest, ${fixed(r.orbit.perigeeAltitudeKm * 1000, 1)} m above the 1737.4 km sphere`,
    ...(orbiting ? [`                    periselene ${fixed(r.orbit.perigeeAltitudeKm, 1)} km, aposelene ${fixed(r.orbit.apogeeAltitudeKm, 1)} km above 1737.4 km`] : []),
    '',
    '1. Mean rate of the onboard clock',
    `   against TT (a geoid clock)          ${sci(r.meanFractionalOffset, 6)}   (${perDay(r.meanFractionalOffset)})`,
    `     Earth part (L_G − U_E/c²)         ${sci(r.parts.earth, 6)}   (${perDay(r.parts.earth)})`,
    `     Moon part (exact, less geocentre) ${sci(r.parts.moon, 6)}   (${perDay(r.parts.moon)})`,
    `     Sun part (tidal)                  ${sci(r.parts.sun, 6)}   (${perDay(r.parts.sun)})`,
    `     velocity part (geocentric)        ${sci(r.parts.velocity, 6)}   (${perDay(r.parts.velocity)})`,
    `   lunar surface reference vs TT       ${sci(r.lunarSurfaceReferenceFractionalOffset, 6)}   (${perDay(r.lunarSurfaceReferenceFractionalOffset)}; at (${ref.latDeg}°, ${ref.lonDeg}°), ${ref.heightM} m)`,
    `   against the lunar surface reference ${sci(r.meanFractionalOffsetVsLunarSurface, 6)}   (${perDay(r.meanFractionalOffsetVsLunarSurface)})`,
    '',
    `2. Factory setting (keeps ${r.keep === 'TT' ? 'TT' : 'the lunar surface reference'})`,
    `   nominal frequency          ${fixed(r.nominalHz, 3)} Hz`,
    `   set on the ground to       ${fixed(r.recommendedHz, 6)} Hz`,
    `   offset from nominal        ${signed(r.recommendedOffsetHz * 1e3, 6)} mHz`,
    '',
    '3. Periodic terms (not removed by the factory setting)',
    `   Moon-centred −2ρ·u/c²        ${fixed(r.eccentricityAmplitudeNs, 3)} ns amplitude`,
    `   cross term −v_M·ρ/c²         ${fixed(r.crossTermAmplitudeNs, 3)} ns amplitude`,
    `   residual after both          ${fixed(r.residualPeriodicAmplitudeNs, 3)} ns (the monthly Earth–Moon term and the perturbations)`,
    '',
    ...(orbiting ? ['4. Sensitivity to the orbit', `   d(mean fractional offset)/da ${sci(r.sensitivityPerKm, 4)} per km (${signed(r.sensitivityPerKm * 86400e9, 4)} ns/day per km)`, `   method: ${r.sensitivityMethod}`, ''] : []),
    `Integration: Gauss–Legendre, 8 points per ${fixed(r.integrationStepS, 1)} s step; ${r.statesEvaluated} states evaluated.`,
    ...lunarSizeNotes(r).map((n) => `NOTE: ${n}`),
    'Sign: positive means the clock runs fast against the reference named.',
    '',
    PLANNING_CAUTION,
    '',
  ];
  return lines.join('\n');
}
