/**
 * Element-set records as the parsers produce them (TLE / 3LE, CCSDS OMM with SGP4 mean elements).
 * Plain data: `src/io/tle.ts` and `src/io/omm.ts` read them from text, `src/orbit/sgp4.ts`
 * propagates them, `src/plan/catalogue.ts` sizes them.
 */
import type { CivilTime } from '../time/timeSystem.ts';

/** One element set read from a TLE or 3LE file. Angles are those written in the file (degrees). */
export interface TleRecord {
  readonly kind: 'tle';
  /** The name line without a leading "0 ", trimmed; null for a bare two-line set. */
  readonly name: string | null;
  /** Catalogue number as written in columns 3–7 (e.g. "00005", or Alpha-5 "A0001"). */
  readonly catalogNumber: string;
  /** Catalogue number as an integer (Alpha-5 decoded: A0001 → 100001). */
  readonly catalogNumberValue: number;
  /** Classification character, column 8 ('U', 'C', 'S' or blank). */
  readonly classification: string;
  /** International designator, columns 10–17, trimmed (may be empty). */
  readonly internationalDesignator: string;
  /** Epoch year, four digits (two-digit 57–99 → 19xx, 00–56 → 20xx, as SGP4 does). */
  readonly epochYear: number;
  /** Epoch day of year, 1-based and fractional (1.5 = 1 January 12:00 UTC). UTC. */
  readonly epochDayOfYear: number;
  /** The epoch as a UTC civil time (days of 86400 s; a TLE cannot express a leap second). */
  readonly epochUtc: CivilTime;
  /** Mean motion [rev/day] (Kozai mean motion, SGP4 theory). */
  readonly meanMotionRevPerDay: number;
  /** Eccentricity [1]. */
  readonly eccentricity: number;
  /** Inclination [deg]. */
  readonly inclinationDeg: number;
  /** Right ascension of the ascending node [deg] (TEME). */
  readonly raanDeg: number;
  /** Argument of perigee [deg]. */
  readonly argOfPerigeeDeg: number;
  /** Mean anomaly [deg]. */
  readonly meanAnomalyDeg: number;
  /** B* drag term [1/earth radii]. */
  readonly bstarPerEarthRadius: number;
  /** Line 1 exactly as in the file (69 characters, trailing whitespace removed). */
  readonly line1: string;
  /** Line 2 exactly as in the file. */
  readonly line2: string;
  /** 1-based line number of line 1 in the file. */
  readonly lineNumberInFile: number;
  /** 1-based line number of the name line, or null. */
  readonly nameLineNumberInFile: number | null;
  /** File name, for messages. */
  readonly fileName: string;
}

/** One OMM with SGP4 mean elements. */
export interface OmmRecord {
  readonly kind: 'omm';
  /** OBJECT_NAME, or null when absent. */
  readonly objectName: string | null;
  /** OBJECT_ID (international designator, e.g. "1958-002B"), or null. */
  readonly objectId: string | null;
  /** NORAD_CAT_ID as written (e.g. "5"), or null. */
  readonly noradCatId: string | null;
  /** EPOCH exactly as written (UTC; no zone suffix or a trailing Z). */
  readonly epochText: string;
  /** EPOCH as a UTC civil time. */
  readonly epochUtc: CivilTime;
  /** MEAN_MOTION [rev/day] (Kozai mean motion, SGP4 theory). */
  readonly meanMotionRevPerDay: number;
  /** ECCENTRICITY [1]. */
  readonly eccentricity: number;
  /** INCLINATION [deg]. */
  readonly inclinationDeg: number;
  /** RA_OF_ASC_NODE [deg] (TEME). */
  readonly raanDeg: number;
  /** ARG_OF_PERICENTER [deg]. */
  readonly argOfPericenterDeg: number;
  /** MEAN_ANOMALY [deg]. */
  readonly meanAnomalyDeg: number;
  /** BSTAR [1/earth radii]; 0 when absent. */
  readonly bstarPerEarthRadius: number;
  /** MEAN_MOTION_DOT [rev/day²] as in the TLE (half the derivative); 0 when absent. Not used by SGP4. */
  readonly meanMotionDotRevPerDay2: number;
  /** MEAN_MOTION_DDOT [rev/day³] (one sixth of the second derivative); 0 when absent. Not used by SGP4. */
  readonly meanMotionDdotRevPerDay3: number;
  /** EPHEMERIS_TYPE; 0 when absent. */
  readonly ephemerisType: number;
  /** CLASSIFICATION_TYPE ('U' when absent). */
  readonly classificationType: string;
  /** ELEMENT_SET_NO, or null. */
  readonly elementSetNo: number | null;
  /** REV_AT_EPOCH, or null. */
  readonly revAtEpoch: number | null;
  /** Every keyword read, as text (values only; units dropped). */
  readonly keywords: Readonly<Record<string, string>>;
  /** Where the message came from, for error messages: `file:line` (KVN) or `file: omm[2]`. */
  readonly where: string;
}

/** Either kind of element set. */
export type ElementSetRecord = TleRecord | OmmRecord;
