/**
 * A broadcast navigation record's clock and orbit-shape fields as read (`src/io/rinexNav.ts` parses
 * them; `src/clock/broadcast.ts` evaluates them). Plain data.
 */

/** Navigation message family: GPS LNAV or Galileo (I/NAV, F/NAV). */
export type NavSystem = 'gps' | 'galileo';

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
