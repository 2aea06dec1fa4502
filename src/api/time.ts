/** Library use case: reading an instant (command `time`). */
import { Instant } from '../time/instant.ts';
import { timeSystemOf, type CommonOptions } from './common.ts';

/**
 * Read an ISO 8601 time as the CLI does: a trailing `Z` means UTC (a leap second `23:59:60` is
 * accepted), a space and a scale name selects that scale (`2027-03-01T00:00:00 GPS`, `TAI`, `TT`,
 * `GST`, `BDT`). The Instant holds TAI seconds; format it with `TimeSystem#format`.
 * @throws TimeError naming what is wrong with the text
 */
export function parseInstant(text: string, options?: CommonOptions & { where?: string }): Instant {
  return timeSystemOf(options).parse(text, options?.where ?? 'time');
}

/** The default time system (packaged leap-second table), for formatting and converting instants. */
export function defaultTimeSystem(): ReturnType<typeof timeSystemOf> {
  return timeSystemOf(undefined);
}
