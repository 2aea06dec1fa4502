/**
 * The mean rate of a clock near the Moon over a span, with its split into the Earth, Moon, Sun and
 * velocity parts (../clock/lunarRate.ts), as the slope of least-squares lines through the
 * integrated parts, like `size` does for Earth orbits.
 *
 * Periodic terms removed before the slopes (for orbiters; a surface clock has none at its own
 * period): −2ρ·u/c² (the Moon's field; half from the Moon part, half from the velocity part, as the
 * two share it equally for two-body motion) and the cross term −v_M·ρ/c² (from the velocity part).
 * Left in: the monthly variation of the Earth–Moon distance and speed (0.47 µs amplitude at the
 * anomalistic month for a surface clock). Over a span of whole anomalistic months it averages out;
 * over one day it shifts a slope by up to 0.11 µs/day, common to every clock near the Moon, so it
 * cancels in rates against the lunar surface reference.
 */
import { GAUSS_POINTS_PER_STEP, integrateBulkAlong, nodeQuadratureWeights } from '../clock/integrate.ts';
import { lunarPeriodicTermsS, lunarRateParts, type LunarExternalField, type LunarRateParts } from '../clock/lunarRate.ts';
import type { GravityModel } from '../orbit/gravity.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { halfRangeAboutLine, lineFit } from './size.ts';

/** The anomalistic month [s] (27.554550 d; Explanatory Supplement 3rd ed., from memory). */
export const ANOMALISTIC_MONTH_S = 27.55455 * 86_400;

/** Result of {@link analyseLunarRate}. Rates dimensionless, amplitudes in seconds. */
export interface LunarRateAnalysis {
  /** Slope of the proper-time offset vs TT after the periodic terms are removed. */
  meanFractionalOffset: number;
  /** The parts' slopes; their sum is `meanFractionalOffset`. */
  parts: LunarRateParts;
  /** (x(end) − x(start))/span: the plain time mean of y. */
  spanMeanFractionalOffset: number;
  /** Half the peak-to-peak of −2ρ·u/c² over the span [s]. */
  moonFieldPeriodicAmplitudeS: number;
  /** Half the peak-to-peak of −v_M·ρ/c² over the span [s]. */
  crossTermAmplitudeS: number;
  /** Half the peak-to-peak of the offset after the line and the removed terms [s]. */
  residualAmplitudeS: number;
  /** Integration step [s] and nodes evaluated. */
  stepS: number;
  states: number;
  /** Node times (TT s since J2000.0) and offsets with the periodic terms removed [s], for plots and checks. */
  nodeTtJ2000S: Float64Array;
  nodeOffsetS: Float64Array;
}

/**
 * Integrate a clock's rate along `traj` over [from, from + span] with the lunar-era model and fit
 * the slopes. `removePeriodic` false for clocks at rest on the Moon (their ρ·u is zero up to the
 * libration; the cross term is then the surface point's offset from the Moon's centre, kept).
 */
export function analyseLunarRate(
  traj: Trajectory,
  earth: GravityModel,
  field: LunarExternalField,
  fromTtJ2000S: number,
  spanS: number,
  maxStepS: number,
  removePeriodic: boolean,
): LunarRateAnalysis {
  const stepCount = Math.max(1, Math.ceil(spanS / maxStepS - 1e-9));
  const n = stepCount * GAUSS_POINTS_PER_STEP;
  const t = new Float64Array(n);
  const pMoon = new Float64Array(n);
  const pCross = new Float64Array(n);
  const nodes = [0, 1, 2, 3].map(() => new Float64Array(n));
  let filled = 0;
  const rho = new Float64Array(3);
  const u = new Float64Array(3);
  const vm = new Float64Array(3);
  const tracks = integrateBulkAlong(
    traj,
    fromTtJ2000S,
    fromTtJ2000S + spanS,
    maxStepS,
    4,
    (r, v, count, outs, times) => {
      for (let i = 0; i < count; i++) {
        const p = lunarRateParts(earth, field, times[i], r[3 * i], r[3 * i + 1], r[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2]);
        outs[0][i] = p.earth;
        outs[1][i] = p.moon;
        outs[2][i] = p.sun;
        outs[3][i] = p.velocity;
      }
    },
    (times, block, count) => {
      for (let i = 0; i < count; i++, filled++) {
        t[filled] = times[i];
        if (!removePeriodic) continue;
        const m = field.moonTemeAt(times[i]);
        for (let c = 0; c < 3; c++) {
          rho[c] = block.positionM[3 * i + c] - m[c];
          u[c] = block.velocityMPerS[3 * i + c] - m[3 + c];
          vm[c] = m[3 + c];
        }
        const p = lunarPeriodicTermsS(rho, u, vm);
        pMoon[filled] = p.moonField;
        pCross[filled] = p.crossTerm;
      }
    },
    nodes,
    false,
  );
  const [xe, xm, xs, xv] = nodes;
  const total = new Float64Array(n);
  const moonPart = new Float64Array(n);
  const velPart = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    moonPart[i] = xm[i] - 0.5 * pMoon[i];
    velPart[i] = xv[i] - 0.5 * pMoon[i] - pCross[i];
    total[i] = xe[i] + moonPart[i] + xs[i] + velPart[i];
  }
  const w = nodeQuadratureWeights(n);
  const lt = lineFit(t, total, w);
  const residualAmplitudeS = halfRangeAboutLine(t, total, lt);
  const halfRange = (a: Float64Array): number => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const x of a) {
      lo = Math.min(lo, x);
      hi = Math.max(hi, x);
    }
    return (hi - lo) / 2;
  };
  return {
    meanFractionalOffset: lt.slope,
    parts: { earth: lineFit(t, xe, w).slope, moon: lineFit(t, moonPart, w).slope, sun: lineFit(t, xs, w).slope, velocity: lineFit(t, velPart, w).slope },
    spanMeanFractionalOffset: tracks.reduce((s, k) => s + k.total, 0) / spanS,
    moonFieldPeriodicAmplitudeS: removePeriodic ? halfRange(pMoon) : 0,
    crossTermAmplitudeS: removePeriodic ? halfRange(pCross) : 0,
    residualAmplitudeS,
    stepS: tracks[0].stepS,
    states: n,
    nodeTtJ2000S: t,
    nodeOffsetS: total,
  };
}
