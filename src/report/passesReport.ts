/** Writers for `tauplan passes`: JSON (contract fields), CSV, and a schedule grouped by station and day. */
import type { PassClockRow } from '../plan/passes.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { fixed, signed, textTable } from './format.ts';

export interface PassesMeta {
  scenario: string;
  /** Satellites whose orbit source failed inside the window (reported up to the failure). */
  notes: string[];
  fromTtJ2000S: number;
  toTtJ2000S: number;
  reference: string;
  gravity: string;
}

function utc(ts: TimeSystem, t: number): string {
  return ts.format(Instant.fromTtJ2000S(t));
}

/**
 * Time of day (HH:MM:SS) of `t`, with ` +1` (or ` +N`) when it falls N UTC days after `dayStart`'s
 * date, for tables grouped by the AOS date.
 */
export function timeOfDay(ts: TimeSystem, t: number, dayOf: number): string {
  const s = utc(ts, t);
  const days = Math.round((Date.parse(s.slice(0, 10)) - Date.parse(utc(ts, dayOf).slice(0, 10))) / 86_400_000);
  return days > 0 ? `${s.slice(11, 19)} +${days}` : s.slice(11, 19);
}

/** Seconds in the JSON output at the resolution the time coordinate carries (1 µs), without float noise. */
export function microseconds(s: number): number {
  return Math.round(s * 1e6) / 1e6;
}

/** One pass as the contract's JSON object, plus GPS week/seconds of AOS and our extras. */
export function passToJson(r: PassClockRow, ts: TimeSystem) {
  const aosGps = ts.gpsWeek(Instant.fromTtJ2000S(r.aosTtJ2000S));
  return {
    satellite: r.satelliteId,
    satelliteName: r.satelliteName,
    station: r.stationId,
    aos: utc(ts, r.aosTtJ2000S),
    tca: utc(ts, r.tcaTtJ2000S),
    los: utc(ts, r.losTtJ2000S),
    maxElevationDeg: r.maxElevationDeg,
    durationS: microseconds(r.durationS),
    truncated: r.truncated,
    clockOffsetAtAosNs: r.clockOffsetAtAosNs,
    clockOffsetAtLosNs: r.clockOffsetAtLosNs,
    driftDuringPassNs: r.driftDuringPassNs,
    relativisticPeriodicAtTcaNs: r.relativisticPeriodicAtTcaNs,
    lightTimeAtTcaNs: r.lightTimeAtTcaNs,
    sagnacAtTcaNs: r.sagnacAtTcaNs,
    shapiroAtTcaNs: r.shapiroAtTcaNs,
    keepInMarginNs: r.keepInMarginNs,
    aosGpsWeek: aosGps.week,
    aosGpsSecondsOfWeek: microseconds(aosGps.secondsOfWeek),
    clockOffsetAtTcaNs: r.clockOffsetAtTcaNs,
    // Lunar issue: satellites about the Moon and stations on it are marked so.
    satelliteBody: r.satelliteBody ?? 'earth',
    stationBody: r.stationBody ?? 'earth',
  };
}

export function passesToJson(rows: PassClockRow[], meta: PassesMeta, ts: TimeSystem) {
  return {
    scenario: meta.scenario,
    from: utc(ts, meta.fromTtJ2000S),
    to: utc(ts, meta.toTtJ2000S),
    reference: meta.reference,
    gravity: meta.gravity,
    caution: PLANNING_CAUTION,
    notes: meta.notes,
    passes: rows.map((r) => passToJson(r, ts)),
  };
}

/** The JSON object `tauplan passes --format json` prints (plain data; times are UTC ISO strings). */
export type PassesJson = ReturnType<typeof passesToJson>;

const CSV_COLUMNS = [
  'satellite', 'satelliteName', 'station', 'aos', 'tca', 'los', 'aosGpsWeek', 'aosGpsSecondsOfWeek', 'maxElevationDeg', 'durationS', 'truncated',
  'clockOffsetAtAosNs', 'clockOffsetAtLosNs', 'driftDuringPassNs', 'relativisticPeriodicAtTcaNs', 'lightTimeAtTcaNs', 'sagnacAtTcaNs',
  'shapiroAtTcaNs', 'keepInMarginNs', 'satelliteBody', 'stationBody',
];

export function passesToCsv(rows: PassClockRow[], ts: TimeSystem): string {
  return toCsv(
    CSV_COLUMNS,
    rows.map((r) => {
      const j: Record<string, unknown> = passToJson(r, ts);
      return CSV_COLUMNS.map((c) => j[c] as string | number | boolean | null);
    }),
  );
}

/** A schedule a shift can read: one block per station, one sub-block per UTC day. */
export function passesToText(rows: PassClockRow[], meta: PassesMeta, ts: TimeSystem): string {
  const out: string[] = [];
  out.push(`Pass schedule with onboard clock offsets — ${meta.scenario}`);
  out.push(`Window ${utc(ts, meta.fromTtJ2000S)} to ${utc(ts, meta.toTtJ2000S)}; offsets are onboard reading minus ${meta.reference} time [ns], free running; gravity model ${meta.gravity}.`);
  out.push(`${rows.length} passes. Times UTC; GPS week/seconds of week at AOS. * = cut by the window; +1 = on the next UTC day.`);
  for (const n of meta.notes) out.push(`NOTE: ${n}`);
  out.push('');
  const stations = [...new Set(rows.map((r) => r.stationId))].sort();
  for (const st of stations) {
    const mine = rows.filter((r) => r.stationId === st);
    const onMoon = mine.some((r) => r.stationBody === 'moon');
    const title = `Station ${st}${onMoon ? ' (on the Moon)' : ''} — ${mine.length} passes`;
    out.push(title);
    out.push('='.repeat(title.length));
    const days = new Map<string, PassClockRow[]>();
    for (const r of mine) {
      const day = utc(ts, r.aosTtJ2000S).slice(0, 10);
      days.set(day, [...(days.get(day) ?? []), r]);
    }
    for (const [day, list] of days) {
      out.push(`  ${day}`);
      const table = textTable(
        ['sat', 'AOS', 'TCA', 'LOS', 'GPS wk/s', 'max el°', 'dur min', 'x AOS ns', 'x LOS ns', 'Δ pass ns', '−2r·v/c² ns', 'light ms', 'Sagnac ns', 'Shapiro ps', 'margin ns'],
        list.map((r) => {
          const g = ts.gpsWeek(Instant.fromTtJ2000S(r.aosTtJ2000S));
          return [
            r.satelliteBody === 'moon' ? `${r.satelliteId} (Moon)` : r.satelliteId,
            `${utc(ts, r.aosTtJ2000S).slice(11, 19)}${r.aosTruncated ? '*' : ''}`,
            timeOfDay(ts, r.tcaTtJ2000S, r.aosTtJ2000S),
            `${timeOfDay(ts, r.losTtJ2000S, r.aosTtJ2000S)}${r.losTruncated ? '*' : ''}`,
            `${g.week}/${Math.floor(g.secondsOfWeek)}`,
            fixed(r.maxElevationDeg, 2),
            fixed(r.durationS / 60, 1),
            signed(r.clockOffsetAtAosNs, 2),
            signed(r.clockOffsetAtLosNs, 2),
            signed(r.driftDuringPassNs, 3),
            signed(r.relativisticPeriodicAtTcaNs, 3),
            fixed(r.lightTimeAtTcaNs / 1e6, 4),
            signed(r.sagnacAtTcaNs, 2),
            fixed(r.shapiroAtTcaNs * 1000, 1),
            r.keepInMarginNs === null ? '—' : signed(r.keepInMarginNs, 1),
          ];
        }),
        [false, false, false, false, true, true, true, true, true, true, true, true, true, true, true],
      );
      out.push(table.split('\n').map((l) => `    ${l}`).join('\n'));
    }
    out.push('');
  }
  if (rows.length === 0) out.push('No pass rises above a station mask for its minimum pass length in this window.', '');
  out.push('Light time, Sagnac and Shapiro are one-way, satellite to station, at TCA. Polar motion and UT1−UTC are neglected (see DEVELOPERS.md).');
  if (rows.some((r) => r.satelliteBody === 'moon' || r.stationBody === 'moon')) {
    out.push('About the Moon: the −2r·v/c² column holds −2ρ·u/c² − v_M·ρ/c² (Moon-centred); light time is solved in the geocentric frame, Sagnac is the station body\'s own, Shapiro the Earth\'s plus the Moon\'s; the other body blocks the line of sight.');
  }
  out.push(PLANNING_CAUTION, '');
  return out.join('\n');
}
