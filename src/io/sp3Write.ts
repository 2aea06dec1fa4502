/**
 * Writing SP3-d position files from any trajectory (for tests and for handing our orbits to other
 * tools). Positions are earth-fixed (TEME → ECEF by GMST, UT1 ≈ UTC, no polar motion), in km, on
 * GPS time epochs. Clock fields are written as bad (999999.999999): tauplan has no SP3 clock to give.
 */
import { temeToEcef } from '../orbit/frames.ts';
import type { Trajectory } from '../orbit/trajectory.ts';
import { vec3 } from '../orbit/vec.ts';
import { daysFromCivil, MJD_OF_UNIX_EPOCH } from '../time/calendar.ts';
import type { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';

const f = (x: number, width: number, decimals: number): string => x.toFixed(decimals).padStart(width);
const i2 = (n: number): string => String(n).padStart(2);

export interface Sp3WriteSatellite {
  /** Three-character SP3 id, e.g. `X01`. */
  id: string;
  /** Trajectory in TEME (or TOD, treated as TEME: < 1.2″ apart). */
  trajectory: Trajectory;
}

/** Header lines of an SP3-d file (`#d` … `/*` comments), shared by every writer of SP3 text. */
export function sp3HeaderLines(
  time: TimeSystem,
  start: Instant,
  intervalS: number,
  count: number,
  ids: readonly string[],
  opts: { withVelocity: boolean; orbitType: string; comments: readonly string[] },
): string[] {
  const c = time.civil(start, 'GPS');
  const out: string[] = [];
  out.push(`#d${opts.withVelocity ? 'V' : 'P'}${c.year} ${i2(c.month)} ${i2(c.day)} ${i2(c.hour)} ${i2(c.minute)} ${f(c.second, 11, 8)} ${String(count).padStart(7)} ORBIT IGS20 ${opts.orbitType}  TAU`);
  const { week, secondsOfWeek } = time.gpsWeek(start);
  out.push(`## ${String(week).padStart(4)} ${f(secondsOfWeek, 15, 8)} ${f(intervalS, 14, 8)} ${String(daysFromCivil(c.year, c.month, c.day) + MJD_OF_UNIX_EPOCH).padStart(5)} ${f((c.hour * 3600 + c.minute * 60 + c.second) / 86400, 15, 13)}`);
  const lines = Math.max(5, Math.ceil(ids.length / 17));
  for (let li = 0; li < lines; li++) {
    const chunk = Array.from({ length: 17 }, (_, k) => (ids[li * 17 + k] ?? '0').padStart(3)).join('');
    out.push((li === 0 ? `+  ${String(ids.length).padStart(3)}   ` : '+        ') + chunk);
  }
  for (let li = 0; li < lines; li++) out.push('++       ' + Array.from({ length: 17 }, (_, k) => (ids[li * 17 + k] === undefined ? '  0' : '  2')).join(''));
  out.push('%c M  cc GPS ccc cccc cccc cccc cccc ccccc ccccc ccccc ccccc');
  out.push('%c cc cc ccc ccc cccc cccc cccc cccc ccccc ccccc ccccc ccccc');
  out.push('%f  1.2500000  1.025000000  0.00000000000  0.000000000000000');
  out.push('%f  0.0000000  0.000000000  0.00000000000  0.000000000000000');
  out.push('%i    0    0    0    0      0      0      0      0         0');
  out.push('%i    0    0    0    0      0      0      0      0         0');
  for (const line of opts.comments) out.push(`/* ${line}`);
  return out;
}

/** SP3-d text with `count` epochs every `intervalS` seconds from `start`. */
export function writeSp3Text(time: TimeSystem, start: Instant, intervalS: number, count: number, sats: readonly Sp3WriteSatellite[], gmstRadAt: (ttJ2000S: number) => number, comments: readonly string[] = []): string {
  const out = sp3HeaderLines(time, start, intervalS, count, sats.map((s) => s.id), { withVelocity: false, orbitType: 'FIT', comments });
  for (let k = 0; k < count; k++) {
    const inst = start.plusS(k * intervalS);
    const e = time.civil(inst, 'GPS');
    out.push(`*  ${e.year} ${i2(e.month)} ${i2(e.day)} ${i2(e.hour)} ${i2(e.minute)} ${f(e.second, 11, 8)}`);
    const tt = inst.ttJ2000S;
    for (const sat of sats) {
      const s = sat.trajectory.stateAt(tt);
      const ecef = temeToEcef(vec3<'TEME'>(s.positionM[0], s.positionM[1], s.positionM[2]), vec3<'TEME'>(s.velocityMPerS[0], s.velocityMPerS[1], s.velocityMPerS[2]), gmstRadAt(tt));
      out.push(`P${sat.id}${f(ecef.r[0] / 1000, 14, 6)}${f(ecef.r[1] / 1000, 14, 6)}${f(ecef.r[2] / 1000, 14, 6)}${f(999999.999999, 14, 6)}`);
    }
  }
  out.push('EOF');
  return `${out.join('\n')}\n`;
}
