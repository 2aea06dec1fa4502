/** Writers for `compare`, `sweep` and `track`: JSON (contract fields), CSV and text. */
import type { CompareResult } from '../plan/compare.ts';
import type { SweepResult } from '../plan/sweep.ts';
import type { TrackRow } from '../plan/track.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { fixed, sci, signed, textTable } from './format.ts';

const utc = (ts: TimeSystem, t: number): string => ts.format(Instant.fromTtJ2000S(t));

// ---- compare ----------------------------------------------------------------------------------

export function compareToJson(r: CompareResult, ts: TimeSystem, meta: { scenario: string; gravity: string; fromTtJ2000S: number; toTtJ2000S: number }) {
  return {
    scenario: meta.scenario,
    gravity: meta.gravity,
    from: utc(ts, meta.fromTtJ2000S),
    to: utc(ts, meta.toTtJ2000S),
    clocks: r.clocks.map((c) => ({
      id: c.id,
      kind: c.kind,
      body: c.body,
      meanFractionalOffset: c.meanFractionalOffset,
      driftNsPerDay: c.driftNsPerDay,
      periodicAmplitudeNs: c.periodicAmplitudeNs,
      elapsedOffsetNs: c.elapsedOffsetNs,
      // A flight: launch and landing, and the part of it inside the window that the figures cover.
      ...(c.flightEndTtJ2000S === null ? {} : { flightStart: utc(ts, c.flightStartTtJ2000S ?? c.fromTtJ2000S), flightEnd: utc(ts, c.flightEndTtJ2000S), from: utc(ts, c.fromTtJ2000S), to: utc(ts, c.toTtJ2000S) }),
    })),
    pairs: r.pairs.map((p) => ({ a: p.a, b: p.b, elapsedDifferenceNs: p.elapsedDifferenceNs, from: utc(ts, p.fromTtJ2000S), to: utc(ts, p.toTtJ2000S) })),
    note: 'Relativity only (no oscillator model). Station rates use the scenario gravity model plus the given geoid undulation; tauplan carries no geoid model.',
  };
}

/** The JSON object `tauplan compare --format json` prints (plain data; times are UTC ISO strings). */
export type CompareJson = ReturnType<typeof compareToJson>;

/** Clocks, then pairs (kind `pair`, with a, b and the difference over their common interval from–to). */
export function compareToCsv(r: CompareResult, ts: TimeSystem): string {
  return toCsv(
    ['id', 'kind', 'meanFractionalOffset', 'driftNsPerDay', 'periodicAmplitudeNs', 'elapsedOffsetNs', 'from', 'to', 'flightEnd', 'a', 'b', 'elapsedDifferenceNs', 'body'],
    [
      ...r.clocks.map((c) => [c.id, c.kind, c.meanFractionalOffset, c.driftNsPerDay, c.periodicAmplitudeNs, c.elapsedOffsetNs, utc(ts, c.fromTtJ2000S), utc(ts, c.toTtJ2000S), c.flightEndTtJ2000S === null ? null : utc(ts, c.flightEndTtJ2000S), null, null, null, c.body]),
      ...r.pairs.map((p) => [`${p.a} - ${p.b}`, 'pair', null, null, null, null, utc(ts, p.fromTtJ2000S), utc(ts, p.toTtJ2000S), null, p.a, p.b, p.elapsedDifferenceNs, null]),
    ],
  );
}

/** A pair's interval for tables: the whole window, or the common part when a flight shortens it. */
export function pairInterval(ts: TimeSystem, p: { fromTtJ2000S: number; toTtJ2000S: number }, meta: { fromTtJ2000S: number; toTtJ2000S: number }): string {
  const whole = Math.abs(p.fromTtJ2000S - meta.fromTtJ2000S) < 1e-3 && Math.abs(p.toTtJ2000S - meta.toTtJ2000S) < 1e-3;
  const spanS = p.toTtJ2000S - p.fromTtJ2000S;
  const span = spanS < 3600 ? `${fixed(spanS / 60, 1)} min` : spanS < 172800 ? `${fixed(spanS / 3600, 2)} h` : `${fixed(spanS / 86400, 2)} d`;
  return whole ? `window (${span})` : `${utc(ts, p.fromTtJ2000S)} → ${utc(ts, p.toTtJ2000S)} (${span}, flight)`;
}

/** A flight's interval in text: the part inside the window, `*` marking an end cut by the window. */
function flightInterval(ts: TimeSystem, c: { fromTtJ2000S: number; toTtJ2000S: number; flightStartTtJ2000S: number | null; flightEndTtJ2000S: number | null }): string {
  const cutFrom = c.flightStartTtJ2000S !== null && c.fromTtJ2000S > c.flightStartTtJ2000S + 1e-3 ? '*' : '';
  const cutTo = c.flightEndTtJ2000S !== null && c.toTtJ2000S < c.flightEndTtJ2000S - 1e-3 ? '*' : '';
  return `flight ${utc(ts, c.fromTtJ2000S).slice(11, 23)}${cutFrom} → ${utc(ts, c.toTtJ2000S).slice(11, 23)}${cutTo}`;
}

export function compareToText(r: CompareResult, ts: TimeSystem, meta: { scenario: string; gravity: string; fromTtJ2000S: number; toTtJ2000S: number }): string {
  const out = [
    `Clock comparison — ${meta.scenario}`,
    `Window ${utc(ts, meta.fromTtJ2000S)} to ${utc(ts, meta.toTtJ2000S)}; gravity ${meta.gravity}; relativity only, against TT (a geoid clock).`,
    '',
    textTable(
      ['clock', 'kind', 'mean fractional offset', 'ns/day', 'periodic ns', 'elapsed − TT ns', 'interval'],
      r.clocks.map((c) => [
        c.id,
        c.body === 'moon' ? `${c.kind} (Moon)` : c.kind,
        sci(c.meanFractionalOffset, 5),
        signed(c.driftNsPerDay, 3),
        fixed(c.periodicAmplitudeNs, 3),
        signed(c.elapsedOffsetNs, 3),
        c.flightEndTtJ2000S === null ? 'window' : flightInterval(ts, c),
      ]),
      [false, false, true, true, true, true, false],
    ),
    ...(r.clocks.some((c) => c.flightEndTtJ2000S !== null && flightInterval(ts, c).includes('*')) ? ['* a flight\'s launch or landing cut by the window: its figures and pairs cover the part inside the window.'] : []),
    '',
    'Pairs (a − b, elapsed proper time over the common interval):',
    textTable(
      ['a', 'b', 'a − b ns', 'interval'],
      r.pairs.map((p) => [p.a, p.b, signed(p.elapsedDifferenceNs, 4), pairInterval(ts, p, meta)]),
      [false, false, true, false],
    ),
    '',
    'Station clocks: W = U + ω²ρ²/2 in the scenario gravity model, lowered by g·N/c² for the given geoid undulation N.',
    ...(r.clocks.some((c) => c.body === 'moon')
      ? ['Clocks near the Moon: geocentric-metric rate with the Moon\'s potential taken exactly and the Sun\'s tide (for every clock of this scenario); orbiters\' means remove −2ρ·u/c² and −v_M·ρ/c²; the monthly Earth–Moon term (about 0.47 µs) stays in, so use whole anomalistic months for long-term rates.']
      : []),
    PLANNING_CAUTION,
    '',
  ];
  return out.join('\n');
}

// ---- sweep ------------------------------------------------------------------------------------

export function sweepToJson(r: SweepResult, meta: { gravity: string; e: number; iDeg: number }) {
  return {
    gravity: meta.gravity,
    e: meta.e,
    iDeg: meta.iDeg,
    rows: r.rows.map((x) => ({ altitudeKm: x.altitudeKm, meanFractionalOffset: x.meanFractionalOffset, gravitational: x.gravitational, velocity: x.velocity })),
    breakEvenAltitudeKm: r.breakEvenAltitudeKm,
    note: 'Altitude above the WGS-84 equatorial radius 6378.137 km; elements osculating; each row integrated over two periods (at most one day).',
  };
}

/** The JSON object `tauplan sweep --format json` prints (plain data; times are UTC ISO strings). */
export type SweepJson = ReturnType<typeof sweepToJson>;

export function sweepToCsv(r: SweepResult): string {
  return toCsv(['altitudeKm', 'meanFractionalOffset', 'gravitational', 'velocity'], r.rows.map((x) => [x.altitudeKm, x.meanFractionalOffset, x.gravitational, x.velocity]));
}

export function sweepToText(r: SweepResult, meta: { gravity: string; e: number; iDeg: number }): string {
  const every = Math.max(1, Math.ceil(r.rows.length / 40));
  const shown = r.rows.filter((_, k) => k % every === 0 || k === r.rows.length - 1);
  return [
    `Mean clock rate against altitude (gravity ${meta.gravity}, e = ${meta.e}, i = ${meta.iDeg}°)`,
    r.breakEvenAltitudeKm === null ? 'No break-even altitude in this range.' : `Break-even altitude: ${fixed(r.breakEvenAltitudeKm, 2)} km — below it an orbiting clock runs slow against the geoid, above it fast.`,
    '',
    textTable(
      ['altitude km', 'mean fractional offset', 'µs/day', 'gravitational', 'velocity'],
      shown.map((x) => [fixed(x.altitudeKm, 1), sci(x.meanFractionalOffset, 5), signed(x.meanFractionalOffset * 86400e6, 3), sci(x.gravitational, 5), sci(x.velocity, 5)]),
    ),
    shown.length < r.rows.length ? `(${shown.length} of ${r.rows.length} rows shown; use --format csv or json for all)` : '',
    PLANNING_CAUTION,
    '',
  ].join('\n');
}

// ---- track ------------------------------------------------------------------------------------

export function trackToJson(rows: TrackRow[], ts: TimeSystem, satellite: string, frame: string) {
  return {
    satellite,
    frame,
    rows: rows.map((r) => ({
      time: utc(ts, r.ttJ2000S),
      xKm: r.xKm,
      yKm: r.yKm,
      zKm: r.zKm,
      vxKmPerS: r.vxKmPerS,
      vyKmPerS: r.vyKmPerS,
      vzKmPerS: r.vzKmPerS,
      fractionalOffset: r.fractionalOffset,
      offsetNs: r.offsetNs,
      periodicNs: r.periodicNs,
    })),
  };
}

/** The JSON object `tauplan track --format json` prints (plain data; times are UTC ISO strings). */
export type TrackJson = ReturnType<typeof trackToJson>;

const TRACK_COLUMNS = ['time', 'xKm', 'yKm', 'zKm', 'vxKmPerS', 'vyKmPerS', 'vzKmPerS', 'fractionalOffset', 'offsetNs', 'periodicNs'];

export function trackToCsv(rows: TrackRow[], ts: TimeSystem): string {
  return toCsv(TRACK_COLUMNS, rows.map((r) => [utc(ts, r.ttJ2000S), r.xKm, r.yKm, r.zKm, r.vxKmPerS, r.vyKmPerS, r.vzKmPerS, r.fractionalOffset, r.offsetNs, r.periodicNs]));
}

export function trackToText(rows: TrackRow[], ts: TimeSystem, satellite: string, frame: string): string {
  return [
    `Track of ${satellite}, frame ${frame}; offsets in ns against the reference scale`,
    textTable(
      ['time (UTC)', 'x km', 'y km', 'z km', 'vx km/s', 'vy km/s', 'vz km/s', 'y_rel', 'offset ns', '−2r·v/c² ns'],
      rows.map((r) => [utc(ts, r.ttJ2000S), fixed(r.xKm, 3), fixed(r.yKm, 3), fixed(r.zKm, 3), fixed(r.vxKmPerS, 6), fixed(r.vyKmPerS, 6), fixed(r.vzKmPerS, 6), sci(r.fractionalOffset, 6), signed(r.offsetNs, 3), signed(r.periodicNs, 3)]),
    ),
    '',
  ].join('\n');
}
