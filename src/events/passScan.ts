/**
 * One station's streaming scan along the pass-search grid of ./passes.ts (method there), and the
 * refinement of its crossings and culminations.
 *
 * The scan works on f = sin(elevation) − sin(mask) [1], which has the signs and roots of
 * elevation − mask (sin increases on [−90°, 90°]), and on g = (û·v)|ρ|² − (û·ρ)(ρ·v) [m⁴/s], the
 * elevation-rate numerator: df/dt = g/|ρ|³ exactly, so every evaluated state gives f and its rate.
 *
 * Refinement: a Newton iteration from the Hermite guess of the bin (values and rates at both ends,
 * and second rates from the model acceleration when both ends are grid samples or located knots:
 * quintic then, cubic otherwise), kept inside the sign bracket (a step leaving it bisects instead), capped, and finished by
 * the Illinois root finder on what is left of the bracket if the cap is hit. Crossings use the
 * exact rate g/|ρ|³; culminations (roots of g) use dg/dt with a model acceleration (gravity to J2
 * and the rotating-frame terms; what it leaves out is < 1e-5 of it). The iteration stops on a
 * Newton correction δ ≤ 0.1 s without evaluating its result when the error that correction leaves,
 * |F''/(2F')|·δ² (curvature estimated from the secant to the previous point, times four) plus the
 * rate's relative error times δ, is ≤ 0.1 ms, and the rate agrees with the secant slope (within
 * 50 % for crossings, 10 % for culminations); or on a correction ≤ 10 µs. That stays inside the
 * 1 ms the search promises (tests/pass-search.test.ts checks it against a 1-µs bisection).
 *
 * Maxima below the mask: a bin whose rate turns from + to − with both ends below the mask holds a
 * pass only if the elevation can climb to the mask in between. With the earth-fixed speed bounded
 * by V over the bin, the direction to the satellite turns at most V/ρ_min, so
 * sin(el) ≤ (sin el₀ + sin el₁ + V·h/ρ_min)/2 on it; when that is below sin(mask) the maximum is
 * not located. V comes from the end speeds and an acceleration bound A of twice the point-mass
 * gravity at the lowest radius the bin allows (never below ground) plus the rotating-frame terms (a
 * free-falling orbit: J2, the Moon, the Sun, drag and radiation pressure are well inside the
 * factor two). Otherwise one state at the Hermite guess of the maximum usually settles it: with
 * |d²ρ̂/dt²| ≤ A/ρ + 3V²/ρ² = M, sin(el) stays below f + ḟ²/(2M) + sin(mask) over the bin.
 *
 * The same bound over a chunk of the grid lets a station below the mask skip the samples before the
 * first instant the satellite could reach its mask (StationScan.skipAhead).
 */
import { WGS84_A_M, WGS84_GM_M3_PER_S2, WGS84_OMEGA_RAD_PER_S } from '../constants.ts';
import { stationFrame } from './lookAngles.ts';
import { earthFixedAccelBoundMPerS2, earthFixedSpeedBoundMPerS, type EcefEvaluator } from './passEvaluator.ts';
import { bracketedRoot, hermiteExtremumGuessS, hermiteRootGuessS } from './passRoots.ts';
import type { Pass } from './passes.ts';
import type { Station } from './station.ts';

const DEG = Math.PI / 180;
/** Crossing and culmination times are located to this [s] (contract: AOS/LOS ≤ 0.01 s, TCA ≤ 0.1 s). */
export const TIME_TOLERANCE_S = 1e-3;
/** Cap on Newton steps per root before the Illinois finder takes the remaining bracket. */
const NEWTON_MAX_ITERATIONS = 12;
/** Largest Newton correction [s] the iteration may stop on (without evaluating its result). */
const MAX_FINAL_STEP_S = 0.1;
/** Predicted error [s] of the corrected time the iteration stops on: a tenth of the tolerance. */
const STOP_ERROR_S = 1e-4;
/** A correction this small [s] is taken whatever the curvature estimate (its error is a fraction of it). */
const NEGLIGIBLE_STEP_S = 1e-5;
/**
 * Relative error allowed in the rate of f (the state's velocity as the derivative of its position:
 * SGP4's own velocity differs by ≤ 4e-6) and of g (model acceleration with J2: the Moon, the Sun and
 * drag are below 1e-5 of gravity), and the largest disagreement with the secant slope accepted.
 */
const F_RATE_RELATIVE_ERROR = 1e-5;
const G_RATE_RELATIVE_ERROR = 1e-4;
const F_SLOPE_MISMATCH = 0.5;
const G_SLOPE_MISMATCH = 0.1;
/** Earth's J2 [1] (WGS-84/EGM96 normalised C̄20 = −4.841 65e-4 → 1.082 63e-3; from memory), for the model acceleration only. */
const EARTH_J2 = 1.08263e-3;

/** A first guess [s] kept a quarter tolerance inside the bin [0, widthS]. */
function clampInside(guessS: number, widthS: number): number {
  const margin = 0.25 * TIME_TOLERANCE_S;
  return Math.min(widthS - margin, Math.max(margin, guessS));
}

/** Streaming scan of one station along the shared grid. */
export class StationScan {
  readonly passes: Pass[] = [];
  private readonly px: number;
  private readonly py: number;
  private readonly pz: number;
  private readonly ux: number;
  private readonly uy: number;
  private readonly uz: number;
  private readonly sinMask: number;
  private started = false;
  /** Samples whose next sample is before this time are skipped: the mask cannot be reached before it. */
  private skipUntilT = -Infinity;
  /** The next sample fed follows skipped ones. */
  private resume = false;
  /** The bin stepped is between neighbouring grid samples (the evaluator holds both states). */
  private prevIsNeighbour = false;
  private prevT = 0;
  private prevF = 0;
  private prevG = 0;
  private prevRho = 0;
  private inPass = false;
  private aosT = 0;
  private aosTruncated = false;
  private bestF = -Infinity;
  private bestT = 0;
  /** Elevation [rad] of the best knot (atan2, full precision at the zenith), NaN when the best is a grid sample. */
  private bestElRad = Number.NaN;
  // Values at the last evaluated state: f, df/dt [1/s], g, dg/dt (model).
  private ef = 0;
  private ed = 0;
  private eg = 0;
  private egDot = 0;
  private edd = 0;
  // Earth-fixed acceleration (model) at the last evaluated state [m/s²].
  private eax = 0;
  private eay = 0;
  private eaz = 0;
  // Bounds of the bin last checked by mayReachMask: earth-fixed speed [m/s], acceleration [m/s²], least range [m].
  private binSpeedBoundMPerS = Infinity;
  private binAccelBoundMPerS2 = Infinity;
  private binRangeLowM = 0;
  /** Offset [s] from the last evaluated state to the root the last refinement returned, NaN when unknown. */
  private rootOffsetS = Number.NaN;
  // f, elevation [rad] and d²f/dt² [1/s²] at a knot, from {@link knotValues}.
  private knotF = 0;
  private knotElRad = 0;
  private knotA = 0;

  constructor(
    readonly station: Station,
    private readonly ev: EcefEvaluator,
    private readonly satelliteId: string,
  ) {
    const fr = stationFrame(station);
    [this.px, this.py, this.pz] = fr.positionM;
    [this.ux, this.uy, this.uz] = fr.upUnit;
    this.sinMask = Math.sin(station.maskDeg * DEG);
  }

  /**
   * Feed the next grid sample: its time and earth-fixed state `e` (position [m] then velocity
   * [m/s]). The state comes in an array, not as six numbers: each number passed to a call that is
   * not inlined is boxed (85 MB of garbage in the 180-day benchmark plan of 24 satellites).
   */
  feed(t: number, e: Float64Array): void {
    // Skipped while the next sample too is before the instant the mask can first be reached.
    if (t + this.ev.gridStepS < this.skipUntilT) return;
    // Indexed, not destructured: a typed array's destructuring goes through its iterator.
    const x = e[0];
    const y = e[1];
    const z = e[2];
    const vx = e[3];
    const vy = e[4];
    const vz = e[5];
    const dx = x - this.px;
    const dy = y - this.py;
    const dz = z - this.pz;
    const u = dx * this.ux + dy * this.uy + dz * this.uz;
    const rho2 = dx * dx + dy * dy + dz * dz;
    const rho = Math.sqrt(rho2);
    const f = u / rho - this.sinMask;
    const g = (vx * this.ux + vy * this.uy + vz * this.uz) * rho2 - u * (dx * vx + dy * vy + dz * vz);
    const f0 = this.prevF;
    const g0 = this.prevG;
    if (this.resume) {
      // The samples skipped were all below the mask; this one is too (f ≤ 0) unless the bound failed,
      // in which case the bin from the last sample seen holds the crossing.
      this.resume = false;
      if (f > 0) {
        this.prevIsNeighbour = false;
        this.step(t, f, g, rho);
      }
    } else if (!this.started) {
      this.started = true;
      if (f > 0) this.open(t, true);
      this.visit(t, f, Number.NaN);
    } else if ((g0 > 0 && g <= 0) || (g0 < 0 && g >= 0 && f0 > 0 && f > 0) || f0 <= 0 !== f <= 0) {
      this.prevIsNeighbour = true;
      this.step(t, f, g, rho);
    } else if (this.inPass && f > this.bestF) {
      this.bestF = f;
      this.bestT = t;
      this.bestElRad = Number.NaN;
    }
    this.prevT = t;
    this.prevF = f;
    this.prevG = g;
    this.prevRho = rho;
    if (!this.inPass && f < 0) this.skipAhead(t, -f, rho);
  }

  /**
   * Below the mask by sin(mask) − sin(el) = Δ at range ρ: with the earth-fixed speed ≤ V, the range
   * stays ≥ ρ − Vτ and sin(el) climbs at most ∫ V/(ρ − Vτ) dτ = ln(ρ/(ρ − Vτ)), so the mask is not
   * reached before τ = ρ(1 − e^(−Δ))/V ≥ ρΔ/((1 + Δ)V). Skip the samples before that (within the chunk,
   * whose speed bound this is).
   */
  private skipAhead(t: number, belowS: number, rhoM: number): void {
    const tauS = (rhoM * belowS) / ((1 + belowS) * this.ev.chunkSpeedBoundMPerS);
    if (!(tauS > 2 * this.ev.gridStepS)) return;
    this.skipUntilT = Math.min(t + tauS, this.ev.chunkEndTtJ2000S);
    this.resume = true;
  }

  /** Close a pass still open at the window end. */
  finish(): void {
    if (this.started && this.inPass) this.close(this.prevT, true);
  }

  private step(t: number, f: number, g: number, rho: number): void {
    const t0 = this.prevT;
    const f0 = this.prevF;
    const g0 = this.prevG;
    const rho0 = this.prevRho;
    const isMax = g0 > 0 && g <= 0;
    // Interior extremum: locate it so that each sub-interval is monotonic.
    if (isMax || (g0 < 0 && g >= 0 && f0 > 0 && f > 0)) {
      if (isMax && f0 <= 0 && f <= 0 && !this.mayReachMask(t - t0, f0, f, rho0, rho)) {
        this.visit(t, f, Number.NaN);
        return;
      }
      const d0 = g0 / (rho0 * rho0 * rho0);
      const d1 = g / (rho * rho * rho);
      const a0 = this.prevIsNeighbour ? this.secondRateOf(this.ev.prevSample) : Number.NaN;
      const gDot0 = this.egDot;
      const a1 = this.prevIsNeighbour ? this.secondRateOf(this.ev.sample) : Number.NaN;
      const gDot1 = this.egDot;
      let tk = t;
      let fk = f;
      let elk = Number.NaN;
      let ak = a1;
      if (g !== 0) {
        // g is smoother than sin(el) at a sharp culmination (linear in time for a straight pass
        // overhead): the root of its cubic Hermite when its rates are known, else the extremum of f's.
        const guess = clampInside(
          this.prevIsNeighbour ? hermiteRootGuessS(g0, gDot0, Number.NaN, g, gDot1, Number.NaN, t - t0) : hermiteExtremumGuessS(f0, d0, a0, f, d1, a1, t - t0),
          t - t0,
        );
        let evaluated = false;
        if (isMax && f0 <= 0 && f <= 0) {
          // A maximum that may reach the mask: one state near it usually settles that it does not.
          this.evalAt(t0 + guess);
          evaluated = true;
          if (this.ef <= 0 && !this.mayReachMaskFromEvaluation()) {
            this.visit(t, f, Number.NaN);
            return;
          }
        }
        tk = this.refine(true, t0, g0, t, g, guess, `elevation rate for station ${this.station.id}`, evaluated);
        if (Number.isNaN(this.rootOffsetS)) {
          this.evalAt(tk);
          this.rootOffsetS = 0;
        }
        this.knotValues(this.rootOffsetS);
        fk = this.knotF;
        elk = this.knotElRad;
        ak = this.knotA;
      }
      this.segment(t0, f0, d0, a0, tk, fk, 0, ak);
      this.visit(tk, fk, elk);
      this.segment(tk, fk, 0, ak, t, f, d1, a1);
    } else if ((f0 <= 0 && f > 0) || (f0 > 0 && f <= 0)) {
      const a0 = this.prevIsNeighbour ? this.secondRateOf(this.ev.prevSample) : Number.NaN;
      const a1 = this.prevIsNeighbour ? this.secondRateOf(this.ev.sample) : Number.NaN;
      this.segment(t0, f0, g0 / (rho0 * rho0 * rho0), a0, t, f, g / (rho * rho * rho), a1);
    }
    this.visit(t, f, Number.NaN);
  }

  /**
   * Whether sin(elevation) may reach sin(mask) inside the bin of width h [s] whose ends are below
   * it (f0, f1 ≤ 0, ranges rho0M, rho1M), from the speed bound of the module comment.
   */
  private mayReachMask(h: number, f0: number, f1: number, rho0M: number, rho1M: number): boolean {
    const a = this.ev.prevSample;
    const b = this.ev.sample;
    const r0 = Math.hypot(a[0], a[1], a[2]);
    const r1 = Math.hypot(b[0], b[1], b[2]);
    const vMax = Math.max(Math.hypot(a[3], a[4], a[5]), Math.hypot(b[3], b[4], b[5]));
    const v = earthFixedSpeedBoundMPerS(vMax, Math.min(r0, r1), Math.max(r0, r1), 0.5 * h);
    const rhoLow = 0.5 * (rho0M + rho1M - v * h);
    this.binSpeedBoundMPerS = v;
    this.binRangeLowM = rhoLow;
    this.binAccelBoundMPerS2 = earthFixedAccelBoundMPerS2(v, Math.min(r0, r1), Math.max(r0, r1), 0.5 * h);
    if (!(rhoLow > 0)) return true;
    return f0 + f1 + (v * h) / rhoLow > 0;
  }

  /**
   * After {@link mayReachMask} of the same bin and an evaluation inside it (ef, ed): whether sin(el)
   * may reach sin(mask) in the bin. |d²ρ̂/dt²| ≤ |a|/ρ + 3V²/ρ², so sin(el) stays under the parabola
   * f + ḟ·τ + Mτ²/2 of the evaluated point, whose top is f + ḟ²/(2M).
   */
  private mayReachMaskFromEvaluation(): boolean {
    const rho = this.binRangeLowM;
    if (!(rho > 0) || !Number.isFinite(this.binAccelBoundMPerS2)) return true;
    const v = this.binSpeedBoundMPerS;
    const m = this.binAccelBoundMPerS2 / rho + (3 * v * v) / (rho * rho);
    return this.ef + (this.ed * this.ed) / (2 * m) > 0;
  }

  /** Monotonic piece [ta, tb] with values, rates and second rates (NaN: unknown) at its ends: at most one mask crossing. */
  private segment(ta: number, fa: number, da: number, aa: number, tb: number, fb: number, db: number, ab: number): void {
    if (fa <= 0 && fb > 0) {
      this.open(this.crossing(ta, fa, da, aa, tb, fb, db, ab, 'AOS'), false);
    } else if (fa > 0 && fb <= 0) {
      this.close(this.crossing(ta, fa, da, aa, tb, fb, db, ab, 'LOS'), false);
    }
  }

  private crossing(ta: number, fa: number, da: number, aa: number, tb: number, fb: number, db: number, ab: number, what: string): number {
    if (fa === 0) return ta;
    if (fb === 0) return tb;
    return this.refine(false, ta, fa, tb, fb, hermiteRootGuessS(fa, da, aa, fb, db, ab, tb - ta), `${what} for station ${this.station.id}`);
  }

  /** f, df/dt, g, dg/dt and d²f/dt² (model) at t into ef, ed, eg, egDot, edd. */
  private evalAt(t: number): void {
    this.valuesOf(this.ev.at(t));
  }

  /** The values of {@link evalAt} from an earth-fixed state (position m, velocity m/s). */
  private valuesOf(e: Float64Array): void {
    const x = e[0];
    const y = e[1];
    const z = e[2];
    const vx = e[3];
    const vy = e[4];
    const vz = e[5];
    const dx = x - this.px;
    const dy = y - this.py;
    const dz = z - this.pz;
    const u = dx * this.ux + dy * this.uy + dz * this.uz;
    const rho2 = dx * dx + dy * dy + dz * dz;
    const rho = Math.sqrt(rho2);
    const uv = vx * this.ux + vy * this.uy + vz * this.uz;
    const rv = dx * vx + dy * vy + dz * vz;
    const g = uv * rho2 - u * rv;
    this.ef = u / rho - this.sinMask;
    this.ed = g / (rho2 * rho);
    this.eg = g;
    // Earth-fixed acceleration: gravity to J2, Coriolis −2ω×v and centrifugal −ω×(ω×r).
    const w = WGS84_OMEGA_RAD_PER_S;
    const r2 = x * x + y * y + z * z;
    const k = -WGS84_GM_M3_PER_S2 / (r2 * Math.sqrt(r2));
    const j = (1.5 * EARTH_J2 * WGS84_A_M * WGS84_A_M) / r2;
    const zz = (5 * z * z) / r2;
    const kxy = k * (1 - j * (zz - 1));
    const ax = kxy * x + 2 * w * vy + w * w * x;
    const ay = kxy * y - 2 * w * vx + w * w * y;
    const az = k * (1 - j * (zz - 3)) * z;
    this.eax = ax;
    this.eay = ay;
    this.eaz = az;
    const ua = ax * this.ux + ay * this.uy + az * this.uz;
    const ra = dx * ax + dy * ay + dz * az;
    this.egDot = ua * rho2 + uv * rv - u * (vx * vx + vy * vy + vz * vz + ra);
    // f' = g/ρ³, so f'' = g'/ρ³ − 3g(ρ·v)/ρ⁵.
    this.edd = this.egDot / (rho2 * rho) - (3 * g * rv) / (rho2 * rho2 * rho);
  }

  /** d²f/dt² [1/s²] at a grid sample's earth-fixed state (leaves the evaluation values changed). */
  private secondRateOf(e: Float64Array): number {
    this.valuesOf(e);
    return this.edd;
  }

  /**
   * f and the elevation [rad] (atan2 of the up and horizontal components, full precision at the
   * zenith) at `offsetS` from the last evaluated state, by a second-order Taylor step of its
   * position (offsets ≤ 0.1 s: the dropped third-order term is below a few millimetres), into knotF and knotElRad.
   */
  private knotValues(offsetS: number): void {
    const e = this.ev.state;
    const h2 = 0.5 * offsetS * offsetS;
    const dx = e[0] + e[3] * offsetS + this.eax * h2 - this.px;
    const dy = e[1] + e[4] * offsetS + this.eay * h2 - this.py;
    const dz = e[2] + e[5] * offsetS + this.eaz * h2 - this.pz;
    const u = dx * this.ux + dy * this.uy + dz * this.uz;
    const rho2 = dx * dx + dy * dy + dz * dz;
    this.knotF = u / Math.sqrt(rho2) - this.sinMask;
    this.knotElRad = Math.atan2(u, Math.sqrt(Math.max(0, rho2 - u * u)));
    this.knotA = this.edd;
  }

  private fAt = (t: number): number => {
    this.evalAt(t);
    return this.ef;
  };
  private gAt = (t: number): number => {
    this.evalAt(t);
    return this.eg;
  };

  /**
   * Root of g (`onRate`) or f on [ta, tb], whose end values va, vb have opposite signs, from the
   * first guess `guessS` (offset from ta): the safeguarded Newton iteration of the module comment.
   * Sets {@link rootOffsetS}.
   */
  private refine(onRate: boolean, ta: number, va: number, tb: number, vb: number, guessS: number, what: string, evaluated = false): number {
    let lo = 0;
    let hi = tb - ta;
    let vlo = va;
    let vhi = vb;
    let x = clampInside(guessS, hi);
    // The previous point of the secant check: the bracket end nearer the guess.
    let xPrev = x - lo <= hi - x ? lo : hi;
    let vPrev = xPrev === lo ? vlo : vhi;
    const relativeRateError = onRate ? G_RATE_RELATIVE_ERROR : F_RATE_RELATIVE_ERROR;
    const slopeMismatch = onRate ? G_SLOPE_MISMATCH : F_SLOPE_MISMATCH;
    for (let k = 0; k < NEWTON_MAX_ITERATIONS; k++) {
      if (k > 0 || !evaluated) this.evalAt(ta + x);
      const v = onRate ? this.eg : this.ef;
      const rate = onRate ? this.egDot : this.ed;
      if (v === 0) {
        this.rootOffsetS = 0;
        return ta + x;
      }
      if (v < 0 === vlo < 0) {
        lo = x;
        vlo = v;
      } else {
        hi = x;
        vhi = v;
      }
      const stepS = -v / rate;
      const size = Math.abs(stepS);
      // |F''/F'| ≈ 2·mismatch/|x − xPrev| from the secant; the corrected time's error ≈ |F''/(2F')|·step².
      const mismatch = Math.abs((v - vPrev) / (x - xPrev) - rate) / Math.abs(rate);
      const predictedErrorS = (4 * mismatch * size * size) / Math.abs(x - xPrev) + relativeRateError * size;
      if (mismatch <= slopeMismatch && (size <= NEGLIGIBLE_STEP_S || (size <= MAX_FINAL_STEP_S && predictedErrorS <= STOP_ERROR_S))) {
        const xr = Math.min(hi, Math.max(lo, x + stepS));
        this.rootOffsetS = xr - x;
        return ta + xr;
      }
      if (hi - lo <= TIME_TOLERANCE_S) {
        this.rootOffsetS = Number.NaN;
        return ta + 0.5 * (lo + hi);
      }
      xPrev = x;
      vPrev = v;
      const next = x + stepS;
      x = next > lo && next < hi ? next : 0.5 * (lo + hi);
    }
    this.rootOffsetS = Number.NaN;
    return bracketedRoot(onRate ? this.gAt : this.fAt, ta + lo, ta + hi, vlo, vhi, TIME_TOLERANCE_S, what);
  }

  /** A knot or grid sample inside the current pass may be its culmination (elRad: NaN for a grid sample). */
  private visit(t: number, f: number, elRad: number): void {
    if (this.inPass && f > this.bestF) {
      this.bestF = f;
      this.bestT = t;
      this.bestElRad = elRad;
    }
  }

  private open(t: number, truncated: boolean): void {
    this.inPass = true;
    this.aosT = t;
    this.aosTruncated = truncated;
    this.bestF = -Infinity;
    this.bestT = t;
  }

  private close(t: number, truncated: boolean): void {
    this.inPass = false;
    const durationS = t - this.aosT;
    const anyTruncated = truncated || this.aosTruncated;
    if (!anyTruncated && durationS < this.station.minPassS) return;
    // A pass that only touches the mask has no knot above it: culminate at its AOS.
    const tca = Number.isFinite(this.bestF) ? this.bestT : this.aosT;
    const bestElRad = Number.isNaN(this.bestElRad) ? Math.asin(Math.min(1, this.bestF + this.sinMask)) : this.bestElRad;
    const maxElevationDeg = Number.isFinite(this.bestF) ? bestElRad / DEG : this.station.maskDeg;
    this.passes.push({
      satelliteId: this.satelliteId,
      stationId: this.station.id,
      aosTtJ2000S: this.aosT,
      tcaTtJ2000S: tca,
      losTtJ2000S: t,
      maxElevationDeg,
      durationS,
      truncated: anyTruncated,
      aosTruncated: this.aosTruncated,
      losTruncated: truncated,
    });
  }
}
