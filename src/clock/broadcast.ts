/**
 * A broadcast navigation record's clock as a receiver uses it (IS-GPS-200 §20.3.3.3.3.1 and
 * Table 20-IV; Galileo OS SIS ICD §5.1.4): the af polynomial about toc plus the periodic
 * relativistic term Δt_r = F·e·√A·sin E from the record's own Keplerian elements. Pure.
 */
import { eccentricAnomalyRad } from '../orbit/keplerian.ts';
import type { BroadcastClockRecord } from '../model/broadcastNav.ts';
import { clockPolynomialS, navClockFormat, relativisticCorrectionS } from './navMessage.ts';

export type { BroadcastClockRecord } from '../model/broadcastNav.ts';

/** Mean motion n = √(μ/A³) + Δn [rad/s]. */
function meanMotionRadPerS(r: BroadcastClockRecord, muM3PerS2: number): number {
  const a = r.sqrtAM * r.sqrtAM;
  return Math.sqrt(muM3PerS2 / (a * a * a)) + r.deltaNRadPerS;
}

/** Δt_r = F·e·√A·sin E_k at a time (s since J2000.0 TT), E_k from M0 + n·(t − toe) [s]. */
export function broadcastRelativisticS(r: BroadcastClockRecord, ttJ2000S: number): number {
  const fmt = navClockFormat(r.system);
  const m = r.m0Rad + meanMotionRadPerS(r, fmt.muM3PerS2) * (ttJ2000S - r.toeTtJ2000S);
  return relativisticCorrectionS(fmt.fSPerSqrtM, r.e, r.sqrtAM, eccentricAnomalyRad(m, r.e));
}

/** The broadcast polynomial alone, af0 + af1·(t − toc) + af2·(t − toc)² [s]. */
export function broadcastPolynomialS(r: BroadcastClockRecord, ttJ2000S: number): number {
  return clockPolynomialS(r, ttJ2000S - r.tocTtJ2000S);
}
