/** Loads the tables the core needs from `data/`. This is the only place they are read. */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { LeapSecondTable, type LeapTableData } from '../time/leapSeconds.ts';
import { TimeSystem } from '../time/timeSystem.ts';

/** Absolute path of a file in the package's `data/` folder. */
export function dataPath(name: string): string {
  return fileURLToPath(new URL(`../../data/${name}`, import.meta.url));
}

let cached: TimeSystem | undefined;

/** The time system built from `data/leap-seconds.json` (read once per process). */
export function defaultTimeSystem(): TimeSystem {
  if (cached === undefined) {
    const data = JSON.parse(readFileSync(dataPath('leap-seconds.json'), 'utf8')) as LeapTableData;
    cached = new TimeSystem(new LeapSecondTable(data));
  }
  return cached;
}
