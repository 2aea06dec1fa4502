/**
 * `tauplan navclock --nav FILE --precise FILE --orbit FILE [--system gps|galileo]`: broadcast clock
 * error of a RINEX 3 navigation file against precise clocks (the SP3 clock column), with the periodic
 * term on both sides (broadcast Δt_r from its elements, precise −2 r·v/c² from the orbit file).
 * The files are read here; the library (src/api/navclock.ts) evaluates.
 */
import { runBroadcastEval, type BroadcastEvalMeta, type BroadcastEvalResult, type NavSystem } from '../../api/navclock.ts';
import { InputError } from '../../errors.ts';
import { readRinexNav } from '../../io/rinexNav.ts';
import { readSp3File as readSp3, type Sp3File } from '../../io/sp3.ts';
import { readHeadLines } from '../../io/textSource.ts';
import { broadcastEvalToCsv, broadcastEvalToJson, broadcastEvalToText } from '../../report/navclockEvalReport.ts';
import type { TimeSystem } from '../../time/timeSystem.ts';
import type { Rendered } from '../emit.ts';
import { broadcastEvalToHtml } from '../../report/navclockHtml.ts';

export interface NavEvalArgs {
  nav: string;
  precise?: string;
  orbit?: string;
  system?: string;
}

function readSp3File(path: string, flag: string): Sp3File {
  const text = readHeadLines(path, 'orbit', flag, 1).join('');
  if (!/^#[cd]/.test(text)) throw new InputError(`${path} is not an SP3-c or SP3-d file`, flag, 'give an SP3 file of precise orbits and clocks (RINEX clock files are not read yet)');
  return readSp3(path, flag);
}

export function computeNavEval(a: NavEvalArgs, ts: TimeSystem): { result: BroadcastEvalResult; meta: BroadcastEvalMeta } {
  if (a.precise === undefined) throw new InputError('--nav without --precise', '--precise', 'give the precise clocks (SP3) of the same day');
  if (a.orbit === undefined) throw new InputError('--nav without --orbit', '--orbit', 'give the precise orbit (SP3) for the −2 r·v/c² term; it may be the same file as --precise');
  const nav = readRinexNav(a.nav, '--nav', ts);
  const precise = readSp3File(a.precise, '--precise');
  const orbit = a.orbit === a.precise ? precise : readSp3File(a.orbit, '--orbit');
  return runBroadcastEval({ nav, precise, orbit, navFile: a.nav, preciseFile: a.precise, orbitFile: a.orbit }, { timeSystem: ts, system: a.system as NavSystem | undefined });
}

export function runNavEval(a: NavEvalArgs, ts: TimeSystem): Rendered {
  const { result, meta } = computeNavEval(a, ts);
  return { html: () => broadcastEvalToHtml(result, meta), json: () => broadcastEvalToJson(result, meta), csv: () => broadcastEvalToCsv(result), text: () => broadcastEvalToText(result, meta) };
}
