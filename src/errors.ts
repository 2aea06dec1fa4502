/**
 * Typed errors. Every fault caused by input is an {@link InputError}: the CLI prints it as
 * `tauplan: <what> (<where>) — <fix>` and exits with code 2. Anything else is an internal
 * fault (exit 1).
 */

/** A fault in what the user gave us: a file, a flag, a field. */
export class InputError extends Error {
  /**
   * @param what  what is wrong, in a few words, with the value found
   * @param where file:line[:column], a JSON path, or a flag name
   * @param fix   how to fix it
   */
  constructor(
    readonly what: string,
    readonly where: string,
    readonly fix: string,
  ) {
    super(`${what} (${where}) — ${fix}`);
    this.name = 'InputError';
  }
}

/** A scenario file fault at a JSON path such as `satellites[2].clock.agingPerDay`. */
export class ScenarioError extends InputError {
  constructor(
    what: string,
    readonly path: string,
    fix: string,
  ) {
    super(what, path, fix);
    this.name = 'ScenarioError';
  }
}

/** A time or duration string that cannot be read, or an instant outside the supported span. */
export class TimeError extends InputError {
  constructor(what: string, where: string, fix: string) {
    super(what, where, fix);
    this.name = 'TimeError';
  }
}

/** An element-set or ephemeris file fault at file:line:column. */
export class OrbitFileError extends InputError {
  constructor(
    what: string,
    readonly file: string,
    readonly line: number,
    readonly column: number | null,
    fix: string,
  ) {
    super(what, column === null ? `${file}:${line}` : `${file}:${line}:${column}`, fix);
    this.name = 'OrbitFileError';
  }
}

/** A request outside the span where an orbit source is valid. */
export class SpanError extends InputError {
  constructor(
    what: string,
    readonly sourceId: string,
    readonly validFrom: string,
    readonly validTo: string,
    fix: string,
  ) {
    super(what, sourceId, fix);
    this.name = 'SpanError';
  }
}

/** SGP4 could not produce a state (decay, eccentricity out of range, ...). */
export class PropagationError extends InputError {
  constructor(
    what: string,
    readonly satelliteId: string,
    readonly atUtc: string,
    readonly code: string,
    fix: string,
  ) {
    super(what, `${satelliteId} at ${atUtc}`, fix);
    this.name = 'PropagationError';
  }
}

/** A bug: a quantity that should be finite is not, a loop that should converge did not. */
export class InternalError extends Error {
  constructor(
    message: string,
    readonly quantity?: string,
  ) {
    super(message);
    this.name = 'InternalError';
  }
}

/** Throw an InternalError when a computed number is NaN or infinite. */
export function assertFinite(value: number, quantity: string): number {
  if (!Number.isFinite(value)) throw new InternalError(`non-finite value for ${quantity}: ${value}`, quantity);
  return value;
}

/** A navigation-message coefficient that does not fit its bits (`tauplan navclock`). */
export class NavFieldOverflowError extends InputError {
  constructor(
    readonly satellite: string,
    readonly tocUtc: string,
    readonly field: string,
    readonly value: number,
    readonly limit: number,
    readonly bits: number,
  ) {
    super(
      `${field} ${value.toExponential(6)} does not fit its ${bits} bits (limit ${limit.toExponential(6)})`,
      `${satellite} set at toc ${tocUtc}`,
      'the clock is too far off for the message: adjust it first (tauplan resets), or check the clock block of the scenario',
    );
    this.name = 'NavFieldOverflowError';
  }
}
