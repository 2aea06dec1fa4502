/**
 * CCSDS Orbit Mean-elements Messages (OMM, CCSDS 502.0-B, Orbit Data Messages) with SGP4 mean
 * elements, in the three encodings in use: JSON (one object or an array, as element-set
 * catalogues publish them), KVN (`KEY = value [unit]` lines) and XML (NDM/XML, CCSDS 505.0-B).
 *
 * Only the SGP4 mean-element form is read (MEAN_ELEMENT_THEORY SGP4, REF_FRAME TEME, TIME_SYSTEM
 * UTC); anything else is refused rather than fed to SGP4 as if it were.
 * Units in brackets after KVN values and `units` attributes in XML are ignored: the standard
 * fixes the units (degrees, rev/day, rev/day², rev/day³, 1/earth radii).
 */
import { lazyPackage } from '../lazyPackage.ts';
import { parseJsonLocated } from './jsonText.ts';
import { InputError, OrbitFileError } from '../errors.ts';
import { civilFromDays, daysFromCivil, daysInMonth } from '../time/calendar.ts';
import type { CivilTime } from '../time/timeSystem.ts';
import type { OmmRecord } from '../model/elementSet.ts';

const fastXmlParser = lazyPackage<typeof import('fast-xml-parser')>('fast-xml-parser');

export type { OmmRecord };

/** Keywords an OMM must carry for SGP4. NORAD_CAT_ID or OBJECT_ID is required as well. */
export const OMM_REQUIRED_KEYWORDS = ['EPOCH', 'MEAN_MOTION', 'ECCENTRICITY', 'INCLINATION', 'RA_OF_ASC_NODE', 'ARG_OF_PERICENTER', 'MEAN_ANOMALY'] as const;

/** Where a keyword was found, for messages. */
type Locate = (key: string | null) => string;

/**
 * Read every OMM in a file. The encoding is detected from the first non-blank character:
 * `{` or `[` → JSON, `<` → XML, anything else → KVN.
 * @throws InputError (OrbitFileError with a line for KVN and XML syntax) naming the file, the keyword and the fix
 */
export function parseOmmFile(text: string, fileName: string): OmmRecord[] {
  const body = text.replace(/^\uFEFF/, '');
  const first = body.trimStart()[0];
  if (first === undefined) throw new OrbitFileError('empty OMM file', fileName, 1, null, 'give a CCSDS OMM in JSON, KVN or XML');
  if (first === '{' || first === '[') return parseJson(body, fileName);
  if (first === '<') return parseXml(body, fileName);
  return parseKvn(body, fileName);
}

/**
 * Build one record from an object of OMM keywords (as in JSON OMM; values numbers or strings).
 * Scenario files embed OMM keys this way.
 * @param where a JSON path or `file: omm[i]`, used in messages
 */
export function ommFromObject(obj: unknown, where: string): OmmRecord {
  if (typeof obj !== 'object' || obj === null || Array.isArray(obj)) {
    throw new InputError('OMM is not an object of keywords', where, 'give an object such as { "EPOCH": "...", "MEAN_MOTION": 15.5, ... }');
  }
  const keywords: Record<string, string> = {};
  for (const [key, value] of Object.entries(obj as Record<string, unknown>)) {
    if (value === null || value === undefined) continue;
    if (typeof value === 'number' || typeof value === 'string' || typeof value === 'boolean') keywords[key] = String(value).trim();
  }
  return ommFromKeywords(keywords, (key) => (key === null ? where : `${where}.${key}`));
}

function parseJson(text: string, fileName: string): OmmRecord[] {
  const data = parseJsonLocated(text, (fault, message) => {
    const where = fault === null ? fileName : `${fileName}:${fault.line}:${fault.column}`;
    const reason = fault?.reason ?? message;
    return new InputError(`OMM JSON cannot be read: ${reason.length > 120 ? `${reason.slice(0, 117)}...` : reason}`, where, 'check the JSON syntax (quotes, commas, brackets)');
  });
  const list = Array.isArray(data) ? data : [data];
  if (list.length === 0) throw new InputError('OMM JSON array is empty', fileName, 'give at least one OMM object');
  return list.map((obj, i) => ommFromObject(obj, Array.isArray(data) ? `${fileName}: [${i}]` : fileName));
}

function parseKvn(text: string, fileName: string): OmmRecord[] {
  const lines = text.split('\n');
  const messages: { keywords: Record<string, string>; lineOf: Record<string, number>; startLine: number }[] = [];
  let current: (typeof messages)[number] | null = null;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].replace(/\r$/, '').trim();
    const lineNo = i + 1;
    if (line === '' || line.startsWith('COMMENT')) continue;
    const m = splitKvnLine(line);
    if (m === null) {
      throw new OrbitFileError(`cannot read OMM line ${JSON.stringify(line.slice(0, 40))}`, fileName, lineNo, 1, 'KVN lines are "KEYWORD = value" (an optional [unit] after the value), COMMENT lines or blank');
    }
    const { key, value } = m;
    if (key === 'CCSDS_OMM_VERS' || current === null) {
      current = { keywords: {}, lineOf: {}, startLine: lineNo };
      messages.push(current);
    }
    if (key in current.keywords) {
      throw new OrbitFileError(`keyword ${key} appears twice in one OMM (first at line ${current.lineOf[key]})`, fileName, lineNo, 1, 'start each further OMM with CCSDS_OMM_VERS, or remove the duplicate');
    }
    current.keywords[key] = value;
    current.lineOf[key] = lineNo;
  }
  if (messages.length === 0) throw new OrbitFileError('no OMM keywords in the file', fileName, 1, null, 'give a CCSDS OMM in KVN: "CCSDS_OMM_VERS = 2.0", "EPOCH = ...", "MEAN_MOTION = ..."');
  return messages.map((msg) =>
    ommFromKeywords(msg.keywords, (key) => `${fileName}:${key !== null && key in msg.lineOf ? msg.lineOf[key] : msg.startLine}`),
  );
}

/**
 * `KEYWORD = value [unit]` → keyword and value (trimmed, unit dropped); null when not of that form.
 * Done by hand: the one-regex form `(.*?)\s*(\[[^\]]*\])?\s*$` backtracks in cubic time on a long
 * run of spaces inside a value (800 spaces took over a second).
 */
function splitKvnLine(line: string): { key: string; value: string } | null {
  const m = /^([A-Z][A-Z0-9_]*)\s*=/.exec(line);
  if (m === null) return null;
  let value = line.slice(m[0].length).trim();
  if (value.endsWith(']')) {
    // The unit is the earliest "[" after the last "]" before the closing one.
    const close = value.length - 1;
    const open = value.indexOf('[', value.lastIndexOf(']', close - 1) + 1);
    if (open >= 0 && open < close) value = value.slice(0, open).trimEnd();
  }
  if (/[\r\n\u2028\u2029]/.test(value)) return null; // a value is one line
  return { key: m[1], value };
}

function parseXml(text: string, fileName: string): OmmRecord[] {
  const xmlFix = 'check the XML syntax (matching tags, quotes)';
  let tree: unknown;
  try {
    const { XMLParser, XMLValidator } = fastXmlParser();
    const valid = XMLValidator.validate(text);
    if (valid !== true) {
      throw new OrbitFileError(`OMM XML cannot be read: ${oneLine(valid.err.msg)}`, fileName, valid.err.line ?? 1, valid.err.col ?? null, xmlFix);
    }
    // Keep every value as text so that digits are read exactly once, by us.
    const parser = new XMLParser({ ignoreAttributes: true, parseTagValue: false, removeNSPrefix: true, trimValues: true });
    tree = parser.parse(text) as unknown;
  } catch (e) {
    // The parser throws plain Errors for what the validator let through (unclosed <?...?>,
    // reserved names such as __proto__, nesting or entity limits): all are faults of the file.
    if (e instanceof InputError) throw e;
    throw new InputError(`OMM XML cannot be read: ${oneLine(e instanceof Error ? e.message : String(e))}`, fileName, xmlFix);
  }
  const omms: unknown[] = [];
  findElements(tree, 'omm', omms);
  if (omms.length === 0) throw new InputError('no <omm> element in the XML file', fileName, 'give an NDM/XML OMM: <omm><body><segment><data><meanElements>...');
  return omms.map((omm, i) => {
    const keywords: Record<string, string> = {};
    collectLeaves(omm, keywords);
    const where = omms.length === 1 ? fileName : `${fileName}: omm[${i}]`;
    return ommFromKeywords(keywords, (key) => (key === null ? where : `${where} <${key}>`));
  });
}

/** Depth-first search for elements named `tag` (an element may be an array when repeated). */
function findElements(node: unknown, tag: string, out: unknown[]): void {
  if (Array.isArray(node)) {
    for (const n of node) findElements(n, tag, out);
    return;
  }
  if (typeof node !== 'object' || node === null) return;
  for (const [key, value] of Object.entries(node)) {
    if (key === tag) {
      if (Array.isArray(value)) out.push(...value);
      else out.push(value);
    } else findElements(value, tag, out);
  }
}

/** Every leaf element by its tag name. COMMENT and repeated leaves other than the first are skipped. */
function collectLeaves(node: unknown, out: Record<string, string>): void {
  if (Array.isArray(node)) {
    for (const n of node) collectLeaves(n, out);
    return;
  }
  if (typeof node !== 'object' || node === null) return;
  for (const [key, value] of Object.entries(node)) {
    if (key === 'COMMENT') continue;
    if (typeof value === 'string' || typeof value === 'number') {
      if (!(key in out)) out[key] = String(value).trim();
    } else collectLeaves(value, out);
  }
}

function ommFromKeywords(kw: Record<string, string>, at: Locate): OmmRecord {
  const whereAll = at(null);
  for (const key of OMM_REQUIRED_KEYWORDS) {
    if (kw[key] === undefined || kw[key] === '') {
      throw new InputError(`OMM has no ${key}`, whereAll, `add ${key} (${keywordHelp(key)}); SGP4 needs EPOCH, MEAN_MOTION, ECCENTRICITY, INCLINATION, RA_OF_ASC_NODE, ARG_OF_PERICENTER and MEAN_ANOMALY`);
    }
  }
  if (kw.NORAD_CAT_ID === undefined && kw.OBJECT_ID === undefined) {
    throw new InputError('OMM has neither NORAD_CAT_ID nor OBJECT_ID', whereAll, 'add NORAD_CAT_ID (the catalogue number) or OBJECT_ID (e.g. 1958-002B) so the satellite can be named');
  }
  const expectText = (key: string, allowed: string[], fix: string): void => {
    const v = kw[key];
    if (v !== undefined && !allowed.includes(v.toUpperCase())) throw new InputError(`${key} is ${JSON.stringify(v)}`, at(key), fix);
  };
  expectText('MEAN_ELEMENT_THEORY', ['SGP4', 'SGP/SGP4'], 'only SGP4 mean elements can be propagated; use an OMM with MEAN_ELEMENT_THEORY = SGP4');
  expectText('REF_FRAME', ['TEME'], 'SGP4 mean elements are referred to TEME; use REF_FRAME = TEME');
  expectText('TIME_SYSTEM', ['UTC'], 'SGP4 element sets carry a UTC epoch; use TIME_SYSTEM = UTC');
  expectText('CENTER_NAME', ['EARTH'], 'SGP4 is for Earth orbits; use CENTER_NAME = EARTH');

  const num = (key: string, fallback: number | null): number => {
    const v = kw[key];
    if (v === undefined || v === '') {
      if (fallback === null) throw new InputError(`OMM has no ${key}`, at(key), `add ${key}`);
      return fallback;
    }
    const x = Number(v);
    if (!/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(v) || !Number.isFinite(x)) {
      throw new InputError(`${key} ${JSON.stringify(v)} is not a number`, at(key), `write ${key} as a decimal number, e.g. ${keywordExample(key)}`);
    }
    return x;
  };
  const meanMotionRevPerDay = num('MEAN_MOTION', null);
  if (!(meanMotionRevPerDay > 0)) throw new InputError(`MEAN_MOTION ${meanMotionRevPerDay} rev/day is not positive`, at('MEAN_MOTION'), 'give the mean motion in revolutions per day, e.g. 15.5 for a low orbit');
  const eccentricity = num('ECCENTRICITY', null);
  if (!(eccentricity >= 0 && eccentricity < 1)) throw new InputError(`ECCENTRICITY ${eccentricity} outside 0 ≤ e < 1`, at('ECCENTRICITY'), 'SGP4 needs a closed orbit: give 0 ≤ e < 1');
  const inclinationDeg = num('INCLINATION', null);
  if (!(inclinationDeg >= 0 && inclinationDeg <= 180)) throw new InputError(`INCLINATION ${inclinationDeg}° outside 0–180°`, at('INCLINATION'), 'give the inclination in degrees, 0–180');
  const angle = (key: string): number => {
    const x = num(key, null);
    if (!(x >= -360 && x <= 360)) throw new InputError(`${key} ${x}° outside −360–360°`, at(key), `give ${key} in degrees`);
    return x;
  };
  const ephemerisType = num('EPHEMERIS_TYPE', 0);
  if (![0, 2, 3].includes(ephemerisType)) {
    throw new InputError(`EPHEMERIS_TYPE ${ephemerisType} is not an SGP4 element set`, at('EPHEMERIS_TYPE'), 'only EPHEMERIS_TYPE 0 (SGP4/SDP4) element sets can be propagated here');
  }
  const optionalInt = (key: string): number | null => (kw[key] === undefined || kw[key] === '' ? null : num(key, null));
  return {
    kind: 'omm',
    objectName: kw.OBJECT_NAME ?? null,
    objectId: kw.OBJECT_ID ?? null,
    noradCatId: kw.NORAD_CAT_ID ?? null,
    epochText: kw.EPOCH,
    epochUtc: parseOmmEpoch(kw.EPOCH, at('EPOCH')),
    meanMotionRevPerDay,
    eccentricity,
    inclinationDeg,
    raanDeg: angle('RA_OF_ASC_NODE'),
    argOfPericenterDeg: angle('ARG_OF_PERICENTER'),
    meanAnomalyDeg: angle('MEAN_ANOMALY'),
    bstarPerEarthRadius: num('BSTAR', 0),
    meanMotionDotRevPerDay2: num('MEAN_MOTION_DOT', 0),
    meanMotionDdotRevPerDay3: num('MEAN_MOTION_DDOT', 0),
    ephemerisType,
    classificationType: kw.CLASSIFICATION_TYPE ?? 'U',
    elementSetNo: optionalInt('ELEMENT_SET_NO'),
    revAtEpoch: optionalInt('REV_AT_EPOCH'),
    keywords: { ...kw },
    where: whereAll,
  };
}

/**
 * An OMM EPOCH (UTC): `YYYY-MM-DDThh:mm:ss[.f…]` or day-of-year `YYYY-DDDThh:mm:ss[.f…]`,
 * with or without a trailing `Z` (CCSDS 502.0-B, 7.5.10).
 */
export function parseOmmEpoch(text: string, where: string): CivilTime {
  const fix = 'write EPOCH in UTC as 2000-06-27T18:50:19.733568 (or day of year, 2000-179T18:50:19.733568)';
  const m = /^(\d{4})-(?:(\d{2})-(\d{2})|(\d{3}))T(\d{2}):(\d{2}):(\d{2}(?:\.\d+)?)Z?$/.exec(text.trim());
  if (m === null) throw new InputError(`EPOCH ${JSON.stringify(text)} is not an ISO date and time`, where, fix);
  const year = Number(m[1]);
  let month: number;
  let day: number;
  if (m[4] !== undefined) {
    const doy = Number(m[4]);
    const yearDays = daysFromCivil(year + 1, 1, 1) - daysFromCivil(year, 1, 1);
    if (doy < 1 || doy > yearDays) throw new InputError(`EPOCH day of year ${doy} outside 1–${yearDays}`, where, fix);
    ({ month, day } = civilFromDays(daysFromCivil(year, 1, 1) + doy - 1));
  } else {
    month = Number(m[2]);
    day = Number(m[3]);
  }
  const hour = Number(m[5]);
  const minute = Number(m[6]);
  const second = Number(m[7]);
  if (month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month) || hour > 23 || minute > 59 || second >= 61) {
    throw new InputError(`EPOCH ${JSON.stringify(text)} is not a valid date`, where, fix);
  }
  return { year, month, day, hour, minute, second };
}

/** A library message on one line (V8's JSON errors quote the text around the fault, newlines and all). */
function oneLine(message: string): string {
  return message.replace(/\s*[\r\n]+\s*/g, ' ');
}

function keywordHelp(key: string): string {
  switch (key) {
    case 'EPOCH':
      return 'UTC, e.g. 2000-06-27T18:50:19.733568';
    case 'MEAN_MOTION':
      return 'rev/day, e.g. 15.5';
    case 'ECCENTRICITY':
      return '0 ≤ e < 1';
    default:
      return 'degrees';
  }
}

function keywordExample(key: string): string {
  return key === 'MEAN_MOTION' ? '10.82419157' : key === 'ECCENTRICITY' ? '0.1859667' : key === 'BSTAR' ? '2.8098e-5' : '34.2682';
}
