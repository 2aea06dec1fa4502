/** Duration strings: `3600s`, `90min`, `36h`, `7d`, `2w`, or ISO 8601 `P7DT12H`, `PT90M`. */
import { TimeError } from '../errors.ts';

const UNIT_S: Record<string, number> = { s: 1, sec: 1, min: 60, m: 60, h: 3600, d: 86400, w: 604800 };

/** Parse a duration into seconds. Refuses a bare number: the unit must be said. */
export function parseDurationS(text: string, where = 'duration'): number {
  const s = text.trim();
  let m = /^(-?\d+(?:\.\d+)?(?:e[+-]?\d+)?)\s*(s|sec|min|m|h|d|w)$/i.exec(s);
  if (m !== null) return finiteDurationS(Number(m[1]) * UNIT_S[m[2].toLowerCase()], text, where);
  m = /^P(?:(\d+(?:\.\d+)?)W)?(?:(\d+(?:\.\d+)?)D)?(?:T(?:(\d+(?:\.\d+)?)H)?(?:(\d+(?:\.\d+)?)M)?(?:(\d+(?:\.\d+)?)S)?)?$/i.exec(s);
  if (m !== null && s.length > 1 && !/T$/i.test(s)) {
    const [w, d, h, mi, sec] = m.slice(1).map((x) => (x === undefined ? 0 : Number(x)));
    return finiteDurationS(w * 604800 + d * 86400 + h * 3600 + mi * 60 + sec, text, where);
  }
  throw new TimeError(`cannot read duration ${JSON.stringify(text)}`, where, 'write e.g. 3600s, 90min, 36h, 7d or ISO 8601 P7DT12H');
}

/** Refuse a span that overflowed to Infinity (e.g. `1e999s`, or 400 digits). */
function finiteDurationS(spanS: number, text: string, where: string): number {
  if (!Number.isFinite(spanS)) throw new TimeError(`duration ${JSON.stringify(text)} is too large`, where, 'give a finite span, e.g. 3600s, 7d or P7DT12H');
  return spanS;
}

/** Parse a duration that must be strictly positive. */
export function parsePositiveDurationS(text: string, where = 'duration'): number {
  const v = parseDurationS(text, where);
  if (!(v > 0)) throw new TimeError(`duration ${JSON.stringify(text)} is not positive`, where, 'give a span greater than zero');
  return v;
}
