/**
 * TLE / 3LE reading and validation (src/io/tle.ts) against the two-line element format as documented
 * in Vallado, Crawford, Hujsak & Kelso (2006), AIAA 2006-6753 Rev 2, and the SGP4-VER.TLE lines
 * published with it (column layout, modulo-10 checksum with '-' = 1, assumed decimal points).
 *
 * Reference values: the element lines and their checksum digits are the published ones (confirmed);
 * each fault case is a published line altered in one place, with the checksum recomputed so that
 * only the intended fault remains (derived). Alpha-5 numbering (A = 10, I and O skipped) is common practice.
 */
import { describe, expect, it } from 'vitest';
import { OrbitFileError } from '../src/errors.ts';
import { formatTleLine, parseTleFile, tleChecksum } from '../src/io/tle.ts';

const L1_00005 = '1 00005U 58002B   00179.78495062  .00000023  00000-0  28098-4 0  4753';
const L2_00005 = '2 00005  34.2682 348.7242 1859667 331.7664  19.3264 10.82419157413667';
const L1_06251 = '1 06251U 62025E   06176.82412014  .00008885  00000-0  12808-3 0  3985';
const L2_06251 = '2 06251  58.0579  54.0425 0030035 139.1568 221.1854 15.56387291  6774';
const L1_28057 = '1 28057U 03049A   06177.78615833  .00000060  00000-0  35940-4 0  1836';
const L2_28057 = '2 28057  98.4283 247.6961 0000884  88.1964 271.9322 14.35478080140550';
const L1_04632 = '1 04632U 70093B   04031.91070959 -.00000084  00000-0  10000-3 0  9955';
const L2_04632 = '2 04632  11.4628 273.1101 1450506 207.6000 143.9350  1.20231981 44145';
const PUBLISHED = [L1_00005, L2_00005, L1_06251, L2_06251, L1_28057, L2_28057, L1_04632, L2_04632];

/** Replace columns [from, from + text.length) (1-based) and re-checksum, so only the intended fault remains. */
function alter(line: string, fromCol: number, text: string): string {
  const body = line.slice(0, fromCol - 1) + text + line.slice(fromCol - 1 + text.length, 68);
  return formatTleLine(body.slice(0, 68));
}

function faultOf(text: string): OrbitFileError {
  try {
    parseTleFile(text, 'sats.tle');
  } catch (e) {
    expect(e).toBeInstanceOf(OrbitFileError);
    return e as OrbitFileError;
  }
  throw new Error('expected an OrbitFileError, parsing succeeded');
}

describe('checksum (modulo 10, digits by value, "-" = 1)', () => {
  it('reproduces column 69 of every published line', () => {
    for (const line of PUBLISHED) expect(tleChecksum(line), line).toBe(Number(line[68]));
  });
  it('counts a minus sign as 1 (04632 has a negative first derivative)', () => {
    const withPlus = L1_04632.slice(0, 33) + '+' + L1_04632.slice(34);
    expect((tleChecksum(L1_04632) - tleChecksum(withPlus) + 10) % 10).toBe(1);
  });
  it('formatTleLine appends the digit', () => {
    expect(formatTleLine(L1_00005.slice(0, 68))).toBe(L1_00005);
    expect(() => formatTleLine('1 00005U')).toThrow(OrbitFileError);
  });
});

describe('a valid multi-satellite 3LE file', () => {
  const text = ['0 VANGUARD 1', L1_00005, L2_00005, '', 'DELTA 1 DEB   ', L1_06251 + '   ', L2_06251, L1_28057, L2_28057, ''].join('\r\n');
  const recs = parseTleFile(text, 'sats.tle');

  it('reads three records with names (optional "0 " prefix), a bare pair, CRLF and trailing blanks', () => {
    expect(recs.map((r) => r.catalogNumber)).toEqual(['00005', '06251', '28057']);
    expect(recs.map((r) => r.name)).toEqual(['VANGUARD 1', 'DELTA 1 DEB', null]);
    expect(recs.map((r) => r.lineNumberInFile)).toEqual([2, 6, 8]);
    expect(recs[0].line1).toBe(L1_00005);
    expect(recs[1].line1).toBe(L1_06251);
  });
  it('decodes fields with their assumed decimal points', () => {
    const r = recs[0];
    expect(r.eccentricity).toBe(0.1859667);
    expect(r.inclinationDeg).toBe(34.2682);
    expect(r.meanMotionRevPerDay).toBe(10.82419157);
    expect(r.bstarPerEarthRadius).toBeCloseTo(0.28098e-4, 15);
    expect(r.catalogNumberValue).toBe(5);
    expect(r.internationalDesignator).toBe('58002B');
  });
  it('gives the epoch as UTC: 00179.78495062 → 2000-06-27 18:50:19.733568 (2000 is a leap year)', () => {
    const e = recs[0].epochUtc;
    expect([e.year, e.month, e.day, e.hour, e.minute]).toEqual([2000, 6, 27, 18, 50]);
    expect(Math.abs(e.second - 19.733568)).toBeLessThan(1e-6); // 1 µs: day fraction × 86400 in doubles
    expect(recs[0].epochYear).toBe(2000);
    expect(recs[0].epochDayOfYear).toBe(179.78495062);
  });
  it('reads an Alpha-5 catalogue number (A0001 = 100001)', () => {
    const l1 = alter(L1_00005, 3, 'A0001');
    const l2 = alter(L2_00005, 3, 'A0001');
    const [r] = parseTleFile(`${l1}\n${l2}\n`, 'alpha5.tle');
    expect(r.catalogNumber).toBe('A0001');
    expect(r.catalogNumberValue).toBe(100001);
  });
});

describe('each fault gives an OrbitFileError at the right line and column', () => {
  it('wrong checksum: column 69, names expected and found digits', () => {
    const bad = L2_00005.slice(0, 68) + '0'; // published digit is 7
    const e = faultOf(`NAME\n${L1_00005}\n${bad}\n`);
    expect([e.file, e.line, e.column]).toEqual(['sats.tle', 3, 69]);
    expect(e.what).toContain('"0"');
    expect(e.what).toContain('expected 7');
  });
  it('wrong line number in column 1 of line 1 and of line 2', () => {
    let e = faultOf(`${alter(L1_00005, 1, '3')}\n${L2_00005}\n`);
    expect([e.line, e.column]).toEqual([1, 1]);
    e = faultOf(`${L1_00005}\n${alter(L2_00005, 1, '3')}\n`);
    expect([e.line, e.column]).toEqual([2, 1]);
  });
  it('catalogue numbers differing between line 1 and line 2: line 2, column 3', () => {
    const e = faultOf(`${L1_00005}\n${alter(L2_00005, 3, '00006')}\n`);
    expect([e.line, e.column]).toEqual([2, 3]);
    expect(e.what).toContain('00006');
  });
  it('truncated line: column just past the end', () => {
    const e = faultOf(`X\n${L1_00005}\n${L2_00005.slice(0, 60)}\n`);
    expect([e.line, e.column]).toEqual([3, 61]);
    expect(e.what).toContain('60 characters');
  });
  it('too-long line: column 70', () => {
    const e = faultOf(`${L1_00005}0\n${L2_00005}\n`);
    expect([e.line, e.column]).toEqual([1, 70]);
  });
  it('a tab anywhere: the tab column', () => {
    const e = faultOf(`${L1_00005}\n2 00005\t34.2682 348.7242 1859667 331.7664  19.3264 10.82419157413667\n`);
    expect([e.line, e.column]).toEqual([2, 8]);
    const e2 = faultOf(`SAT\tNAME\n${L1_00005}\n${L2_00005}\n`);
    expect([e2.line, e2.column]).toEqual([1, 4]);
  });
  it('non-numeric epoch: line 1 column 21', () => {
    const e = faultOf(`${alter(L1_00005, 21, '0017X')}\n${L2_00005}\n`);
    expect([e.line, e.column]).toEqual([1, 21]);
    expect(e.what).toContain('epoch');
  });
  it('non-numeric mean motion: line 2 column 53', () => {
    const e = faultOf(`${L1_00005}\n${alter(L2_00005, 53, '10.8241O157')}\n`);
    expect([e.line, e.column]).toEqual([2, 53]);
    expect(e.what).toContain('mean motion');
  });
  it('non-numeric eccentricity: line 2 column 27', () => {
    const e = faultOf(`${L1_00005}\n${alter(L2_00005, 27, '18596-7')}\n`);
    expect([e.line, e.column]).toEqual([2, 27]);
    expect(e.what).toContain('eccentricity');
  });
  it('non-numeric inclination: line 2 column 9', () => {
    const e = faultOf(`${L1_00005}\n${alter(L2_00005, 9, ' 34,2682')}\n`);
    expect([e.line, e.column]).toEqual([2, 9]);
    expect(e.what).toContain('inclination');
  });
  it('non-numeric B*: line 1 column 54', () => {
    const e = faultOf(`${alter(L1_00005, 54, ' 2809X-4')}\n${L2_00005}\n`);
    expect([e.line, e.column]).toEqual([1, 54]);
  });
  it('inclination above 180°: line 2 column 9', () => {
    const e = faultOf(`${L1_00005}\n${alter(L2_00005, 9, '190.0000')}\n`);
    expect([e.line, e.column]).toEqual([2, 9]);
  });
  it('line 1 without its line 2: at end of file, and followed by another line 1', () => {
    let e = faultOf(`${L1_06251}\n${L2_06251}\nNAME\n${L1_00005}\n`);
    expect([e.line, e.column]).toEqual([4, null]);
    expect(e.what).toContain('without its line 2');
    e = faultOf(`${L1_00005}\n${L1_06251}\n${L2_06251}\n`);
    expect(e.line).toBe(1);
    expect(e.what).toContain('without its line 2');
  });
  it('line 2 without line 1', () => {
    const e = faultOf(`${L2_00005}\n`);
    expect([e.line, e.column]).toEqual([1, 1]);
  });
  it('a name line with nothing after it', () => {
    const e = faultOf(`${L1_00005}\n${L2_00005}\nORPHAN\n`);
    expect(e.line).toBe(3);
  });
  it('an empty file (or only blank lines)', () => {
    expect(faultOf('').line).toBe(1);
    expect(faultOf('\n  \n\r\n').what).toContain('no element set');
  });
  it('the message carries file:line:column and a fix', () => {
    const e = faultOf(`${L1_00005}\n${L2_00005.slice(0, 68)}1\n`);
    expect(e.message).toMatch(/\(sats\.tle:2:69\) — \S/);
  });
});
