/**
 * A CCSDS Orbit Ephemeris Message as read (`src/io/oem.ts` parses it; `src/orbit/oem.ts`
 * interpolates it). Plain data: epochs already converted to seconds since J2000.0 TT.
 */

/** Reference frames read (CCSDS 502.0-B-3 Annex B / SANA registry names). */
export type OemFrame = 'EME2000' | 'GCRF' | 'ITRF' | 'TEME';

/** One ephemeris data line. */
export interface OemNode {
  ttJ2000S: number;
  /** Position [km] and velocity [km/s] in the segment's frame. */
  positionKm: readonly [number, number, number];
  velocityKmPerS: readonly [number, number, number];
  /** 1-based line in the file. */
  line: number;
}

/** One segment: metadata and data lines. */
export interface OemSegment {
  objectName: string;
  objectId: string;
  centerName: string;
  frame: OemFrame;
  /** REF_FRAME as written (ITRF-93, ITRF2000, ... are read as ITRF). */
  frameText: string;
  timeSystem: string;
  /** Usable span, s since J2000.0 TT (USEABLE_START/STOP_TIME, else START/STOP_TIME). */
  usableFromTtJ2000S: number;
  usableToTtJ2000S: number;
  interpolation: 'LAGRANGE' | 'HERMITE';
  /** INTERPOLATION_DEGREE (polynomial degree). */
  degree: number;
  /** Line of META_START. */
  line: number;
  nodes: OemNode[];
}

/** A whole OEM. */
export interface OemFile {
  fileName: string;
  version: string;
  originator: string;
  segments: OemSegment[];
}
