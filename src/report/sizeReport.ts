/** Writers for `tauplan size`: JSON (contract fields), CSV (one row per satellite), text worksheet. */
import type { SizeResult } from '../plan/size.ts';
import type { LunarSizeResult } from '../plan/lunarSize.ts';
import { lunarSizeToJson, lunarSizeToText } from './lunarSizeReport.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { Instant } from '../time/instant.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv, type CsvCell } from './csv.ts';
import { fixed, sci, signed } from './format.ts';

/** The contract's JSON object, plus our extras (never renamed). */
export function sizeToJson(r: SizeResult, ts: TimeSystem) {
  // A lunar clock's object is a superset of these fields (./lunarSizeReport.ts).
  if (isLunarResult(r)) return lunarSizeToJson(r, ts) as unknown as ReturnType<typeof earthSizeJson>;
  return earthSizeJson(r, ts);
}

/** True for a lunar sizing (`size --body moon` or a lunar orbit met in a scenario or catalogue). */
function isLunarResult(r: SizeResult): r is LunarSizeResult {
  return (r as Partial<LunarSizeResult>).body === 'moon';
}

/** The contract's object for an Earth orbit. */
export function earthSizeJson(r: SizeResult, ts: TimeSystem) {
  return {
    satellite: r.satellite,
    source: r.source,
    gravity: r.gravity,
    from: ts.format(Instant.fromTtJ2000S(r.fromTtJ2000S)),
    spanS: r.spanS,
    meanFractionalOffset: r.meanFractionalOffset,
    driftNsPerDay: r.driftNsPerDay,
    components: { gravitational: r.components.gravitational, velocity: r.components.velocity },
    nominalHz: r.nominalHz,
    recommendedHz: r.recommendedHz,
    recommendedOffsetHz: r.recommendedOffsetHz,
    eccentricityAmplitudeNs: r.eccentricityAmplitudeNs,
    residualPeriodicAmplitudeNs: r.residualPeriodicAmplitudeNs,
    sensitivityPerKm: r.sensitivityPerKm,
    sensitivityMethod: r.sensitivityMethod,
    spanMeanFractionalOffset: r.spanMeanFractionalOffset,
    // e of a circular orbit prints as 0, not as the 1e-17 left by the state-to-elements conversion.
    orbit: { ...r.orbit, e: Math.abs(r.orbit.e) < 1e-12 ? 0 : r.orbit.e },
    integrationStepS: r.integrationStepS,
    statesEvaluated: r.statesEvaluated,
    // Version 2 (lunar issue): the central body, the rate against a lunar surface reference (lunar
    // clocks only) and the split by source; the Moon and Sun parts are null when not modelled apart.
    body: 'earth' as 'earth' | 'moon',
    meanFractionalOffsetVsLunarSurface: null as number | null,
    parts: { earth: r.components.gravitational, moon: null as number | null, sun: null as number | null, velocity: r.components.velocity },
    ...(isKeplerianInput(r) ? { elementsNote: 'Keplerian input is osculating at the epoch; a mean-element a differs by up to a few km at GNSS altitude (about 1 ns/day).' } : {}),
  };
}

/** The JSON object `tauplan size --format json` prints (plain data; times are UTC ISO strings). */
export type SizeJson = ReturnType<typeof sizeToJson>;

export const SIZE_CSV_COLUMNS = [
  'satellite', 'source', 'gravity', 'from', 'spanS', 'aKm', 'e', 'iDeg', 'meanFractionalOffset', 'driftNsPerDay',
  'gravitational', 'velocity', 'nominalHz', 'recommendedHz', 'recommendedOffsetHz', 'eccentricityAmplitudeNs',
  'residualPeriodicAmplitudeNs', 'sensitivityPerKm', 'error',
];

/** One CSV row for a result (or a failure with its reason). */
export function sizeCsvRow(r: SizeResult, ts: TimeSystem): CsvCell[] {
  return [
    r.satellite, r.source, r.gravity, ts.format(Instant.fromTtJ2000S(r.fromTtJ2000S)), r.spanS, r.orbit.aKm, r.orbit.e, r.orbit.iDeg,
    r.meanFractionalOffset, r.driftNsPerDay, r.components.gravitational, r.components.velocity, r.nominalHz, r.recommendedHz,
    r.recommendedOffsetHz, r.eccentricityAmplitudeNs, r.residualPeriodicAmplitudeNs, r.sensitivityPerKm, null,
  ];
}

export function sizeToCsv(results: SizeResult[], ts: TimeSystem): string {
  return toCsv(SIZE_CSV_COLUMNS, results.map((r) => sizeCsvRow(r, ts)));
}

/** True when the orbit came from Keplerian elements (the osculating caveat applies only then). */
export function isKeplerianInput(r: SizeResult): boolean {
  return /keplerian/i.test(r.source);
}

/** The engineer's worksheet; `title` is the scenario id or the element set's object name. */
export function sizeToText(r: SizeResult, ts: TimeSystem, title: string = r.satellite): string {
  if (isLunarResult(r)) return lunarSizeToText(r, ts, title);
  const from = Instant.fromTtJ2000S(r.fromTtJ2000S);
  const to = from.plusS(r.spanS);
  const perDay = (y: number): string => `${signed(y * 86400e6, 3)} µs/day`;
  const lines = [
    `Frequency-offset worksheet — ${title}`,
    `${'='.repeat(40)}`,
    `Orbit source        ${r.source}; gravity model: ${r.gravity}`,
    `Span                ${ts.format(from)} to ${ts.format(to)} (${fixed(r.spanS / 3600, 2)} h)`,
    `Osculating at start a = ${fixed(r.orbit.aKm, 3)} km, e = ${fixed(r.orbit.e, 6)}, i = ${fixed(r.orbit.iDeg, 3)}°, period ${fixed(r.orbit.periodS / 60, 2)} min`,
    `                    perigee ${fixed(r.orbit.perigeeAltitudeKm, 1)} km, apogee ${fixed(r.orbit.apogeeAltitudeKm, 1)} km above the equatorial radius`,
    '',
    '1. Mean rate of the onboard clock against TT (ground time)',
    `   mean fractional offset     ${sci(r.meanFractionalOffset, 6)}   (${perDay(r.meanFractionalOffset)}; ${r.meanFractionalOffset >= 0 ? 'runs fast' : 'runs slow'})`,
    `     gravitational part       ${sci(r.components.gravitational, 6)}   (${perDay(r.components.gravitational)})`,
    `     velocity part            ${sci(r.components.velocity, 6)}   (${perDay(r.components.velocity)})`,
    `   drift                      ${signed(r.driftNsPerDay, 3)} ns/day`,
    '',
    '2. Factory setting',
    `   nominal frequency          ${fixed(r.nominalHz, 3)} Hz`,
    `   set on the ground to       ${fixed(r.recommendedHz, 6)} Hz`,
    `   offset from nominal        ${signed(r.recommendedOffsetHz * 1e3, 6)} mHz`,
    '',
    '3. Periodic terms (not removed by the factory setting)',
    `   eccentricity term amplitude  ${fixed(r.eccentricityAmplitudeNs, 3)} ns   (corrected in the receiver by −2 r·v/c²)`,
    `   residual after −2 r·v/c²     ${fixed(r.residualPeriodicAmplitudeNs, 4)} ns   (mostly J2; zero in point-mass gravity)`,
    '',
    '4. Sensitivity to the orbit',
    `   d(mean fractional offset)/da ${sci(r.sensitivityPerKm, 4)} per km   (${signed(r.sensitivityPerKm * 86400e9, 4)} ns/day per km)`,
    `   method: ${r.sensitivityMethod}`,
    '',
    `Integration: Gauss–Legendre, 8 points per ${fixed(r.integrationStepS, 1)} s step; ${r.statesEvaluated} states evaluated.`,
    ...(isKeplerianInput(r) ? ['Keplerian input is osculating at its epoch: a mean-element a differs by up to a few km at GNSS altitude (about 1 ns/day).'] : []),
    'Sign: positive means the clock runs fast against TT.',
    '',
    PLANNING_CAUTION,
    '',
  ];
  return lines.join('\n');
}
