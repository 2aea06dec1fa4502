/**
 * Which passes may carry an adjustment: only stations that can uplink, outside the policy's
 * blackouts, and not sooner than the minimum spacing after the previous adjustment.
 */
import { InputError } from '../errors.ts';

/** A pass usable for an adjustment (already filtered by mask and minimum length); s since J2000.0 TT. */
export interface Contact {
  station: string;
  aosTtJ2000S: number;
  tcaTtJ2000S: number;
  losTtJ2000S: number;
  /** False for a receive-only station (default true). */
  uplink?: boolean;
}

/** A span with no adjustments, for some satellites (null: all). */
export interface Blackout {
  startTtJ2000S: number;
  endTtJ2000S: number;
  satellites: string[] | null;
}

/** The blackout a pass overlaps for this satellite, or null. */
export function blackoutOf(c: Contact, satellite: string, blackouts: readonly Blackout[]): Blackout | null {
  for (const b of blackouts) {
    if (b.satellites !== null && !b.satellites.includes(satellite)) continue;
    if (c.aosTtJ2000S < b.endTtJ2000S && c.losTtJ2000S > b.startTtJ2000S) return b;
  }
  return null;
}

/**
 * Refuse a scenario with no station able to uplink (when there is a clock to plan).
 * `stations`: ids and uplink flags; `where` the scenario field.
 */
export function requireUplinkStation(stations: readonly { id: string; uplink?: boolean }[], where: string): void {
  if (stations.some((s) => s.uplink !== false)) return;
  const names = stations.map((s) => s.id).join(', ');
  throw new InputError(
    stations.length === 0 ? 'no stations, so no pass can carry an adjustment' : `no station can uplink (${names} are all uplink: false)`,
    where,
    'set uplink: true on at least one station (it is the default)',
  );
}

/** True when a blackout list leaves no instant of [from, to] free for this satellite. */
export function blackoutsCover(satellite: string, blackouts: readonly Blackout[], from: number, to: number): boolean {
  const spans = blackouts
    .filter((b) => b.satellites === null || b.satellites.includes(satellite))
    .map((b) => [b.startTtJ2000S, b.endTtJ2000S] as const)
    .sort((a, b) => a[0] - b[0]);
  let reached = from;
  for (const [s, e] of spans) {
    if (s > reached) return false;
    reached = Math.max(reached, e);
    if (reached >= to) return true;
  }
  return reached >= to;
}
