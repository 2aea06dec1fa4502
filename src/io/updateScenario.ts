/**
 * Write a fitted clock block back into a scenario file, keeping everything else as it was: YAML is
 * edited through the `yaml` document model (comments and layout survive); JSON is re-serialised
 * with two-space indentation. The result is validated again before it replaces the file atomically.
 */
import { isMap, isSeq, parseDocument } from 'yaml';
import { InputError } from '../errors.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { writeFileAtomic } from './output.ts';
import { readTextFile } from './orbitSources.ts';
import { parseScenarioText } from './scenario.ts';

/** The clock keys a fit determines. Other keys of the block (keepInNs, and noise unless given) are kept. */
export interface FittedClock {
  epoch: string;
  offsetNs: number;
  hardwareFractionalOffset: number;
  agingPerDay?: number;
  /** Noise levels estimated from the residual stability (replaces the block's noise). */
  noise?: { whiteFmAdev1s: number; flickerFmFloor: number; randomWalkFmAdev1d: number };
}

export function updateScenarioClock(path: string, satelliteId: string, clock: FittedClock, ts: TimeSystem): void {
  const text = readTextFile(path, '--update-scenario', 'scenario');
  const isJson = /\.json$/i.test(path) || /^\s*[{[]/.test(text);
  let next: string;
  if (isJson) {
    let obj: { satellites?: { id?: unknown; clock?: Record<string, unknown> }[] };
    try {
      obj = JSON.parse(text) as typeof obj;
    } catch {
      throw new InputError(`${path} is not valid JSON`, '--update-scenario', 'fix the file or give a YAML scenario');
    }
    const sat = obj.satellites?.find((s) => s.id === satelliteId);
    if (sat === undefined) throw new InputError(`no satellite ${JSON.stringify(satelliteId)} in ${path}`, '--update-scenario', 'give the scenario that holds --sat');
    sat.clock = { ...(sat.clock ?? {}), ...clock };
    next = `${JSON.stringify(obj, null, 2)}\n`;
  } else {
    const doc = parseDocument(text);
    if (doc.errors.length > 0) throw new InputError(`${path} is not valid YAML`, '--update-scenario', 'fix the file first');
    const sats = doc.get('satellites');
    if (!isSeq(sats)) throw new InputError(`${path} has no satellites list`, '--update-scenario', 'give a scenario file');
    const idx = sats.items.findIndex((item) => isMap(item) && item.get('id') === satelliteId);
    if (idx < 0) throw new InputError(`no satellite ${JSON.stringify(satelliteId)} in ${path}`, '--update-scenario', 'give the scenario that holds --sat');
    for (const [key, value] of Object.entries(clock)) doc.setIn(['satellites', idx, 'clock', key], value);
    next = doc.toString({ lineWidth: 0 });
  }
  parseScenarioText(next, path, ts); // still a valid scenario, or nothing is written
  writeFileAtomic(path, next, { flag: '--update-scenario', mayBeInput: true });
}
