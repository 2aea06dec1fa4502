/**
 * An SP3-c / SP3-d precise ephemeris as read (`src/io/sp3.ts` parses it; `src/orbit/sp3.ts`
 * interpolates it). Plain data: epochs stay civil labels in the file's time system.
 */
import type { TimeScale } from '../time/instant.ts';
import type { CivilTime } from '../time/timeSystem.ts';

/** One satellite's `P` record (and its `V` record, when present) at one epoch. */
export interface Sp3Record {
  /** Satellite id as in the `+` list, e.g. `G05`, `L51`. */
  readonly satelliteId: string;
  /** 1-based line of the `P` record. */
  readonly line: number;
  /** Earth-fixed position [km] in the file's coordinate system; null when the file marks it bad (all zero). */
  readonly positionKm: readonly [number, number, number] | null;
  /** Clock correction [µs]; null when bad (999999.999999). */
  readonly clockUs: number | null;
  /** Standard-deviation exponents for x, y, z, clock (value = base^exponent, mm / psec); null when blank. */
  readonly sdevExponents: readonly [number | null, number | null, number | null, number | null];
  /** Column 75 `E`: a discontinuity in the satellite clock (clock event). */
  readonly clockEvent: boolean;
  /** Column 76 `P`: the clock value is predicted. */
  readonly clockPredicted: boolean;
  /** Column 79 `M`: an orbit maneuver took place between the previous epoch and this one. */
  readonly maneuver: boolean;
  /** Column 80 `P`: the position is predicted. */
  readonly orbitPredicted: boolean;
  /** The `V` record that followed, or null. */
  readonly velocity: Sp3VelocityRecord | null;
}

/** A `V` record: earth-fixed velocity and clock rate. */
export interface Sp3VelocityRecord {
  readonly line: number;
  /** Earth-fixed velocity [dm/s]; null when the file marks it bad (all zero). */
  readonly velocityDmPerS: readonly [number, number, number] | null;
  /** Clock rate [10⁻⁴ µs/s]; null when bad (999999.999999). */
  readonly clockRate1e4UsPerS: number | null;
}

/** One epoch block. */
export interface Sp3Epoch {
  /** 1-based line of the `*` record. */
  readonly line: number;
  /** Epoch as written, in the file's time system (`Sp3File.timeSystemCode`). */
  readonly civil: CivilTime;
  /** The same epoch as a label in `Sp3File.timeScale` (differs from `civil` only for GLO: −3 h). */
  readonly scaleCivil: CivilTime;
  /** Label seconds since 1970-01-01 of the file's time system (86400 s per day), whole part. */
  readonly labelWholeS: number;
  /** Fraction of a second, 0 ≤ labelFracS < 1. */
  readonly labelFracS: number;
  /** Records by satellite id, in file order. */
  readonly records: ReadonlyMap<string, Sp3Record>;
}

/** A whole SP3 file. */
export interface Sp3File {
  readonly fileName: string;
  /** `c` or `d`. */
  readonly version: 'c' | 'd';
  /** Header line 1 column 3 was `V`: the file carries velocity records. */
  readonly hasVelocities: boolean;
  /** Start epoch from line 1, in the file's time system. */
  readonly startCivil: CivilTime;
  /** Number of epochs declared in line 1 (checked against the file). */
  readonly epochCount: number;
  readonly dataUsed: string;
  /** Coordinate system label (`IGS20`, `ITRF`, ...). Positions are earth-fixed in it. */
  readonly coordinateSystem: string;
  readonly orbitType: string;
  readonly agency: string;
  readonly gpsWeek: number;
  readonly secondsOfWeek: number;
  /** Nominal epoch interval [s]. */
  readonly intervalS: number;
  readonly mjdStart: number;
  readonly fractionalDay: number;
  /** Satellite ids from the `+` lines, in order. */
  readonly satelliteIds: readonly string[];
  /** Accuracy exponent per satellite from the `++` lines (accuracy ≈ 2^exp mm; 0 = unknown). */
  readonly accuracyExponents: ReadonlyMap<string, number>;
  /** File type from `%c` columns 4–5 (`G`, `M`, `R`, `E`, `C`, `J`, `L`, ...). */
  readonly fileType: string;
  /** Time system as written in `%c` columns 10–12: GPS, GLO, GAL, TAI, UTC, QZS, BDT, IRN. */
  readonly timeSystemCode: string;
  /** tauplan time scale the epoch labels are read in (GLO → UTC with −3 h; QZS, IRN → GPS; GAL → GST). */
  readonly timeScale: TimeScale;
  /** Base for position/velocity standard deviations (`%f`), null when 0 or absent. */
  readonly basePosVel: number | null;
  /** Base for clock standard deviations (`%f`), null when 0 or absent. */
  readonly baseClock: number | null;
  /** `/*` comment text, without the leading `/* `. */
  readonly comments: readonly string[];
  readonly epochs: readonly Sp3Epoch[];
}
