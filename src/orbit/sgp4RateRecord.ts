/**
 * The satellite.js record fields the differentiated SGP4 (sgp4Rate.ts) reads, copied once per
 * element set into an object of one class.
 *
 * Why a class with one named assignment per field: every record then shares one hidden class with
 * its fields in the object itself, so the propagation's field reads stay monomorphic. Copied key by
 * key (Object.fromEntries), each record ended with a hidden class of its own; the optimised
 * propagation then met more classes than it could check and deoptimised at a field read on every
 * call for most records, about 150 000 times in a 180-day plan of 24 satellites.
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

/**
 * The fields {@link Sgp4RecordFields} lists (strings replaced by flags), with three quantities SGP4
 * recomputes at every call although they depend on the record only: `am0 = (xke/no)^(2/3)` and,
 * near the earth, sin and cos of the inclination. Computed by the same operations as satellite.js,
 * so the propagation stays bit-identical.
 */
export class Sgp4RateRecord {
  declare readonly mo: number;
  declare readonly mdot: number;
  declare readonly argpo: number;
  declare readonly argpdot: number;
  declare readonly nodeo: number;
  declare readonly nodedot: number;
  declare readonly nodecf: number;
  declare readonly cc1: number;
  declare readonly cc4: number;
  declare readonly cc5: number;
  declare readonly bstar: number;
  declare readonly t2cof: number;
  declare readonly t3cof: number;
  declare readonly t4cof: number;
  declare readonly t5cof: number;
  declare readonly omgcof: number;
  declare readonly eta: number;
  declare readonly xmcof: number;
  declare readonly delmo: number;
  declare readonly d2: number;
  declare readonly d3: number;
  declare readonly d4: number;
  declare readonly sinmao: number;
  declare readonly no: number;
  declare readonly ecco: number;
  declare readonly inclo: number;
  declare readonly aycof: number;
  declare readonly xlcof: number;
  declare readonly con41: number;
  declare readonly x1mth2: number;
  declare readonly x7thm1: number;
  declare readonly dedt: number;
  declare readonly didt: number;
  declare readonly domdt: number;
  declare readonly dnodt: number;
  declare readonly dmdt: number;
  declare readonly e3: number;
  declare readonly ee2: number;
  declare readonly peo: number;
  declare readonly pgho: number;
  declare readonly pho: number;
  declare readonly pinco: number;
  declare readonly plo: number;
  declare readonly se2: number;
  declare readonly se3: number;
  declare readonly sgh2: number;
  declare readonly sgh3: number;
  declare readonly sgh4: number;
  declare readonly sh2: number;
  declare readonly sh3: number;
  declare readonly si2: number;
  declare readonly si3: number;
  declare readonly sl2: number;
  declare readonly sl3: number;
  declare readonly sl4: number;
  declare readonly xgh2: number;
  declare readonly xgh3: number;
  declare readonly xgh4: number;
  declare readonly xh2: number;
  declare readonly xh3: number;
  declare readonly xi2: number;
  declare readonly xi3: number;
  declare readonly xl2: number;
  declare readonly xl3: number;
  declare readonly xl4: number;
  declare readonly zmol: number;
  declare readonly zmos: number;
  declare readonly deep: boolean;
  declare readonly simple: boolean;
  declare readonly afspcMode: boolean;
  /** (xke/no)^(2/3) [earth radii], NaN for a record with no ≤ 0. */
  declare readonly am0: number;
  declare readonly sinInclo: number;
  declare readonly cosInclo: number;

  constructor(rec: Sgp4RecordFields, am0: number) {
    this.mo = rec.mo;
    this.mdot = rec.mdot;
    this.argpo = rec.argpo;
    this.argpdot = rec.argpdot;
    this.nodeo = rec.nodeo;
    this.nodedot = rec.nodedot;
    this.nodecf = rec.nodecf;
    this.cc1 = rec.cc1;
    this.cc4 = rec.cc4;
    this.cc5 = rec.cc5;
    this.bstar = rec.bstar;
    this.t2cof = rec.t2cof;
    this.t3cof = rec.t3cof;
    this.t4cof = rec.t4cof;
    this.t5cof = rec.t5cof;
    this.omgcof = rec.omgcof;
    this.eta = rec.eta;
    this.xmcof = rec.xmcof;
    this.delmo = rec.delmo;
    this.d2 = rec.d2;
    this.d3 = rec.d3;
    this.d4 = rec.d4;
    this.sinmao = rec.sinmao;
    this.no = rec.no;
    this.ecco = rec.ecco;
    this.inclo = rec.inclo;
    this.aycof = rec.aycof;
    this.xlcof = rec.xlcof;
    this.con41 = rec.con41;
    this.x1mth2 = rec.x1mth2;
    this.x7thm1 = rec.x7thm1;
    this.dedt = rec.dedt;
    this.didt = rec.didt;
    this.domdt = rec.domdt;
    this.dnodt = rec.dnodt;
    this.dmdt = rec.dmdt;
    this.e3 = rec.e3;
    this.ee2 = rec.ee2;
    this.peo = rec.peo;
    this.pgho = rec.pgho;
    this.pho = rec.pho;
    this.pinco = rec.pinco;
    this.plo = rec.plo;
    this.se2 = rec.se2;
    this.se3 = rec.se3;
    this.sgh2 = rec.sgh2;
    this.sgh3 = rec.sgh3;
    this.sgh4 = rec.sgh4;
    this.sh2 = rec.sh2;
    this.sh3 = rec.sh3;
    this.si2 = rec.si2;
    this.si3 = rec.si3;
    this.sl2 = rec.sl2;
    this.sl3 = rec.sl3;
    this.sl4 = rec.sl4;
    this.xgh2 = rec.xgh2;
    this.xgh3 = rec.xgh3;
    this.xgh4 = rec.xgh4;
    this.xh2 = rec.xh2;
    this.xh3 = rec.xh3;
    this.xi2 = rec.xi2;
    this.xi3 = rec.xi3;
    this.xl2 = rec.xl2;
    this.xl3 = rec.xl3;
    this.xl4 = rec.xl4;
    this.zmol = rec.zmol;
    this.zmos = rec.zmos;
    this.deep = rec.method === 'd';
    this.simple = rec.isimp === 1;
    this.afspcMode = rec.operationmode === 'a';
    this.am0 = am0;
    this.sinInclo = Math.sin(rec.inclo);
    this.cosInclo = Math.cos(rec.inclo);
  }
}
