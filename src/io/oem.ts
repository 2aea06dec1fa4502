/**
 * CCSDS Orbit Ephemeris Messages in KVN (CCSDS 502.0-B-3, "Orbit Data Messages", 2023; layout
 * from that document): `CCSDS_OEM_VERS` (1.0, 2.0 or 3.0) first, header keywords, then one or more
 * segments of `META_START` … `META_STOP` and data lines `epoch x y z vx vy vz [ax ay az]` (km,
 * km/s, km/s²), optional `COVARIANCE_START` … `COVARIANCE_STOP` blocks (skipped), `COMMENT` lines
 * anywhere. Read: OBJECT_NAME, OBJECT_ID, CENTER_NAME (EARTH, or MOON with ICRF/GCRF/EME2000 axes:
 * LCRS), REF_FRAME (EME2000, GCRF, ICRF, ITRF…, TEME), TIME_SYSTEM (UTC, TAI, TT, GPS), START/STOP_TIME, USEABLE_START/STOP_TIME,
 * INTERPOLATION (LAGRANGE, HERMITE; LINEAR is refused: too coarse for clock rates) and
 * INTERPOLATION_DEGREE. Every fault throws {@link OrbitFileError} with the line.
 */
import { OrbitFileError } from '../errors.ts';
import type { OemFile, OemFrame, OemNode, OemSegment } from '../model/oem.ts';
import type { CivilTime, TimeSystem } from '../time/timeSystem.ts';
import { ccsdsCivil } from './ccsdsTime.ts';
import { fortranNumber, PRODUCT_TIME_SYSTEMS, productTimeTt } from './clockReader.ts';
import { linesOf, type TextLine } from './textSource.ts';

const VERSIONS = ['1.0', '2.0', '3.0'];
const TIME_SYSTEMS = ['UTC', 'TAI', 'TT', 'GPS'];
const KV = /^([A-Z0-9_]+)\s*=\s*(.*)$/;
/** Default degree when INTERPOLATION_DEGREE is absent (common practice for GNSS-like spacing). */
const DEFAULT_DEGREE = 7;

function frameOf(text: string): OemFrame | null {
  if (text === 'EME2000' || text === 'GCRF' || text === 'TEME') return text;
  // ICRF axes: GCRF's (the origin comes from CENTER_NAME); used by Moon-centred ephemerides.
  if (text === 'ICRF') return 'GCRF';
  if (/^ITRF/.test(text)) return 'ITRF';
  return null;
}

/** Parse the text of a KVN OEM. */
export function parseOem(text: string, fileName: string, ts: TimeSystem): OemFile {
  return parseOemLines(linesOf(text), fileName, ts);
}

/** The same, from lines as they stream (textSource.ts): only the nodes are kept. */
export function parseOemLines(source: Iterable<TextLine>, fileName: string, ts: TimeSystem): OemFile {
  const fail = (what: string, line: number, fix: string): never => {
    throw new OrbitFileError(what, fileName, line, null, fix);
  };
  let version = '';
  let originator = '';
  const segments: OemSegment[] = [];
  let state: 'start' | 'header' | 'meta' | 'data' | 'covariance' = 'start';
  let meta = new Map<string, { value: string; line: number }>();
  let metaLine = 0;
  let seg: OemSegment | null = null;
  let last = 0;
  const timeOf = (value: string, sys: string, line: number): number => {
    const c = ccsdsCivil(value);
    if (typeof c === 'string') fail(c, line, 'write CCSDS time code A (2020-06-25T00:00:00) or B (2020-177T00:00:00)');
    return productTimeTt(ts, PRODUCT_TIME_SYSTEMS[sys], c as CivilTime, `${fileName}:${line}`);
  };
  const closeMeta = (line: number): OemSegment => {
    const get = (k: string, required = true): { value: string; line: number } | null => {
      const v = meta.get(k);
      if (v === undefined && required) fail(`metadata without ${k}`, line, `add ${k} = … between META_START and META_STOP`);
      return v ?? null;
    };
    const center = (get('CENTER_NAME') as { value: string }).value.toUpperCase();
    if (center !== 'EARTH' && center !== 'MOON') fail(`CENTER_NAME ${JSON.stringify(center)} is not EARTH or MOON`, meta.get('CENTER_NAME')?.line ?? line, 'tauplan reads Earth- and Moon-centred ephemerides');
    const fr = get('REF_FRAME') as { value: string; line: number };
    const frame = frameOf(fr.value.toUpperCase());
    if (frame === null) fail(`REF_FRAME ${JSON.stringify(fr.value)} is not read`, fr.line, 'use EME2000, GCRF, ICRF, ITRF (any realisation) or TEME');
    // Moon-centred: inertial ICRS-aligned axes only (LCRS); the Earth's rotating and true-of-date frames do not apply.
    if (center === 'MOON' && frame !== 'EME2000' && frame !== 'GCRF') fail(`REF_FRAME ${JSON.stringify(fr.value)} does not go with CENTER_NAME = MOON`, fr.line, 'give a Moon-centred ephemeris in ICRF, GCRF or EME2000 axes');
    const tsys = get('TIME_SYSTEM') as { value: string; line: number };
    if (!TIME_SYSTEMS.includes(tsys.value)) fail(`TIME_SYSTEM ${JSON.stringify(tsys.value)} is not read`, tsys.line, `use one of ${TIME_SYSTEMS.join(', ')}`);
    const t = (k: string): number | null => {
      const v = get(k, false);
      return v === null ? null : timeOf(v.value, tsys.value, v.line);
    };
    const start = t('START_TIME');
    const stop = t('STOP_TIME');
    if (start === null || stop === null) fail('metadata without START_TIME or STOP_TIME', line, 'give both');
    const from = t('USEABLE_START_TIME') ?? (start as number);
    const to = t('USEABLE_STOP_TIME') ?? (stop as number);
    const interp = (get('INTERPOLATION', false)?.value ?? 'LAGRANGE').toUpperCase();
    if (interp !== 'LAGRANGE' && interp !== 'HERMITE') fail(`INTERPOLATION ${JSON.stringify(interp)} is not read`, meta.get('INTERPOLATION')?.line ?? line, 'use LAGRANGE or HERMITE (LINEAR is too coarse for clock rates)');
    const degText = get('INTERPOLATION_DEGREE', false);
    const degree = degText === null ? DEFAULT_DEGREE : Number(degText.value);
    if (!Number.isInteger(degree) || degree < 1 || degree > 15) fail(`INTERPOLATION_DEGREE ${JSON.stringify(degText?.value)} is not 1–15`, degText?.line ?? line, 'give a whole degree such as 7');
    return {
      objectName: get('OBJECT_NAME')?.value ?? '',
      objectId: get('OBJECT_ID')?.value ?? '',
      centerName: center,
      frame: frame as OemFrame,
      frameText: fr.value,
      timeSystem: tsys.value,
      usableFromTtJ2000S: from,
      usableToTtJ2000S: to,
      interpolation: interp as 'LAGRANGE' | 'HERMITE',
      degree,
      line: metaLine,
      nodes: [],
    };
  };
  const closeData = (line: number): void => {
    const s = seg as OemSegment;
    if (s.nodes.length === 0) fail('segment without data lines', line, 'give at least the epochs the interpolation needs');
    segments.push(s);
    seg = null;
  };
  for (const l of source) {
    last = l.line;
    const t = l.text.trim();
    if (t === '' || t.startsWith('COMMENT')) continue;
    if (state === 'start') {
      const m = KV.exec(t);
      if (m === null || m[1] !== 'CCSDS_OEM_VERS') fail('first line is not CCSDS_OEM_VERS = …', l.line, 'a KVN OEM starts with CCSDS_OEM_VERS = 3.0');
      version = (m as RegExpExecArray)[2].trim();
      if (!VERSIONS.includes(version)) fail(`OEM version ${JSON.stringify(version)} is not read`, l.line, `tauplan reads OEM ${VERSIONS.join(', ')}`);
      state = 'header';
      continue;
    }
    if (t === 'META_START') {
      if (state === 'meta') fail('META_START inside the metadata', l.line, 'close it with META_STOP');
      if (state === 'covariance') fail('META_START inside a covariance block', l.line, 'close it with COVARIANCE_STOP');
      if (state === 'data') closeData(l.line);
      state = 'meta';
      meta = new Map();
      metaLine = l.line;
      continue;
    }
    if (t === 'META_STOP') {
      if (state !== 'meta') fail('META_STOP without META_START', l.line, 'open the metadata with META_START');
      seg = closeMeta(l.line);
      state = 'data';
      continue;
    }
    if (t === 'COVARIANCE_START') {
      if (state !== 'data') fail('COVARIANCE_START outside a segment', l.line, 'put covariance blocks after the data lines');
      state = 'covariance';
      continue;
    }
    if (t === 'COVARIANCE_STOP') {
      if (state !== 'covariance') fail('COVARIANCE_STOP without COVARIANCE_START', l.line, 'open the block with COVARIANCE_START');
      state = 'data';
      continue;
    }
    if (state === 'covariance') continue;
    if (state === 'header') {
      const m = KV.exec(t);
      if (m === null) fail(`line is not KEYWORD = value: ${JSON.stringify(t.slice(0, 40))}`, l.line, 'the header holds CREATION_DATE, ORIGINATOR, …; then META_START');
      if ((m as RegExpExecArray)[1] === 'ORIGINATOR') originator = (m as RegExpExecArray)[2].trim();
      continue;
    }
    if (state === 'meta') {
      const m = KV.exec(t);
      if (m === null) fail(`metadata line is not KEYWORD = value: ${JSON.stringify(t.slice(0, 40))}`, l.line, 'write KEYWORD = value');
      meta.set((m as RegExpExecArray)[1], { value: (m as RegExpExecArray)[2].trim(), line: l.line });
      continue;
    }
    // Data line.
    const s = seg as OemSegment;
    const f = t.split(/\s+/);
    if (f.length !== 7 && f.length !== 10) fail(`data line has ${f.length} fields; 7 (epoch, position, velocity) or 10 (with acceleration) are needed`, l.line, 'the line may be truncated; restore it');
    const tt = timeOf(f[0], s.timeSystem, l.line);
    const x = f.slice(1, 7).map(fortranNumber);
    if (x.some((v) => !Number.isFinite(v))) fail('a position or velocity is not a number', l.line, 'write km and km/s as decimal numbers');
    const prev = s.nodes[s.nodes.length - 1];
    if (prev !== undefined && !(tt > prev.ttJ2000S)) fail(`epoch ${tt === prev.ttJ2000S ? 'repeats' : 'goes back from'} line ${prev.line}`, l.line, 'keep the data lines in time order, one per epoch');
    const node: OemNode = { ttJ2000S: tt, positionKm: [x[0], x[1], x[2]], velocityKmPerS: [x[3], x[4], x[5]], line: l.line };
    s.nodes.push(node);
  }
  if (state === 'start') fail('empty file', 1, 'give a KVN OEM');
  if (state === 'meta') fail('the file ends inside the metadata (no META_STOP)', last, 'the file may be truncated');
  if (state === 'covariance') fail('the file ends inside a covariance block', last, 'the file may be truncated');
  if (state === 'data') closeData(last);
  if (segments.length === 0) fail('no segment', last, 'add META_START … META_STOP and data lines');
  for (let k = 1; k < segments.length; k++) {
    if (segments[k].usableFromTtJ2000S < segments[k - 1].usableToTtJ2000S - 1e-3 && segments[k].objectName === segments[k - 1].objectName) {
      fail('segment starts before the previous one ends', segments[k].line, 'segments of one object must follow each other in time');
    }
  }
  return { fileName, version, originator, segments };
}
