/**
 * European GNSS (Galileo) Open Service Signal-In-Space ICD (Issue 2.0, 2021):
 * - §5.1.3 clock correction parameters: t0c 14 bits × 60 s (unsigned); af0 31 bits × 2⁻³⁴ s;
 *   af1 21 bits × 2⁻⁴⁶ s/s; af2 6 bits × 2⁻⁵⁹ s/s² (two's complement). Confirmed (two independent
 *   public I/NAV word-type-4 decoders agree on every width and scale).
 * - §5.1.4 satellite time correction: the same polynomial as GPS plus Δt_r = F·e·√A·sin E with
 *   F = −2√μ/c² = −4.442807309e-10 s/√m, μ = 3.986004418e14 m³/s² (GTRF constants). Confirmed.
 */
import { describe, expect, it } from 'vitest';
import { SPEED_OF_LIGHT_M_PER_S } from '../src/constants.ts';
import { NavFieldOverflowError } from '../src/errors.ts';
import { clockPolynomialS, GALILEO_FORMAT, quantise } from '../src/clock/navMessage.ts';
import { checkNavClockOptions, navigationClockSets, type NavClockOptions, type PredictedClock } from '../src/plan/navclock.ts';

const WEEK_S = 604_800;
const T0 = 852_076_800;

const options = (o: Partial<NavClockOptions> = {}): NavClockOptions => ({
  system: 'galileo',
  degree: 2,
  intervalS: 3600,
  fitIntervalS: 14400,
  spacingS: 300,
  fromTtJ2000S: T0,
  toTtJ2000S: T0 + 86400,
  gpsWeekOf: (t) => {
    const s = t - T0 + 2452 * WEEK_S + 345_617; // not on a minute: the first toc must move onto one
    const week = Math.floor(s / WEEK_S);
    return { week, secondsOfWeek: s - week * WEEK_S };
  },
  utcOf: (t) => `T0+${t - T0}s`,
  ...o,
});

function clock(x0Ns: number, y: number, dPerS: number): PredictedClock & { truthNs(t: number): number } {
  const truthNs = (t: number): number => x0Ns + 1e9 * (y * (t - T0) + 0.5 * dPerS * (t - T0) ** 2);
  return { satellite: 'SIM-E', endTtJ2000S: T0 + 86400, bandNs: () => 0, truthNs, sampleNs: (t, out) => t.forEach((ti, i) => (out[i] = truthNs(ti))) };
}

describe('Galileo OS SIS ICD §5.1.4 relativistic constant', () => {
  it('F = −2√μ/c² with μ = 3.986004418e14 (derived) matches the quoted −4.442807309e-10 s/√m', () => {
    const derived = (-2 * Math.sqrt(GALILEO_FORMAT.muM3PerS2)) / SPEED_OF_LIGHT_M_PER_S ** 2;
    expect(Math.abs(GALILEO_FORMAT.fSPerSqrtM - -4.442807309e-10)).toBeLessThan(5e-20);
    expect(Math.abs(derived - -4.442807309e-10), `derived ${derived}`).toBeLessThan(5e-20);
  });
});

describe('Galileo OS SIS ICD §5.1.3 clock correction parameters', () => {
  it('af0 31 bits × 2⁻³⁴, af1 21 bits × 2⁻⁴⁶, af2 6 bits × 2⁻⁵⁹: the extremes fit, one LSB more does not', () => {
    for (const [f, bits, lsb] of [
      [GALILEO_FORMAT.af0, 31, 2 ** -34],
      [GALILEO_FORMAT.af1, 21, 2 ** -46],
      [GALILEO_FORMAT.af2, 6, 2 ** -59],
    ] as const) {
      expect(quantise((2 ** (bits - 1) - 1) * lsb, f).ok).toBe(true);
      expect(quantise(-(2 ** (bits - 1)) * lsb, f).ok).toBe(true);
      expect(quantise(2 ** (bits - 1) * lsb, f).ok).toBe(false);
    }
  });

  it('t0c lies on the 60-s grid, and an interval that is not a whole number of minutes is refused', () => {
    const r = navigationClockSets([clock(100, 1e-12, 0)], options());
    for (const s of r.satellites[0].sets) expect(s.tocGpsSecondsOfWeek % 60).toBe(0);
    expect(() => checkNavClockOptions(options({ intervalS: 3630 }))).toThrow(/multiple of the 60-s toc resolution/);
  });

  it('a noise-free clock is reproduced within the quantisation error (finer LSBs than GPS)', () => {
    const c = clock(-12_000, 3.1e-11, 2e-14 / 86400);
    const sets = navigationClockSets([c], options()).satellites[0].sets;
    const h = 7200;
    const boundNs = 1e9 * (2 ** -34 / 2 + (2 ** -46 / 2) * h + (2 ** -59 / 2) * h * h); // derived from the scales
    expect(sets.length).toBeGreaterThan(15);
    for (const s of sets) {
      expect(s.quantisationErrorMaxNs).toBeLessThanOrEqual(boundNs + 1e-9);
      // The least-squares solution of a 12-µs offset rounds at ~1e-6 ns: 1e-5 ns (10 fs) allows for it.
      expect(s.fitResidualMaxNs).toBeLessThan(1e-5);
      for (let dt = -h; dt <= h; dt += 131) {
        const err = Math.abs(clockPolynomialS(s, dt) * 1e9 - c.truthNs(s.tocTtJ2000S + dt));
        expect(err, `set at ${s.tocTtJ2000S}, dt ${dt}: error ${err} ns, bound ${boundNs} ns`).toBeLessThanOrEqual(s.quantisationErrorMaxNs + s.fitResidualMaxNs + 1e-5);
      }
    }
  });

  it('af0 of 70 ms overflows 31 bits × 2⁻³⁴ s (limit 62.5 ms)', () => {
    expect(() => navigationClockSets([clock(7e7, 0, 0)], options())).toThrow(NavFieldOverflowError);
  });
});
