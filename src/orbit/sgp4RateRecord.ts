/**
 * The satellite.js record fields the differentiated SGP4 (sgp4Rate.ts) reads, copied once per
 * element set into a Float64Array, indexed by {@link RateField}.
 *
 * Why an array and not an object: the propagation reads some seventy fields per state, and an
 * object's field reads carry a check of its hidden class. V8 revised that class as records of
 * other orbits arrived (a field first seen as a whole number, then as a fraction), and in about one
 * run in five the optimised propagation then deoptimised at a field read on every call (90 000 to
 * 150 000 times in a 180-day plan of 24 satellites, seen with --trace-deopt) instead of being
 * re-optimised. A typed array's reads have no such check. Flags are stored as 1 or 0.
 */

/** The fields of an initialised satellite.js record this module reads (names as satellite.js has them). */
export interface Sgp4RecordFields {
  method: string;
  isimp: number;
  irez: number;
  operationmode: string;
  mo: number;
  mdot: number;
  argpo: number;
  argpdot: number;
  nodeo: number;
  nodedot: number;
  nodecf: number;
  cc1: number;
  cc4: number;
  cc5: number;
  bstar: number;
  t2cof: number;
  t3cof: number;
  t4cof: number;
  t5cof: number;
  omgcof: number;
  eta: number;
  xmcof: number;
  delmo: number;
  d2: number;
  d3: number;
  d4: number;
  sinmao: number;
  no: number;
  ecco: number;
  inclo: number;
  aycof: number;
  xlcof: number;
  con41: number;
  x1mth2: number;
  x7thm1: number;
  dedt: number;
  didt: number;
  domdt: number;
  dnodt: number;
  dmdt: number;
  e3: number;
  ee2: number;
  peo: number;
  pgho: number;
  pho: number;
  pinco: number;
  plo: number;
  se2: number;
  se3: number;
  sgh2: number;
  sgh3: number;
  sgh4: number;
  sh2: number;
  sh3: number;
  si2: number;
  si3: number;
  sl2: number;
  sl3: number;
  sl4: number;
  xgh2: number;
  xgh3: number;
  xgh4: number;
  xh2: number;
  xh3: number;
  xi2: number;
  xi3: number;
  xl2: number;
  xl3: number;
  xl4: number;
  zmol: number;
  zmos: number;
}

/** Index of each field in a {@link Sgp4RateRecord} (satellite.js's names, then our own). */
export const enum RateField {
  mo = 0, mdot, argpo, argpdot, nodeo, nodedot, nodecf, cc1, cc4, cc5, bstar, t2cof, t3cof, t4cof,
  t5cof, omgcof, eta, xmcof, delmo, d2, d3, d4, sinmao, no, ecco, inclo, aycof, xlcof, con41,
  x1mth2, x7thm1, dedt, didt, domdt, dnodt, dmdt, e3, ee2, peo, pgho, pho, pinco, plo, se2, se3,
  sgh2, sgh3, sgh4, sh2, sh3, si2, si3, sl2, sl3, sl4, xgh2, xgh3, xgh4, xh2, xh3, xi2, xi3, xl2,
  xl3, xl4, zmol, zmos, deep, simple, afspcMode, am0, sinInclo, cosInclo,
  /** Number of fields. */
  count,
}

/**
 * The fields {@link Sgp4RecordFields} lists (strings replaced by flags), with three quantities SGP4
 * recomputes at every call although they depend on the record only: `am0 = (xke/no)^(2/3)` and,
 * near the earth, sin and cos of the inclination. Computed by the same operations as satellite.js,
 * so the propagation stays bit-identical.
 */
export type Sgp4RateRecord = Float64Array & { readonly sgp4RateRecord: true };

/** The record of an initialised satellite.js record; `am0` = (xke/no)^(2/3) [earth radii], NaN when no ≤ 0. */
export function rateRecordFrom(rec: Sgp4RecordFields, am0: number): Sgp4RateRecord {
  const r = new Float64Array(RateField.count);
  r[RateField.mo] = rec.mo;
  r[RateField.mdot] = rec.mdot;
  r[RateField.argpo] = rec.argpo;
  r[RateField.argpdot] = rec.argpdot;
  r[RateField.nodeo] = rec.nodeo;
  r[RateField.nodedot] = rec.nodedot;
  r[RateField.nodecf] = rec.nodecf;
  r[RateField.cc1] = rec.cc1;
  r[RateField.cc4] = rec.cc4;
  r[RateField.cc5] = rec.cc5;
  r[RateField.bstar] = rec.bstar;
  r[RateField.t2cof] = rec.t2cof;
  r[RateField.t3cof] = rec.t3cof;
  r[RateField.t4cof] = rec.t4cof;
  r[RateField.t5cof] = rec.t5cof;
  r[RateField.omgcof] = rec.omgcof;
  r[RateField.eta] = rec.eta;
  r[RateField.xmcof] = rec.xmcof;
  r[RateField.delmo] = rec.delmo;
  r[RateField.d2] = rec.d2;
  r[RateField.d3] = rec.d3;
  r[RateField.d4] = rec.d4;
  r[RateField.sinmao] = rec.sinmao;
  r[RateField.no] = rec.no;
  r[RateField.ecco] = rec.ecco;
  r[RateField.inclo] = rec.inclo;
  r[RateField.aycof] = rec.aycof;
  r[RateField.xlcof] = rec.xlcof;
  r[RateField.con41] = rec.con41;
  r[RateField.x1mth2] = rec.x1mth2;
  r[RateField.x7thm1] = rec.x7thm1;
  r[RateField.dedt] = rec.dedt;
  r[RateField.didt] = rec.didt;
  r[RateField.domdt] = rec.domdt;
  r[RateField.dnodt] = rec.dnodt;
  r[RateField.dmdt] = rec.dmdt;
  r[RateField.e3] = rec.e3;
  r[RateField.ee2] = rec.ee2;
  r[RateField.peo] = rec.peo;
  r[RateField.pgho] = rec.pgho;
  r[RateField.pho] = rec.pho;
  r[RateField.pinco] = rec.pinco;
  r[RateField.plo] = rec.plo;
  r[RateField.se2] = rec.se2;
  r[RateField.se3] = rec.se3;
  r[RateField.sgh2] = rec.sgh2;
  r[RateField.sgh3] = rec.sgh3;
  r[RateField.sgh4] = rec.sgh4;
  r[RateField.sh2] = rec.sh2;
  r[RateField.sh3] = rec.sh3;
  r[RateField.si2] = rec.si2;
  r[RateField.si3] = rec.si3;
  r[RateField.sl2] = rec.sl2;
  r[RateField.sl3] = rec.sl3;
  r[RateField.sl4] = rec.sl4;
  r[RateField.xgh2] = rec.xgh2;
  r[RateField.xgh3] = rec.xgh3;
  r[RateField.xgh4] = rec.xgh4;
  r[RateField.xh2] = rec.xh2;
  r[RateField.xh3] = rec.xh3;
  r[RateField.xi2] = rec.xi2;
  r[RateField.xi3] = rec.xi3;
  r[RateField.xl2] = rec.xl2;
  r[RateField.xl3] = rec.xl3;
  r[RateField.xl4] = rec.xl4;
  r[RateField.zmol] = rec.zmol;
  r[RateField.zmos] = rec.zmos;
  r[RateField.deep] = rec.method === 'd' ? 1 : 0;
  r[RateField.simple] = rec.isimp === 1 ? 1 : 0;
  r[RateField.afspcMode] = rec.operationmode === 'a' ? 1 : 0;
  r[RateField.am0] = am0;
  r[RateField.sinInclo] = Math.sin(rec.inclo);
  r[RateField.cosInclo] = Math.cos(rec.inclo);
  return r as Sgp4RateRecord;
}
