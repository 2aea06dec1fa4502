/**
 * A broadcast navigation record's clock as a receiver uses it (IS-GPS-200 §20.3.3.3.3.1 and
 * Table 20-IV; Galileo OS SIS ICD §5.1.4): the af polynomial about toc plus the periodic
 * relativistic term Δt_r = F·e·√A·sin E from the record's own Keplerian elements. Pure.
 */
import { eccentricAnomalyRad } from '../orbit/keplerian.ts';
import { clockPolynomialS, navClockFormat, relativisticCorrectionS, type NavSystem } from './navMessage.ts';

/** The clock and orbit-shape fields of one GPS LNAV or Galileo record. */
export interface BroadcastClockRecord {
  /** Satellite id as written, e.g. `G05`, `E11`. */
  satellite: string;
  system: NavSystem;
  /** 1-based line of the record's first line in its file. */
  line: number;
  /** toc, s since J2000.0 TT (from the GPST or GST label). */
  tocTtJ2000S: number;
  af0S: number;
  af1: number;
  af2PerS: number;
  /** toe, s since J2000.0 TT (week of the record and toe seconds of week). */
  toeTtJ2000S: number;
  sqrtAM: number;
  e: number;
  /** Mean anomaly at toe [rad]. */
  m0Rad: number;
  /** Mean motion difference [rad/s]. */
  deltaNRadPerS: number;
  /** Transmission time of the message, s since J2000.0 TT. */
  transmissionTtJ2000S: number;
  /** GPS: fit interval [s] (0 in the file means 4 h). Galileo: null (not broadcast). */
  fitIntervalS: number | null;
  /** Galileo data-source bits (RINEX 3.05 Table A8), null for GPS. */
  dataSources: number | null;
  /** SV health word as written. */
  health: number;
}

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
