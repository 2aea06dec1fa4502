/**
 * SP3-c and SP3-d precise ephemeris files, read strictly.
 *
 * Format: "The Extended Standard Product 3 Orbit Format (SP3-c)", S. Hilla, NGS, 2002 (rev. 2010),
 * and "The Extended Standard Product 3 Orbit Format (SP3-d)", S. Hilla, IGS, 2016 (column layout
 * from those documents, checked from memory). SP3-d differs from SP3-c in the header only: more
 * than 85 satellites (as many `+`/`++` lines as needed, count in columns 4–6) and comment lines
 * of any number.
 *
 * Layout read here (1-based columns):
 * - line 1 `#cP2024  5  1  0  0  0.00000000      97 ORBIT IGS20 FIT  IGS`: version 2, P/V flag 3,
 *   start 4–31, number of epochs 33–39, data used 41–45, coordinate system 47–51, orbit type 53–55,
 *   agency 57–60;
 * - line 2 `## 2312 259200.00000000   900.00000000 60431 0.0000000000000`: GPS week 4–7, seconds of
 *   week 9–23, epoch interval 25–38, MJD 40–44, fraction of day 46–60;
 * - `+ ` satellite list (count in 4–6, ids of 3 characters from column 10, 17 per line), `++`
 *   accuracy exponents (17 × I3 from column 10), two `%c` (file type 4–5, time system 10–12), two
 *   `%f`, two `%i`, any `/*` comments;
 * - `*  YYYY MM DD HH MM SS.ssssssss` epochs, `P` records (id 2–4, x y z km and clock µs in
 *   four F14.6 fields from column 5, standard-deviation exponents 62–73, clock event flag `E`
 *   in 75, clock prediction `P` in 76, maneuver `M` in 79, orbit prediction `P` in 80),
 *   optional `V` records (dm/s and 10⁻⁴ µs/s), optional `EP`/`EV` correlation records (skipped),
 *   and `EOF`.
 *
 * Bad or absent values (spec): a position of 0.000000 in all three components, or a velocity
 * likewise, marks that record missing; a clock of 999999.999999 marks the clock missing. A bad
 * clock leaves the position usable: orbits need only positions.
 *
 * Not read: comment-line counts are not enforced; `EP`/`EV` correlations are skipped. Epoch times
 * stay civil labels in the file's time system; `src/orbit/sp3.ts` turns them into instants.
 * Every fault throws {@link OrbitFileError} with the 1-based line and column.
 *
 * Split along the file's seam: sp3Header.ts parses the header (a few dozen lines, from an array),
 * sp3Epochs.ts the epochs one line at a time, so a file streams (textSource.ts) and only the
 * records are kept.
 */
import type { Sp3Epoch, Sp3File, Sp3Record, Sp3VelocityRecord } from '../model/sp3.ts';
import { Sp3EpochReader } from './sp3Epochs.ts';
import { isHeaderLine, parseSp3Header } from './sp3Header.ts';
import { linesOf, readLinesSync, type TextLine } from './textSource.ts';

export type { Sp3Epoch, Sp3File, Sp3Record, Sp3VelocityRecord };

/** Header lines kept before the header is parsed regardless (SP3-d allows any number of comments). */
const MAX_HEADER_LINES = 20_000;

/** An SP3 file fed one line at a time: header lines are gathered, then the epochs stream. */
export class Sp3Reader {
  private readonly header: string[] = [];
  private epochs: Sp3EpochReader | null = null;

  constructor(private readonly fileName: string) {}

  push(l: TextLine): void {
    if (this.epochs !== null) {
      this.epochs.push(l.text, l.line - 1);
      return;
    }
    this.header.push(l.text);
    // Lines 1 and 2, then "+", "++", "%c", "%f", "%i" and "/*" lines; the first other line ends the header.
    if (this.header.length <= 2 || (isHeaderLine(l.text) && this.header.length < MAX_HEADER_LINES)) return;
    this.startEpochs();
  }

  private startEpochs(): void {
    const { header, next } = parseSp3Header(this.header, this.fileName);
    this.epochs = new Sp3EpochReader(header);
    for (let k = next; k < this.header.length; k++) this.epochs.push(this.header[k], k);
    this.header.length = 0;
  }

  finish(): Sp3File {
    if (this.epochs === null) this.startEpochs();
    return (this.epochs as Sp3EpochReader).finish();
  }
}

/**
 * Parse the text of an SP3-c or SP3-d file. `fileName` is used in messages only.
 * Throws {@link OrbitFileError} on any fault; see the module comment for what is checked.
 */
export function parseSp3(text: string, fileName: string): Sp3File {
  return parseSp3Lines(linesOf(text), fileName);
}

/** The same, from lines as they stream. */
export function parseSp3Lines(source: Iterable<TextLine>, fileName: string): Sp3File {
  const r = new Sp3Reader(fileName);
  for (const l of source) r.push(l);
  return r.finish();
}

const cache = new Map<string, Sp3File>();

/** An SP3 file (path, gzip or not) read by streaming its lines, parsed once per process. */
export function readSp3File(path: string, where: string): Sp3File {
  let f = cache.get(path);
  if (f === undefined) {
    f = parseSp3Lines(readLinesSync(path, 'orbit', where), path);
    cache.set(path, f);
  }
  return f;
}
