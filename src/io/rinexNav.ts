/**
 * Reader for RINEX 3 navigation files (versions 3.02–3.05; RINEX 3.05 §5.3 and Tables A6–A8): GPS LNAV
 * and Galileo records become {@link BroadcastClockRecord}s; records of other systems are skipped
 * and counted, as are GPS and Galileo records with a missing or unreadable field. Any other version
 * is refused.
 *
 * Layout (fixed columns): the record's first line holds the satellite (cols 1–3), the epoch toc
 * (`yyyy mm dd hh mm ss`, cols 5–23) and af0, af1, af2 (D19.12 at cols 24, 43, 62); each following
 * "broadcast orbit" line holds four D19.12 fields from col 5. Exponents may be written with `D`.
 * CRLF line ends, a BOM and trailing blanks are accepted.
 */
import type { BroadcastClockRecord, NavSystem } from '../model/broadcastNav.ts';
import { OrbitFileError } from '../errors.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { linesOf, readLinesSync, type TextLine } from './textSource.ts';

/** What a navigation file held. */
export interface RinexNavFile {
  fileName: string;
  /** Version as written, e.g. 3.05. */
  version: number;
  records: BroadcastClockRecord[];
  /** Records of systems this reader does not use (R, C, J, S, I), by system letter. */
  skippedOtherSystems: Record<string, number>;
  /** GPS or Galileo records skipped for a missing or unreadable field. */
  skippedIncomplete: number;
  /** Line of the first such record, or null. */
  firstIncompleteLine: number | null;
}

/** Lowest and highest version read (RINEX 3.02 to 3.05). */
const MIN_VERSION = 3.02;
const MAX_VERSION = 3.05;
/** Broadcast-orbit lines after the first line of a GPS or Galileo record. */
const ORBIT_LINES = 7;
/** Header lines read before giving up on END OF HEADER. */
const MAX_HEADER_LINES = 10_000;
const SECONDS_PER_WEEK = 604_800;

/** A D19.12 field (`D` or `E` exponent); NaN when blank or not a number. */
function field(line: string, start: number): number {
  const raw = line.slice(start, start + 19).trim().replace(/[dD]/, 'E');
  if (raw.length === 0 || !/^[+-]?(?:\d+\.?\d*|\.\d+)(?:E[+-]?\d+)?$/i.test(raw)) return Number.NaN;
  return Number(raw);
}

/** The four fields of a broadcast-orbit line. */
function orbitFields(line: string): number[] {
  return [4, 23, 42, 61].map((c) => field(line, c));
}

/**
 * Parse the text of a RINEX 3 navigation file.
 * @throws OrbitFileError for an unsupported version, a file that is not navigation data, or a
 *   header without END OF HEADER
 */
export function parseRinexNav(text: string, fileName: string, ts: TimeSystem): RinexNavFile {
  return parseRinexNavLines(linesOf(text), fileName, ts);
}

/** Read a RINEX 3 navigation file (path, gzip or not), streaming its lines. */
export function readRinexNav(path: string, where: string, ts: TimeSystem): RinexNavFile {
  return parseRinexNavLines(readLinesSync(path, 'orbit', where), path, ts);
}

/** The same, from lines as they stream (textSource.ts): one record's lines are kept at a time. */
export function parseRinexNavLines(source: Iterable<TextLine>, fileName: string, ts: TimeSystem): RinexNavFile {
  let out: RinexNavFile | null = null;
  let inHeader = true;
  let lastLine = 0;
  let head: TextLine | null = null;
  let body: string[] = [];
  const flush = (): void => {
    if (head === null || out === null) return;
    const sys = head.text[0];
    if (sys !== 'G' && sys !== 'E') out.skippedOtherSystems[sys] = (out.skippedOtherSystems[sys] ?? 0) + 1;
    else {
      const rec = readRecord(head.text, body, sys === 'G' ? 'gps' : 'galileo', head.line, ts, fileName);
      if (rec === null) {
        out.skippedIncomplete++;
        out.firstIncompleteLine ??= head.line;
      } else out.records.push(rec);
    }
    head = null;
    body = [];
  };
  for (const l of source) {
    lastLine = l.line;
    if (out === null) {
      out = readFirstLine(l.text, fileName);
      continue;
    }
    if (inHeader) {
      if (l.text.slice(60).startsWith('END OF HEADER')) inHeader = false;
      else if (l.line > MAX_HEADER_LINES + 1) break;
      continue;
    }
    // Continuation lines (four blanks, then data) belong to the record above.
    if (head !== null && l.text.startsWith('    ')) {
      body.push(l.text);
      continue;
    }
    flush();
    // A blank line, or a stray continuation line of a record skipped already.
    if (l.text.trim().length === 0 || l.text.startsWith(' ')) continue;
    head = l;
  }
  if (out === null) out = readFirstLine('', fileName);
  if (inHeader) throw new OrbitFileError('no END OF HEADER line', fileName, lastLine, 61, 'check the file is complete');
  flush();
  return out;
}

/** The RINEX VERSION / TYPE line, checked, as an empty result. */
function readFirstLine(first: string, fileName: string): RinexNavFile {
  if (!first.slice(60).includes('RINEX VERSION / TYPE')) {
    throw new OrbitFileError('first line is not a RINEX VERSION / TYPE line', fileName, 1, 61, 'give a RINEX 3 navigation file (.rnx, .yyN/.yyP)');
  }
  const version = Number(first.slice(0, 9).trim());
  if (!(version >= MIN_VERSION - 1e-9 && version <= MAX_VERSION + 1e-9)) {
    throw new OrbitFileError(`RINEX version ${first.slice(0, 9).trim()} is not supported`, fileName, 1, 1, 'give a RINEX 3.02–3.05 navigation file (convert other versions first)');
  }
  if (first[20] !== 'N') throw new OrbitFileError(`file type ${JSON.stringify(first[20] ?? '')} is not N (navigation data)`, fileName, 1, 21, 'give a navigation file, not observation or meteorological data');
  return { fileName, version, records: [], skippedOtherSystems: {}, skippedIncomplete: 0, firstIncompleteLine: null };
}

/** One GPS or Galileo record, or null when a needed field is missing. */
function readRecord(head: string, body: string[], system: NavSystem, line: number, ts: TimeSystem, fileName: string): BroadcastClockRecord | null {
  if (body.length < ORBIT_LINES - 1) return null; // the 7th line may hold only the transmission time
  const m = /^([GE]\d\d) (\d{4}) (\d\d) (\d\d) (\d\d) (\d\d) (\d\d)/.exec(head);
  if (m === null) return null;
  const af = [field(head, 23), field(head, 42), field(head, 61)];
  const o = body.map(orbitFields);
  const [, , deltaN, m0] = o[0];
  const [, e, , sqrtA] = o[1];
  const toeSow = o[2][0];
  const week = o[4][2];
  const dataSources = system === 'galileo' ? o[4][1] : null;
  const health = o[5][1];
  const tx = o[6]?.[0] ?? Number.NaN;
  const fitField = system === 'gps' ? (o[6]?.[1] ?? Number.NaN) : 0;
  const fitHours = Number.isFinite(fitField) ? fitField : 0; // blank: the nominal 4 h
  const needed = [...af, deltaN, m0, e, sqrtA, toeSow, week, health, tx, ...(dataSources === null ? [] : [dataSources])];
  if (needed.some((v) => !Number.isFinite(v))) return null;
  const scale = system === 'gps' ? 'GPS' : 'GST';
  let tocTt: number;
  try {
    tocTt = ts.fromScale(scale, { year: Number(m[2]), month: Number(m[3]), day: Number(m[4]), hour: Number(m[5]), minute: Number(m[6]), second: Number(m[7]) }, `${fileName}:${line}`).ttJ2000S;
  } catch {
    return null;
  }
  // RINEX 3 gives the Galileo week on the GPS week count (RINEX 3.05 Table A8), so one rule serves both.
  const weekStart = ts.fromGpsWeek(Math.round(week), 0, `${fileName}:${line}`).ttJ2000S;
  // Transmission time may be negative (a week before) or past the week end in a few files: keep it relative to the week.
  const txTt = weekStart + tx;
  return {
    satellite: m[1],
    system,
    line,
    tocTtJ2000S: tocTt,
    af0S: af[0],
    af1: af[1],
    af2PerS: af[2],
    toeTtJ2000S: weekStart + toeSow,
    sqrtAM: sqrtA,
    e,
    m0Rad: m0,
    deltaNRadPerS: deltaN,
    transmissionTtJ2000S: Math.abs(txTt - tocTt) > SECONDS_PER_WEEK / 2 ? txTt + Math.round((tocTt - txTt) / SECONDS_PER_WEEK) * SECONDS_PER_WEEK : txTt,
    fitIntervalS: system === 'gps' ? (fitHours === 0 ? 4 * 3600 : fitHours * 3600) : null,
    dataSources: dataSources === null ? null : Math.round(dataSources),
    health: Math.round(health),
  };
}
