/**
 * Predicted clocks for `tauplan navclock`: from a scenario satellite (oscillator model plus
 * integrated relativity) or from a clock fit to measurements. Both give the prediction with the
 * periodic relativistic term −2 r·v/c² removed, as the navigation message needs. Pure.
 */
import { conventionalPeriodicS } from '../clock/rate.ts';
import { isLunarOrbiter } from '../orbit/lunarOrbit.ts';
import { periodicTermAtS } from './lunarPasses.ts';
import { predictionSigmaNs, Z95 } from '../clock/noise.ts';
import { allocStateBlock } from '../orbit/trajectory.ts';
import type { FitResult } from './fit.ts';
import type { PredictedClock } from './navclock.ts';
import type { SatelliteClockRun } from './satelliteClock.ts';

const SECONDS_PER_DAY = 86_400;

/**
 * A scenario satellite's clock: offset from the oscillator model and integrated relativity, minus
 * −2 r·v/c² along its orbit; band ±1.96·σx(τ) from its noise levels (0 without a noise model).
 */
export function predictedFromRun(run: SatelliteClockRun): PredictedClock {
  const noise = run.clock.params?.noise ?? null;
  return {
    satellite: run.id,
    endTtJ2000S: run.endTtJ2000S,
    bandNs: (ageS) => (noise === null ? 0 : Z95 * predictionSigmaNs(noise, ageS)),
    sampleNs(t, out) {
      const block = allocStateBlock(t.length);
      run.trajectory.sampleInto(t, block);
      const p = block.positionM;
      const v = block.velocityMPerS;
      const lunar = isLunarOrbiter(run.trajectory);
      for (let i = 0; i < t.length; i++) {
        // About the Moon the periodic pair is −2ρ·u/c² − v_M·ρ/c² (lunarPasses.ts), else −2r·v/c².
        const periodicNs = (lunar ? periodicTermAtS(run.trajectory, t[i]) : conventionalPeriodicS(p[3 * i], p[3 * i + 1], p[3 * i + 2], v[3 * i], v[3 * i + 1], v[3 * i + 2])) * 1e9;
        out[i] = run.clock.offsetNs(t[i]) - periodicNs;
      }
    },
  };
}

/**
 * A clock estimated by `fitClock` (with the periodic term removed there, epoch at the last
 * measurement) and extrapolated by its polynomial. Band: 1.96 × the 1-σ of the extrapolated
 * polynomial from the parameter covariance, combined (root sum of squares) with the residual RMS —
 * the fit's own evidence, no noise model. Ages count from the fit epoch.
 */
export function predictedFromFit(satellite: string, fit: FitResult, endTtJ2000S: number): PredictedClock {
  const y = fit.fractionalFrequency ?? 0;
  const dPerS = (fit.driftPerDay ?? 0) / SECONDS_PER_DAY;
  const sig = [fit.offsetSigmaNs ?? 0, (fit.fractionalFrequencySigma ?? 0) * 1e9, ((fit.driftPerDaySigma ?? 0) / SECONDS_PER_DAY) * 1e9];
  const corr = fit.correlation;
  const sigmaAt = (ageS: number): number => {
    const g = [sig[0], sig[1] * ageS, (sig[2] * ageS * ageS) / 2].slice(0, fit.degree + 1);
    let v = 0;
    for (let a = 0; a < g.length; a++) for (let b = 0; b < g.length; b++) v += g[a] * g[b] * (corr === null ? (a === b ? 1 : 0) : corr[a][b]);
    return Math.sqrt(Math.max(0, v) + fit.rmsNs * fit.rmsNs);
  };
  return {
    satellite,
    endTtJ2000S,
    bandNs: (ageS) => Z95 * sigmaAt(ageS),
    sampleNs(t, out) {
      for (let i = 0; i < t.length; i++) {
        const dt = t[i] - fit.epochTtJ2000S;
        out[i] = fit.offsetNs + 1e9 * (y * dt + 0.5 * dPerS * dt * dt);
      }
    },
  };
}
