/** `tauplan time ISO`: one instant in every scale. */
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';

export function runTime(text: string, ts: TimeSystem): Rendered {
  const t = ts.parse(text, 'time argument');
  const utc = ts.utcCivil(t);
  const { week, secondsOfWeek } = ts.gpsWeek(t);
  const json = {
    utc: ts.format(t, 'UTC'),
    tai: ts.format(t, 'TAI'),
    tt: ts.format(t, 'TT'),
    gps: ts.format(t, 'GPS'),
    gpsWeek: week,
    gpsSecondsOfWeek: secondsOfWeek,
    mjdUtc: ts.mjdUtc(t),
    taiMinusUtcS: utc.taiMinusUtcS,
    gst: ts.format(t, 'GST'),
    bdt: ts.format(t, 'BDT'),
    ttJ2000S: t.ttJ2000S,
  };
  return {
    json: () => json,
    text: () =>
      [
        `UTC        ${json.utc}`,
        `TAI        ${json.tai}`,
        `TT         ${json.tt}`,
        `GPS        ${json.gps}   week ${week}, ${secondsOfWeek.toFixed(3)} s of week`,
        `GST        ${json.gst}`,
        `BDT        ${json.bdt}`,
        `MJD (UTC)  ${json.mjdUtc.toFixed(8)}`,
        `TAI − UTC  ${json.taiMinusUtcS} s`,
        '',
      ].join('\n'),
    csv: () =>
      `utc,tai,tt,gps,gpsWeek,gpsSecondsOfWeek,mjdUtc,taiMinusUtcS\n${[json.utc, json.tai, json.tt, json.gps, week, secondsOfWeek, json.mjdUtc, json.taiMinusUtcS].join(',')}\n`,
  };
}
