/**
 * Choosing the pass for a keep-in adjustment (resets.ts): among uplink passes after the last
 * adjustment, the first one (the clock is already outside) or the last one that ends by the deadline,
 * and the first or last that the policy allows. Contacts are sorted by AOS, so a search skips the past.
 */
import type { Contact } from './contacts.ts';

/** Index of the first contact (sorted by AOS) whose AOS is after t. */
export function firstAosAfter(contacts: readonly Contact[], t: number): number {
  let lo = 0;
  let hi = contacts.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (contacts[mid].aosTtJ2000S > t) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

const usableAfter = (c: Contact, since: number): boolean => c.uplink !== false && c.aosTtJ2000S > since && c.tcaTtJ2000S > since;

/**
 * The first uplink pass after `since` (ideal) and the first one allowed (`why` null), contacts
 * sorted by AOS (`ordered`: all times are numbers, so the sort holds and a search can skip the past).
 */
export function passAfter(contacts: readonly Contact[], since: number, why: (c: Contact) => unknown, ordered: boolean): { chosen: Contact | undefined; ideal: Contact | undefined } {
  let ideal: Contact | undefined;
  for (let i = ordered ? firstAosAfter(contacts, since) : 0; i < contacts.length; i++) {
    const c = contacts[i];
    if (!usableAfter(c, since)) continue;
    ideal ??= c;
    if (why(c) === null) return { chosen: c, ideal };
  }
  return { chosen: undefined, ideal };
}

/**
 * The last uplink pass after `since` that ends by `deadline` (ideal) and the last such one allowed,
 * contacts sorted by AOS. `ordered` (no pass ends before it begins): passes beginning after the
 * deadline are not looked at.
 */
export function passBefore(contacts: readonly Contact[], since: number, deadline: number, why: (c: Contact) => unknown, ordered: boolean): { chosen: Contact | undefined; ideal: Contact | undefined } {
  let ideal: Contact | undefined;
  const first = ordered ? firstAosAfter(contacts, since) : 0;
  const end = ordered ? firstAosAfter(contacts, deadline) : contacts.length;
  for (let i = end - 1; i >= first; i--) {
    const c = contacts[i];
    if (!usableAfter(c, since) || !(c.losTtJ2000S <= deadline)) continue;
    ideal ??= c;
    if (why(c) === null) return { chosen: c, ideal };
  }
  return { chosen: undefined, ideal };
}
