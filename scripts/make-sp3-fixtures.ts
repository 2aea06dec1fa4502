/**
 * Invented SP3-d files for the SP3 reader tests. Nothing here is measured: every position is
 * computed from tauplan's own two-body trajectory (KeplerianTrajectory, GM = WGS-84
 * 3.986004418e14 m³/s²), whose TOD state is taken as TEME, then rotated to earth-fixed with
 * `temeToEcef` at GMST from `gmstRadAtTt` (the same rotation the reader undoes).
 *
 * Satellite ids use the letter X, which SP3-d assigns to no system, so they cannot be mistaken
 * for real spacecraft: X01, X02 GPS-like MEO; X51 a 550 km sun-synchronous-like LEO.
 *
 * Files (tests/fixtures/sp3/):
 * - meo-15min-p.sp3            X01, 15-min epochs over one day, P records only;
 * - leo-60s-pv.sp3             X51, 60-s epochs over three hours, P and V records;
 * - meo-15min-gap-maneuver.sp3 X01 and X02, 15-min epochs: the 06:00 epoch is left out, X01 gets an
 *   along-track impulse of +0.5 m/s at 14:52:30 and an M flag at 15:00, X02 has an all-zero (bad)
 *   position and a bad clock at 12:00 and a clock-event flag E at 18:00;
 * - truth.json                 the generating elements per satellite and segment, so tests can
 *   recompute the exact states.
 *
 * V records are `temeToEcef` velocities (ω = 7.292115e-5 rad/s), in dm/s; clocks are an invented
 * linear model. Rebuild with `node --import tsx scripts/make-sp3-fixtures.ts` (writes the files).
 */
import { sp3HeaderLines } from '../src/io/sp3Write.ts';
import { mkdirSync, writeFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { WGS84_GM_M3_PER_S2 } from '../src/constants.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { elementsFromDegKm, elementsFromState, keplerState, type KeplerianElements } from '../src/orbit/keplerian.ts';
import { temeToEcef } from '../src/orbit/frames.ts';
import { gmstRadAtTt } from '../src/orbit/sp3.ts';
import { vec3 } from '../src/orbit/vec.ts';
import { Instant } from '../src/time/instant.ts';
import type { CivilTime, TimeSystem } from '../src/time/timeSystem.ts';

/** One trajectory segment: `elements` hold from `fromTtJ2000S` (null = from the start) on. */
export interface TruthSegment {
  fromTtJ2000S: number | null;
  elements: KeplerianElements;
}

/** Sidecar content: how every fixture satellite was generated. */
export interface Sp3FixtureTruth {
  description: string;
  rebuild: string;
  gmM3PerS2: number;
  satellites: { file: string; id: string; segments: TruthSegment[] }[];
}

/** Start of every fixture file, GPS time. */
const START: CivilTime = { year: 2024, month: 5, day: 1, hour: 0, minute: 0, second: 0 };

/** TEME state [m, m/s] of a piecewise two-body truth at ttJ2000S. */
export function truthStateTeme(segments: readonly TruthSegment[], gmM3PerS2: number, ttJ2000S: number): { r: number[]; v: number[] } {
  let seg = segments[0];
  for (const s of segments) if (s.fromTtJ2000S === null || s.fromTtJ2000S <= ttJ2000S) seg = s;
  const { r, v } = keplerState(seg.elements, gmM3PerS2, ttJ2000S - seg.elements.epochTtJ2000S);
  return { r: [r[0], r[1], r[2]], v: [v[0], v[1], v[2]] };
}

const f = (x: number, w: number, d: number): string => x.toFixed(d).padStart(w);
const i2 = (n: number): string => String(n).padStart(2);

interface SatPlan {
  id: string;
  segments: TruthSegment[];
  clockBiasUs: number;
  clockRateUsPerS: number;
  /** Epoch index → what to write instead of a normal record. */
  special?: Map<number, 'bad' | 'M' | 'E'>;
}

function civilAt(time: TimeSystem, t: Instant): CivilTime {
  return time.civil(t, 'GPS');
}

/** The text of one SP3-d file. */
function writeSp3(time: TimeSystem, opts: { withV: boolean; intervalS: number; count: number; skip: Set<number>; sats: SatPlan[]; comments: string[] }): string {
  const start = time.fromScale('GPS', START);
  const kept = [...Array(opts.count).keys()].filter((k) => !opts.skip.has(k));
  const out = sp3HeaderLines(time, start, opts.intervalS, kept.length, opts.sats.map((s) => s.id), { withVelocity: opts.withV, orbitType: 'KEP', comments: opts.comments });
  for (const k of kept) {
    const inst = start.plusS(k * opts.intervalS);
    const e = civilAt(time, inst);
    out.push(`*  ${e.year} ${i2(e.month)} ${i2(e.day)} ${i2(e.hour)} ${i2(e.minute)} ${f(e.second, 11, 8)}`);
    const tt = inst.ttJ2000S;
    const gmst = gmstRadAtTt(time, tt);
    for (const sat of opts.sats) {
      const { r, v } = truthStateTeme(sat.segments, WGS84_GM_M3_PER_S2, tt);
      const ecef = temeToEcef(vec3<'TEME'>(r[0], r[1], r[2]), vec3<'TEME'>(v[0], v[1], v[2]), gmst);
      const dt = k * opts.intervalS;
      const clockUs = sat.clockBiasUs + sat.clockRateUsPerS * dt;
      const special = sat.special?.get(k);
      let pos = `P${sat.id}${f(ecef.r[0] / 1000, 14, 6)}${f(ecef.r[1] / 1000, 14, 6)}${f(ecef.r[2] / 1000, 14, 6)}${f(clockUs, 14, 6)}`;
      if (special === 'bad') pos = `P${sat.id}${f(0, 14, 6)}${f(0, 14, 6)}${f(0, 14, 6)}${f(999999.999999, 14, 6)}`;
      if (special === 'M') pos += `${' '.repeat(18)}M`;
      if (special === 'E') pos += `${' '.repeat(14)}E`;
      out.push(pos);
      if (opts.withV) {
        out.push(`V${sat.id}${f(ecef.v[0] * 10, 14, 6)}${f(ecef.v[1] * 10, 14, 6)}${f(ecef.v[2] * 10, 14, 6)}${f(sat.clockRateUsPerS * 1e4, 14, 6)}`);
      }
    }
  }
  out.push('EOF');
  return out.join('\n') + '\n';
}

/** All fixture files (name → text) and the truth sidecar, from the given time system. */
export function buildSp3Fixtures(time: TimeSystem): { files: { name: string; text: string }[]; truth: Sp3FixtureTruth } {
  const epochTt = time.fromScale('GPS', START).ttJ2000S;
  const gm = WGS84_GM_M3_PER_S2;
  const where = { a: 'fixture a', e: 'fixture e' };
  const meo1 = elementsFromDegKm({ epochTtJ2000S: epochTt, aKm: 26559.7, e: 0.01, iDeg: 55, raanDeg: 40, argpDeg: 30, meanAnomalyDeg: 10 }, where);
  const meo2 = elementsFromDegKm({ epochTtJ2000S: epochTt, aKm: 26559.7, e: 0.004, iDeg: 55, raanDeg: 160, argpDeg: 250, meanAnomalyDeg: 200 }, where);
  const leo = elementsFromDegKm({ epochTtJ2000S: epochTt, aKm: 6378.137 + 550, e: 0.001, iDeg: 97.6, raanDeg: 120, argpDeg: 90, meanAnomalyDeg: 0 }, where);

  // Impulsive along-track burn for X01 in the maneuver file, between the 14:45 and 15:00 epochs.
  const burnTt = epochTt + 14 * 3600 + 52 * 60 + 30;
  const pre = keplerState(meo1, gm, burnTt - meo1.epochTtJ2000S);
  const vn = Math.hypot(pre.v[0], pre.v[1], pre.v[2]);
  const dvMPerS = 0.5;
  const vAfter = [0, 1, 2].map((k) => pre.v[k] * (1 + dvMPerS / vn));
  const meo1After = elementsFromState(pre.r, vAfter, gm, burnTt);

  const common = ['INVENTED DATA for tauplan tests: two-body orbits, not a real satellite.', 'Rebuild: node --import tsx scripts/make-sp3-fixtures.ts', 'Ids use the letter X (no system). Truth in truth.json.', 'Positions are earth-fixed via GMST (IAU-82), UT1=UTC, no polar motion.'];
  const x01: SatPlan = { id: 'X01', segments: [{ fromTtJ2000S: null, elements: meo1 }], clockBiasUs: 123.456789, clockRateUsPerS: 2e-6 };
  const files = [
    { name: 'meo-15min-p.sp3', text: writeSp3(time, { withV: false, intervalS: 900, count: 97, skip: new Set(), sats: [x01], comments: common }) },
    {
      name: 'leo-60s-pv.sp3',
      text: writeSp3(time, { withV: true, intervalS: 60, count: 181, skip: new Set(), sats: [{ id: 'X51', segments: [{ fromTtJ2000S: null, elements: leo }], clockBiasUs: -45.678901, clockRateUsPerS: -3e-6 }], comments: common }),
    },
    {
      name: 'meo-15min-gap-maneuver.sp3',
      text: writeSp3(time, {
        withV: false,
        intervalS: 900,
        count: 97,
        skip: new Set([24]),
        sats: [
          { id: 'X01', segments: [{ fromTtJ2000S: null, elements: meo1 }, { fromTtJ2000S: burnTt, elements: meo1After }], clockBiasUs: 123.456789, clockRateUsPerS: 2e-6, special: new Map([[60, 'M']]) },
          { id: 'X02', segments: [{ fromTtJ2000S: null, elements: meo2 }], clockBiasUs: -7.654321, clockRateUsPerS: 1e-6, special: new Map<number, 'bad' | 'E'>([[48, 'bad'], [72, 'E']]) },
        ],
        comments: [...common, 'Epoch 06:00 left out; X01 burn +0.5 m/s at 14:52:30 (M at 15:00);', 'X02 bad record at 12:00, clock event E at 18:00.'],
      }),
    },
  ];
  const truth: Sp3FixtureTruth = {
    description: 'Generating two-body elements (TOD axes taken as TEME; metres, radians, epoch in seconds since J2000.0 TT) of the invented SP3 fixtures. Invented data.',
    rebuild: 'node --import tsx scripts/make-sp3-fixtures.ts',
    gmM3PerS2: gm,
    satellites: [
      { file: 'meo-15min-p.sp3', id: 'X01', segments: x01.segments },
      { file: 'leo-60s-pv.sp3', id: 'X51', segments: [{ fromTtJ2000S: null, elements: leo }] },
      { file: 'meo-15min-gap-maneuver.sp3', id: 'X01', segments: [{ fromTtJ2000S: null, elements: meo1 }, { fromTtJ2000S: burnTt, elements: meo1After }] },
      { file: 'meo-15min-gap-maneuver.sp3', id: 'X02', segments: [{ fromTtJ2000S: null, elements: meo2 }] },
    ],
  };
  return { files, truth };
}

/** JSON text of the sidecar, as written. */
export function truthJson(truth: Sp3FixtureTruth): string {
  return JSON.stringify(truth, null, 2) + '\n';
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const dir = fileURLToPath(new URL('../tests/fixtures/sp3/', import.meta.url));
  mkdirSync(dir, { recursive: true });
  const { files, truth } = buildSp3Fixtures(defaultTimeSystem());
  for (const file of files) writeFileSync(dir + file.name, file.text);
  writeFileSync(dir + 'truth.json', truthJson(truth));
  process.stderr.write(`wrote ${files.map((x) => x.name).join(', ')}, truth.json to ${dir}\n`);
}
