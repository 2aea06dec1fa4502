/**
 * Pass search (src/events/passes.ts) against a brute-force 1-s elevation scan, plus cases with an
 * exact answer. Source of truth: geometry (derived). No published pass tables are used; the orbits
 * and stations are invented.
 *
 * - LEO (500 km, i 97.4°), GPS-like MEO and Molniya-like HEO (e 0.72) two-body orbits, 3 stations,
 *   2–3 days: same passes as a 1-s scan whose crossings are refined by linear interpolation (derived).
 * - An equatorial orbit built to cross a station's zenith at a chosen instant: TCA at 90° (derived, exact).
 * - Geostationary orbit: no pass for a station that cannot see it, one whole-window truncated pass for
 *   one that can (derived, exact).
 * - The Earth's rotation along the grid against the exact sidereal angle, across a leap second (derived).
 * - Every AOS, LOS and TCA of the three orbits against a bisection to 1 µs of the exact elevation and
 *   its rate: within the 1 ms the search promises (derived).
 */
import { describe, expect, it } from 'vitest';
import { WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../src/constants.ts';
import { elevationRad, elevationRateSignM4PerS, stationFrame } from '../src/events/lookAngles.ts';
import { earthPassGridStepS, findPasses, findPassesMany, passGridStepS, type Pass } from '../src/events/passes.ts';
import { earthRotationAlongGrid, earthRotationAtGridTime } from '../src/events/siderealGrid.ts';
import { geodeticToEcefM, type Station } from '../src/events/station.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { gmstRad, temeToEcef, temeToEcefPosition } from '../src/orbit/frames.ts';
import { elementsFromDegKm, KeplerianTrajectory } from '../src/orbit/keplerian.ts';
import { gmstRadAtTt } from '../src/orbit/sp3.ts';
import { sampleByStateAt, type Trajectory } from '../src/orbit/trajectory.ts';
import { vec3, type StateM } from '../src/orbit/vec.ts';

const DEG = Math.PI / 180;
const ts = defaultTimeSystem();
const gmstRadAt = (t: number): number => gmstRad(ts.jdUtcFromTtJ2000S(t));
const T0 = ts.parse('2027-01-01T00:00:00Z', 'test').ttJ2000S;
const DAY_S = 86_400;

function orbit(id: string, aKm: number, e: number, iDeg: number, raanDeg: number, argpDeg: number, meanAnomalyDeg: number): KeplerianTrajectory {
  const el = elementsFromDegKm({ epochTtJ2000S: T0, aKm, e, iDeg, raanDeg, argpDeg, meanAnomalyDeg }, { a: 'aKm', e: 'e' });
  return new KeplerianTrajectory(id, el, WGS84_GM_M3_PER_S2);
}

function station(id: string, latDeg: number, lonDeg: number, heightM: number, maskDeg = 10, minPassS = 300): Station {
  return { id, latDeg, lonDeg, heightM, geoidHeightM: 0, maskDeg, minPassS };
}

const STATIONS: Station[] = [station('arctic', 67.9, 21.1, 400), station('midlat', 40.4, -3.9, 650), station('austral', -33.1, 151.2, 40)];

interface ScanPass {
  stationId: string;
  aosS: number;
  losS: number;
  /** 1-s bracket of each crossing (null when truncated at the window edge). */
  aosBracket: [number, number] | null;
  losBracket: [number, number] | null;
  maxElevationDeg: number;
}

/** Brute force: elevation of every station at every whole second; crossings by linear interpolation. */
function scan(traj: KeplerianTrajectory, stations: Station[], from: number, to: number, minPassS: number | null): { passes: ScanPass[]; states: number } {
  const frames = stations.map((s) => stationFrame(s));
  const open: (Omit<ScanPass, 'losS' | 'losBracket'> | null)[] = stations.map(() => null);
  const prev: { t: number; f: number }[] = stations.map(() => ({ t: NaN, f: NaN }));
  const passes: ScanPass[] = [];
  let states = 0;
  const n = Math.round(to - from);
  for (let k = 0; k <= n; k++) {
    const t = from + k;
    const s = traj.stateAt(t);
    states++;
    const r = temeToEcefPosition(vec3<'TEME'>(s.positionM[0], s.positionM[1], s.positionM[2]), gmstRadAt(t));
    stations.forEach((st, j) => {
      const elDeg = elevationRad(frames[j], r[0], r[1], r[2]) / DEG;
      const f = elDeg - st.maskDeg;
      const p = prev[j];
      if (k === 0) {
        if (f > 0) open[j] = { stationId: st.id, aosS: t, aosBracket: null, maxElevationDeg: elDeg };
      } else if (p.f <= 0 && f > 0) {
        open[j] = { stationId: st.id, aosS: p.t + (-p.f / (f - p.f)), aosBracket: [p.t, t], maxElevationDeg: elDeg };
      } else if (p.f > 0 && f <= 0) {
        const o = open[j]!;
        passes.push({ ...o, losS: p.t + p.f / (p.f - f), losBracket: [p.t, t] });
        open[j] = null;
      }
      const o = open[j];
      if (o && elDeg > o.maxElevationDeg) o.maxElevationDeg = elDeg;
      prev[j] = { t, f };
    });
  }
  open.forEach((o) => {
    if (o) passes.push({ ...o, losS: to, losBracket: null });
  });
  const kept = passes.filter((p) => minPassS === null || p.aosBracket === null || p.losBracket === null || p.losS - p.aosS >= minPassS);
  kept.sort((a, b) => a.aosS - b.aosS || (a.stationId < b.stationId ? -1 : 1));
  return { passes: kept, states };
}

/** Every scan pass has a match (same station, AOS within 2 s); returns the pairs. */
function match(found: Pass[], scanned: ScanPass[]): [Pass, ScanPass][] {
  return scanned.map((sp) => {
    const f = found.find((p) => p.stationId === sp.stationId && Math.abs(p.aosTtJ2000S - sp.aosS) < 2);
    if (!f) throw new Error(`scan pass at station ${sp.stationId}, AOS ${sp.aosS - T0} s after T0, was missed`);
    return [f, sp];
  });
}

/** Linear interpolation over 1 s of a smooth elevation curve: its error is far below this [s]. */
const INTERP_TOLERANCE_S = 0.05;

function checkAgainstScan(label: string, found: Pass[], scanned: ScanPass[]): void {
  expect(found.length, `${label}: pass count`).toBe(scanned.length);
  for (const [p, sp] of match(found, scanned)) {
    if (sp.aosBracket) {
      expect(p.aosTtJ2000S).toBeGreaterThanOrEqual(sp.aosBracket[0]);
      expect(p.aosTtJ2000S).toBeLessThanOrEqual(sp.aosBracket[1]);
      expect(Math.abs(p.aosTtJ2000S - sp.aosS), `${label}: AOS vs interpolated scan [s]`).toBeLessThan(INTERP_TOLERANCE_S);
    } else {
      expect(p.aosTruncated).toBe(true);
    }
    if (sp.losBracket) {
      expect(p.losTtJ2000S).toBeGreaterThanOrEqual(sp.losBracket[0]);
      expect(p.losTtJ2000S).toBeLessThanOrEqual(sp.losBracket[1]);
      expect(Math.abs(p.losTtJ2000S - sp.losS), `${label}: LOS vs interpolated scan [s]`).toBeLessThan(INTERP_TOLERANCE_S);
    } else {
      expect(p.losTruncated).toBe(true);
    }
    // The refined maximum is at or above the best whole-second sample. Slack 1e-6°: GMST comes from a
    // Julian-date double, quantised to ~40 µs (3e-9 rad of rotation, ≤ 2e-7° of elevation jitter).
    expect(p.maxElevationDeg).toBeGreaterThanOrEqual(sp.maxElevationDeg - 1e-6);
    expect(p.tcaTtJ2000S).toBeGreaterThanOrEqual(p.aosTtJ2000S);
    expect(p.tcaTtJ2000S).toBeLessThanOrEqual(p.losTtJ2000S);
  }
}

const CASES = [
  { label: 'LEO 500 km i 97.4°', traj: orbit('leo', 6878.137, 0.001, 97.4, 30, 0, 0), days: 2 },
  { label: 'MEO GPS-like', traj: orbit('meo', 26_561.75, 0.01, 55, 100, 30, 10), days: 3 },
  { label: 'HEO Molniya-like e 0.72', traj: orbit('heo', 26_554, 0.72, 63.4, 50, 270, 0), days: 3 },
];

describe('pass search vs a 1-s brute-force scan (derived)', () => {
  for (const c of CASES) {
    it(`${c.label}: no pass missed, crossings inside the scan's 1-s brackets, cheap`, () => {
      const from = T0;
      const to = T0 + c.days * DAY_S;
      const res = findPassesMany(c.traj, STATIONS, gmstRadAt, from, to);
      const sc = scan(c.traj, STATIONS, from, to, 300);
      expect(sc.passes.length).toBeGreaterThan(0);
      checkAgainstScan(c.label, res.passes, sc.passes);
      const ratio = res.statesEvaluated / sc.states;
      console.log(`${c.label}: ${res.passes.length} passes, grid ${res.gridStepS.toFixed(1)} s, ${res.statesEvaluated} states vs ${sc.states} (${(100 * ratio).toFixed(2)} %)`);
      expect(ratio).toBeLessThanOrEqual(0.05);
    });
  }

  it('passes shorter than the grid step are still found (600 s grid, minPassS 0)', () => {
    const short = STATIONS.map((s) => ({ ...s, minPassS: 0 }));
    const traj = CASES[0].traj;
    const from = T0;
    const to = T0 + DAY_S;
    const res = findPassesMany(traj, short, gmstRadAt, from, to, { gridStepS: 600 });
    const sc = scan(traj, short, from, to, null);
    // Every scan pass is found; extra ones may only be passes too short for a 1-s scan to see.
    const pairs = match(res.passes, sc.passes);
    expect(pairs.length).toBe(sc.passes.length);
    const extra = res.passes.filter((p) => !pairs.some(([q]) => q === p));
    for (const p of extra) expect(p.durationS).toBeLessThan(2);
    const shortest = Math.min(...res.passes.map((p) => p.durationS));
    console.log(`600-s grid: ${res.passes.length} passes, shortest ${shortest.toFixed(1)} s`);
    // The case really exercises passes that fall between grid samples.
    const between = res.passes.filter((p) => Math.floor((p.aosTtJ2000S - from) / 600) === Math.floor((p.losTtJ2000S - from) / 600));
    console.log(`  ${between.length} of them lie wholly between two grid samples`);
    expect(between.length).toBeGreaterThan(0);
    expect(shortest).toBeLessThan(600);
  });

  it('orders passes by AOS and drops passes shorter than minPassS', () => {
    const res = findPassesMany(CASES[0].traj, STATIONS, gmstRadAt, T0, T0 + DAY_S);
    for (let i = 1; i < res.passes.length; i++) expect(res.passes[i].aosTtJ2000S).toBeGreaterThanOrEqual(res.passes[i - 1].aosTtJ2000S);
    for (const p of res.passes) if (!p.truncated) expect(p.durationS).toBeGreaterThanOrEqual(300);
    const all = findPassesMany(
      CASES[0].traj,
      STATIONS.map((s) => ({ ...s, minPassS: 0 })),
      gmstRadAt,
      T0,
      T0 + DAY_S,
    );
    expect(all.passes.some((p) => p.durationS < 300)).toBe(true);
  });
});

describe('exact geometries (derived)', () => {
  it('an equatorial orbit through a station zenith culminates at 90° at the built instant', () => {
    const aKm = 7_000;
    const nRadPerS = Math.sqrt(WGS84_GM_M3_PER_S2 / (aKm * 1000) ** 3);
    const lonDeg = 37.5;
    const tZenith = T0 + 3_000;
    // Inertial longitude of the station at tZenith; the satellite must be there then.
    const u0Deg = (lonDeg * DEG + gmstRadAt(tZenith) - nRadPerS * 3_000) / DEG;
    const traj = orbit('zenith', aKm, 0, 0, 0, 0, u0Deg);
    const st = station('equator', 0, lonDeg, 0);
    const res = findPasses(traj, st, gmstRadAt, T0, T0 + 6_000);
    const p = res.passes.find((q) => q.aosTtJ2000S < tZenith && q.losTtJ2000S > tZenith);
    expect(p).toBeDefined();
    // TCA located to 1 ms; GMST rate vs WGS-84 ω differ by < 1e-9 rad/s, so the zenith instant is exact to µs.
    expect(Math.abs(p!.tcaTtJ2000S - tZenith)).toBeLessThan(0.1);
    expect(Math.abs(p!.maxElevationDeg - 90)).toBeLessThan(0.01);
    // Symmetric pass about the zenith (circular orbit over a spherical-symmetric equator section).
    expect(Math.abs(p!.tcaTtJ2000S - p!.aosTtJ2000S - (p!.losTtJ2000S - p!.tcaTtJ2000S))).toBeLessThan(0.1);
  });

  it('geostationary: no pass where it is below the mask, one whole-window truncated pass where it is seen', () => {
    // Sub-satellite point at longitude 0 at T0: inertial longitude = GMST(T0).
    const traj = orbit('geo', 42_164.17, 0, 0, 0, 0, gmstRadAt(T0) / DEG);
    const from = T0;
    const to = T0 + DAY_S;
    const far = findPasses(traj, station('antipode', 10, 180, 0), gmstRadAt, from, to);
    expect(far.passes.length).toBe(0);
    const near = findPasses(traj, station('europe', 45, 10, 100), gmstRadAt, from, to);
    expect(near.passes.length).toBe(1);
    const p = near.passes[0];
    expect(p.aosTtJ2000S).toBe(from);
    expect(p.losTtJ2000S).toBe(to);
    expect(p.truncated && p.aosTruncated && p.losTruncated).toBe(true);
    expect(p.durationS).toBe(DAY_S);
    // Elevation of a GEO satellite due south-ish of 45° N, 10° E: about 38° (derived from the geometry).
    expect(p.maxElevationDeg).toBeGreaterThan(37);
    expect(p.maxElevationDeg).toBeLessThan(39);
  });
});

/**
 * A synthetic trajectory that holds a satellite 1000 km from a station at (0°, 0°), due north, with a
 * prescribed elevation el(t) [rad]. Used with a zero sidereal angle, so inertial = earth-fixed axes.
 */
function elevationProfileTrajectory(elRad: (t: number) => number, elRateRadPerS: (t: number) => number): Trajectory {
  const rangeM = 1_000_000;
  const stationX = geodeticToEcefM(0, 0, 0)[0];
  const w = WGS84_OMEGA_RAD_PER_S;
  const stateAt = (t: number): StateM<'TEME'> => {
    const el = elRad(t);
    const rate = elRateRadPerS(t);
    const x = stationX + rangeM * Math.sin(el);
    const z = rangeM * Math.cos(el);
    // Inertial velocity = earth-fixed velocity + ω × r (here y = 0).
    return { ttJ2000S: t, positionM: vec3<'TEME'>(x, 0, z), velocityMPerS: vec3<'TEME'>(rangeM * Math.cos(el) * rate, w * x, -rangeM * Math.sin(el) * rate) };
  };
  const traj: Trajectory = {
    id: 'profile',
    frame: 'TEME',
    validFromTtJ2000S: -Infinity,
    validToTtJ2000S: Infinity,
    sourceLabel: 'synthetic elevation profile',
    epochTtJ2000S: null,
    stateAt,
    sampleInto: (times, out) => sampleByStateAt(traj, times, out),
  };
  return traj;
}

describe('dips between grid samples (derived, synthetic profile)', () => {
  it('a 19-s dip below the mask inside a 150-s grid bin splits the pass in two', () => {
    // el = 30° − 25° exp(−((t − tD)/20 s)²): below 10° where exp(·) > 0.8, i.e. |t − tD| < 20 √ln 1.25 s.
    const tD = 537;
    const sigmaS = 20;
    const elRad = (t: number): number => (30 - 25 * Math.exp(-(((t - tD) / sigmaS) ** 2))) * DEG;
    const rate = (t: number): number => 25 * Math.exp(-(((t - tD) / sigmaS) ** 2)) * ((2 * (t - tD)) / sigmaS ** 2) * DEG;
    const traj = elevationProfileTrajectory(elRad, rate);
    const st = station('origin', 0, 0, 0, 10, 60);
    const res = findPasses(traj, st, () => 0, 300, 900, { gridStepS: 150 });
    expect(res.passes.length).toBe(2);
    const halfWidthS = sigmaS * Math.sqrt(Math.log(1.25));
    const [a, b] = res.passes;
    // Crossings located to 1 ms.
    expect(Math.abs(a.losTtJ2000S - (tD - halfWidthS))).toBeLessThan(0.01);
    expect(Math.abs(b.aosTtJ2000S - (tD + halfWidthS))).toBeLessThan(0.01);
    expect(a.aosTruncated && !a.losTruncated && b.losTruncated && !b.aosTruncated).toBe(true);
  });
});

describe('window edges', () => {
  it('a pass cut by the window is truncated at the edge and keeps its far crossing', () => {
    const traj = CASES[0].traj;
    const st = STATIONS[0];
    const full = findPasses(traj, st, gmstRadAt, T0, T0 + DAY_S).passes.filter((p) => !p.truncated);
    expect(full.length).toBeGreaterThan(2);
    const q = full[1];
    const cutStart = 0.5 * (q.aosTtJ2000S + q.tcaTtJ2000S);
    const cutEnd = 0.5 * (full[2].aosTtJ2000S + full[2].losTtJ2000S);
    const res = findPasses(traj, st, gmstRadAt, cutStart, cutEnd).passes;
    const first = res[0];
    const last = res[res.length - 1];
    expect(first.aosTtJ2000S).toBe(cutStart);
    expect(first.aosTruncated && first.truncated && !first.losTruncated).toBe(true);
    // Tolerance: both runs locate LOS to 1 ms.
    expect(Math.abs(first.losTtJ2000S - q.losTtJ2000S)).toBeLessThan(0.01);
    expect(Math.abs(first.tcaTtJ2000S - q.tcaTtJ2000S)).toBeLessThan(0.1);
    expect(last.losTtJ2000S).toBe(cutEnd);
    expect(last.losTruncated && last.truncated && !last.aosTruncated).toBe(true);
    expect(Math.abs(last.aosTtJ2000S - full[2].aosTtJ2000S)).toBeLessThan(0.01);
  });

  it('the grid step follows the orbit and minPassS, within [10 s, 600 s]', () => {
    const leo = CASES[0].traj.stateAt(T0);
    const geo = orbit('geo', 42_164.17, 0, 0, 0, 0, 0).stateAt(T0);
    expect(passGridStepS(leo.positionM, leo.velocityMPerS, 300)).toBe(150);
    expect(passGridStepS(leo.positionM, leo.velocityMPerS, 0)).toBe(10);
    // LEO perigee time scale r/v ≈ 904 s → quarter ≈ 226 s.
    const q = passGridStepS(leo.positionM, leo.velocityMPerS, 10_000);
    expect(q).toBeGreaterThan(215);
    expect(q).toBeLessThan(235);
    expect(passGridStepS(geo.positionM, geo.velocityMPerS, 10_000)).toBe(600);
    // The Earth-station search follows the orbit alone (passes of any length come from located extrema).
    expect(earthPassGridStepS(leo.positionM, leo.velocityMPerS)).toBe(q);
    expect(earthPassGridStepS(geo.positionM, geo.velocityMPerS)).toBe(600);
  });
});

describe('Earth rotation along the grid (derived)', () => {
  // The leap second at the end of 2016-12-31 (IERS Bulletin C 52, confirmed): UTC stops for one
  // second, so GMST of UTC jumps by ω·1 s ≈ 7.3e-5 rad. The grid's anchored recurrence must notice
  // and match the exact angle at every sample; elsewhere it must agree to 1e-9 rad (its bound).
  const exact = (t: number): number => gmstRadAtTt(ts, t);
  const cases = [
    { label: 'a quiet week in 2027', from: ts.parse('2027-03-01T00:00:00Z', 'test').ttJ2000S },
    // The jump falls between samples 2303 and 2304, i.e. between two blocks of 256 samples …
    { label: 'across the 2016-12-31 leap second, between two blocks', from: ts.parse('2016-12-28T00:00:17Z', 'test').ttJ2000S },
    // … and here inside one (between samples 2279 and 2280), which must then be evaluated exactly.
    { label: 'across the 2016-12-31 leap second, inside a block', from: ts.parse('2016-12-28T01:00:00Z', 'test').ttJ2000S },
  ];
  for (const c of cases) {
    it(`${c.label}: within 1e-9 rad of the exact sidereal angle at every sample`, () => {
      const n = 4096;
      const stepS = 150;
      const cos = new Float64Array(n);
      const sin = new Float64Array(n);
      const rate = new Float64Array(n);
      earthRotationAlongGrid(exact, c.from, stepS, n, cos, sin, rate);
      const angleError = (cs: number, sn: number, g: number): number => Math.abs(Math.atan2(sn * Math.cos(g) - cs * Math.sin(g), cs * Math.cos(g) + sn * Math.sin(g)));
      let worst = 0;
      for (let k = 0; k < n; k++) worst = Math.max(worst, angleError(cos[k], sin[k], exact(c.from + k * stepS)));
      // Between samples (refinement instants): the grid's answer, when it gives one, matches too.
      const out = new Float64Array(2);
      let between = 0;
      let answered = 0;
      for (let k = 0; k + 1 < n; k++) {
        const t = c.from + (k + 0.37) * stepS;
        if (!earthRotationAtGridTime(t, c.from, stepS, n, cos, sin, rate, out)) continue;
        answered++;
        between = Math.max(between, angleError(out[0], out[1], exact(t)));
      }
      console.log(`${c.label}: worst angle error ${worst.toExponential(2)} rad at samples, ${between.toExponential(2)} rad between them (${answered} of ${n - 1}) (wanted ≤ 1e-9)`);
      expect(between).toBeLessThanOrEqual(1e-9);
      expect(answered).toBeGreaterThan(n / 2);
      expect(worst).toBeLessThanOrEqual(1e-9);
    });
  }
});

describe('crossings and culminations to 1 ms (derived)', () => {
  /** Bisection of a sign change of fn on [a, b] to 1 µs. */
  function bisect(fn: (t: number) => number, a: number, b: number): number {
    let fa = fn(a);
    for (let k = 0; k < 60 && b - a > 1e-6; k++) {
      const m = 0.5 * (a + b);
      const fm = fn(m);
      if (fm < 0 === fa < 0) {
        a = m;
        fa = fm;
      } else b = m;
    }
    return 0.5 * (a + b);
  }
  for (const c of CASES) {
    it(`${c.label}: AOS, LOS and TCA within 1 ms of a 1-µs bisection`, () => {
      const res = findPassesMany(c.traj, STATIONS, gmstRadAt, T0, T0 + c.days * DAY_S);
      let worstS = 0;
      for (const p of res.passes) {
        const st = STATIONS.find((s) => s.id === p.stationId)!;
        const frame = stationFrame(st);
        const ecef = (t: number) => {
          const s = c.traj.stateAt(t);
          return temeToEcef(vec3<'TEME'>(s.positionM[0], s.positionM[1], s.positionM[2]), vec3<'TEME'>(s.velocityMPerS[0], s.velocityMPerS[1], s.velocityMPerS[2]), gmstRadAt(t));
        };
        const elMinusMask = (t: number): number => {
          const e = ecef(t).r;
          return elevationRad(frame, e[0], e[1], e[2]) - st.maskDeg * DEG;
        };
        const rate = (t: number): number => {
          const e = ecef(t);
          return elevationRateSignM4PerS(frame, e.r[0], e.r[1], e.r[2], e.v[0], e.v[1], e.v[2]);
        };
        const checks: [string, number, (t: number) => number][] = [['TCA', p.tcaTtJ2000S, rate]];
        if (!p.aosTruncated) checks.push(['AOS', p.aosTtJ2000S, elMinusMask]);
        if (!p.losTruncated) checks.push(['LOS', p.losTtJ2000S, elMinusMask]);
        for (const [what, t, fn] of checks) {
          // A culmination at a window edge is not a root of the rate.
          if (what === 'TCA' && (t === T0 || t === T0 + c.days * DAY_S)) continue;
          const wanted = bisect(fn, t - 0.5, t + 0.5);
          const diffS = Math.abs(t - wanted);
          worstS = Math.max(worstS, diffS);
          expect(diffS, `${c.label} ${p.stationId} ${what}: wanted ${wanted - T0} s, got ${t - T0} s after T0`).toBeLessThanOrEqual(1e-3);
        }
      }
      console.log(`${c.label}: worst |found − bisection| ${(worstS * 1e3).toFixed(4)} ms over ${res.passes.length} passes (wanted ≤ 1 ms)`);
    });
  }
});
