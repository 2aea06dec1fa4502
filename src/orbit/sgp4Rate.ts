/**
 * SGP4's position and its exact time derivative in one pass (forward-mode differentiation).
 *
 * Why: the clock rate needs the velocity the satellite really has along the positions SGP4 gives,
 * which is not SGP4's own velocity output (see `Sgp4Options.velocity` in sgp4.ts). A five-point
 * stencil of positions costs five SGP4 calls per state; carrying d/dt through the same arithmetic
 * costs about one and a half, and has no truncation or Kepler-tolerance noise.
 *
 * The arithmetic is satellite.js 7's `sgp4` (Vallado, Crawford, Hujsak & Kelso 2006, AIAA 2006-6753)
 * operation for operation, so the position is bit-identical to it (checked in
 * tests/vallado-2006-sgp4.test.ts); each quantity `q` carries `qD = dq/dt` [per minute]. Covered:
 * near-earth SGP4 (simple and full drag) and deep-space SDP4 without resonance (lunar-solar
 * periodics `dpper`, both the direct and the Lyddane branch, and the secular deep-space rates).
 * Resonant records (12-h and 24-h, `irez ≠ 0`) are not: the caller keeps its stencil for those.
 * This file does not import satellite.js (sgp4.ts is its only importer): it reads the initialised
 * record through {@link Sgp4RecordFields} and takes the constants from the caller.
 */

import { RateField, rateRecordFrom, type Sgp4RateRecord, type Sgp4RecordFields } from './sgp4RateRecord.ts';

export type { Sgp4RateRecord, Sgp4RecordFields };

/** SGP4's constants (WGS-72), as satellite.js defines them. */
export interface Sgp4Constants {
  xke: number;
  x2o3: number;
  j2: number;
  j3oj2: number;
  earthRadius: number;
}

/** Error codes, numbered as satellite.js's SatRecError. */
export const SGP4_OK = 0;
const MEAN_ECCENTRICITY = 1;
const MEAN_MOTION = 2;
const PERTURBED_ECCENTRICITY = 3;
const SEMI_LATUS_RECTUM = 4;
const DECAYED = 6;

const PI = Math.PI;
const TWO_PI = PI * 2;
/** Inclination below which SGP4 applies the lunar-solar periodics with Lyddane's modification [rad]. */
const LYDDANE_LIMIT_RAD = 0.2;

/** True when {@link sgp4WithRate} handles this record (everything but deep-space resonance). */
export function rateCovers(rec: Sgp4RecordFields): boolean {
  return rec.method !== 'd' || rec.irez === 0;
}

/** The {@link Sgp4RateRecord} of an initialised record (one per element set, built once). */
export function rateRecordOf(rec: Sgp4RecordFields, c: Sgp4Constants): Sgp4RateRecord {
  return rateRecordFrom(rec, rec.no > 0 ? (c.xke / rec.no) ** c.x2o3 : NaN);
}

/**
 * Position [km, TEME] at `tsince` [min since epoch] into out[0..2] and its time derivative
 * [km/s] into out[3..5]. Returns 0, or satellite.js's error code (the outputs are then undefined).
 * The record is not modified.
 */
export function sgp4WithRate(rec: Sgp4RateRecord, tsince: number, c: Sgp4Constants, out: Float64Array): number {
  const t = tsince;
  // ------- secular gravity and atmospheric drag -------
  const xmdf = rec[RateField.mo] + rec[RateField.mdot] * t;
  const xmdfD = rec[RateField.mdot];
  const argpdf = rec[RateField.argpo] + rec[RateField.argpdot] * t;
  const nodedf = rec[RateField.nodeo] + rec[RateField.nodedot] * t;
  let argpm = argpdf;
  let argpmD = rec[RateField.argpdot];
  let mm = xmdf;
  let mmD = xmdfD;
  const t2 = t * t;
  let nodem = nodedf + rec[RateField.nodecf] * t2;
  let nodemD = rec[RateField.nodedot] + 2 * rec[RateField.nodecf] * t;
  let tempa = 1.0 - rec[RateField.cc1] * t;
  let tempaD = -rec[RateField.cc1];
  let tempe = rec[RateField.bstar] * rec[RateField.cc4] * t;
  let tempeD = rec[RateField.bstar] * rec[RateField.cc4];
  let templ = rec[RateField.t2cof] * t2;
  let templD = 2 * rec[RateField.t2cof] * t;
  if (rec[RateField.simple] === 0) {
    const delomg = rec[RateField.omgcof] * t;
    const cosx = Math.cos(xmdf);
    const delmtemp = 1.0 + rec[RateField.eta] * cosx;
    const delmtempD = -rec[RateField.eta] * Math.sin(xmdf) * xmdfD;
    const delm = rec[RateField.xmcof] * (delmtemp * delmtemp * delmtemp - rec[RateField.delmo]);
    const delmD = rec[RateField.xmcof] * 3 * delmtemp * delmtemp * delmtempD;
    const temp = delomg + delm;
    const tempD = rec[RateField.omgcof] + delmD;
    mm = xmdf + temp;
    mmD = xmdfD + tempD;
    argpm = argpdf - temp;
    argpmD = rec[RateField.argpdot] - tempD;
    const t3 = t2 * t;
    const t4 = t3 * t;
    tempa = tempa - rec[RateField.d2] * t2 - rec[RateField.d3] * t3 - rec[RateField.d4] * t4;
    tempaD = tempaD - 2 * rec[RateField.d2] * t - 3 * rec[RateField.d3] * t2 - 4 * rec[RateField.d4] * t3;
    tempe += rec[RateField.bstar] * rec[RateField.cc5] * (Math.sin(mm) - rec[RateField.sinmao]);
    tempeD += rec[RateField.bstar] * rec[RateField.cc5] * Math.cos(mm) * mmD;
    templ = templ + rec[RateField.t3cof] * t3 + t4 * (rec[RateField.t4cof] + t * rec[RateField.t5cof]);
    templD = templD + 3 * rec[RateField.t3cof] * t2 + 4 * t3 * rec[RateField.t4cof] + 5 * t4 * rec[RateField.t5cof];
  }
  let nm = rec[RateField.no];
  let em = rec[RateField.ecco];
  let emD = 0;
  let inclm = rec[RateField.inclo];
  let inclmD = 0;
  const deep = rec[RateField.deep] !== 0;
  if (deep) {
    // Secular deep-space rates (dspace without resonance).
    em += rec[RateField.dedt] * t;
    emD += rec[RateField.dedt];
    inclm += rec[RateField.didt] * t;
    inclmD += rec[RateField.didt];
    argpm += rec[RateField.domdt] * t;
    argpmD += rec[RateField.domdt];
    nodem += rec[RateField.dnodt] * t;
    nodemD += rec[RateField.dnodt];
    mm += rec[RateField.dmdt] * t;
    mmD += rec[RateField.dmdt];
  }
  if (nm <= 0.0) return MEAN_MOTION;
  const am0 = rec[RateField.am0];
  const am = am0 * tempa * tempa;
  const amD = am0 * 2 * tempa * tempaD;
  // satellite.js then sets nm = xke / am^1.5, which only the resonance terms (not covered here) read.
  em -= tempe;
  emD -= tempeD;
  if (em >= 1.0 || em < -0.001) return MEAN_ECCENTRICITY;
  if (em < 1.0e-6) {
    em = 1.0e-6;
    emD = 0;
  }
  mm += rec[RateField.no] * templ;
  mmD += rec[RateField.no] * templD;
  let xlm = mm + argpm + nodem;
  nodem %= TWO_PI;
  argpm %= TWO_PI;
  xlm %= TWO_PI;
  mm = (xlm - argpm - nodem) % TWO_PI;

  // ------- lunar-solar periodics (dpper, not at epoch) -------
  let ep = em;
  let epD = emD;
  let xincp = inclm;
  let xincpD = inclmD;
  let argpp = argpm;
  let argppD = argpmD;
  let nodep = nodem;
  let nodepD = nodemD;
  let mp = mm;
  let mpD = mmD;
  // Near the earth inclm is the record's inclination: its sine and cosine are the record's.
  let sinip = deep ? Math.sin(inclm) : rec[RateField.sinInclo];
  let cosip = deep ? Math.cos(inclm) : rec[RateField.cosInclo];
  if (deep) {
    const zns = 1.19459e-5;
    const zes = 0.01675;
    const znl = 1.5835218e-4;
    const zel = 0.0549;
    // Sun, then Moon: f2, f3 and sin zf with their derivatives (written out twice: no allocation).
    const szm = rec[RateField.zmos] + zns * t;
    const szf = szm + 2.0 * zes * Math.sin(szm);
    const szfD = zns * (1 + 2.0 * zes * Math.cos(szm));
    const ssz = Math.sin(szf);
    const scz = Math.cos(szf);
    const sszD = scz * szfD;
    const sf2 = 0.5 * ssz * ssz - 0.25;
    const sf2D = ssz * sszD;
    const sf3 = -0.5 * ssz * scz;
    const sf3D = -0.5 * (sszD * scz - ssz * ssz * szfD);
    const ses = rec[RateField.se2] * sf2 + rec[RateField.se3] * sf3;
    const sis = rec[RateField.si2] * sf2 + rec[RateField.si3] * sf3;
    const sls = rec[RateField.sl2] * sf2 + rec[RateField.sl3] * sf3 + rec[RateField.sl4] * ssz;
    const sghs = rec[RateField.sgh2] * sf2 + rec[RateField.sgh3] * sf3 + rec[RateField.sgh4] * ssz;
    const shs = rec[RateField.sh2] * sf2 + rec[RateField.sh3] * sf3;
    const lzm = rec[RateField.zmol] + znl * t;
    const lzf = lzm + 2.0 * zel * Math.sin(lzm);
    const lzfD = znl * (1 + 2.0 * zel * Math.cos(lzm));
    const lsz = Math.sin(lzf);
    const lcz = Math.cos(lzf);
    const lszD = lcz * lzfD;
    const lf2 = 0.5 * lsz * lsz - 0.25;
    const lf2D = lsz * lszD;
    const lf3 = -0.5 * lsz * lcz;
    const lf3D = -0.5 * (lszD * lcz - lsz * lsz * lzfD);
    const sel = rec[RateField.ee2] * lf2 + rec[RateField.e3] * lf3;
    const sil = rec[RateField.xi2] * lf2 + rec[RateField.xi3] * lf3;
    const sll = rec[RateField.xl2] * lf2 + rec[RateField.xl3] * lf3 + rec[RateField.xl4] * lsz;
    const sghl = rec[RateField.xgh2] * lf2 + rec[RateField.xgh3] * lf3 + rec[RateField.xgh4] * lsz;
    const shll = rec[RateField.xh2] * lf2 + rec[RateField.xh3] * lf3;
    let pe = ses + sel;
    let pinc = sis + sil;
    let pl = sls + sll;
    let pgh = sghs + sghl;
    let ph = shs + shll;
    const peD = rec[RateField.se2] * sf2D + rec[RateField.se3] * sf3D + rec[RateField.ee2] * lf2D + rec[RateField.e3] * lf3D;
    const pincD = rec[RateField.si2] * sf2D + rec[RateField.si3] * sf3D + rec[RateField.xi2] * lf2D + rec[RateField.xi3] * lf3D;
    const plD = rec[RateField.sl2] * sf2D + rec[RateField.sl3] * sf3D + rec[RateField.sl4] * sszD + rec[RateField.xl2] * lf2D + rec[RateField.xl3] * lf3D + rec[RateField.xl4] * lszD;
    let pghD = rec[RateField.sgh2] * sf2D + rec[RateField.sgh3] * sf3D + rec[RateField.sgh4] * sszD + rec[RateField.xgh2] * lf2D + rec[RateField.xgh3] * lf3D + rec[RateField.xgh4] * lszD;
    let phD = rec[RateField.sh2] * sf2D + rec[RateField.sh3] * sf3D + rec[RateField.xh2] * lf2D + rec[RateField.xh3] * lf3D;
    pe -= rec[RateField.peo];
    pinc -= rec[RateField.pinco];
    pl -= rec[RateField.plo];
    pgh -= rec[RateField.pgho];
    ph -= rec[RateField.pho];
    xincp += pinc;
    xincpD += pincD;
    ep += pe;
    epD += peD;
    sinip = Math.sin(xincp);
    cosip = Math.cos(xincp);
    const sinipD = cosip * xincpD;
    const cosipD = -sinip * xincpD;
    if (xincp >= LYDDANE_LIMIT_RAD) {
      ph /= sinip;
      phD = (phD - ph * sinipD) / sinip;
      pgh -= cosip * ph;
      pghD -= cosipD * ph + cosip * phD;
      argpp += pgh;
      argppD += pghD;
      nodep += ph;
      nodepD += phD;
      mp += pl;
      mpD += plD;
    } else {
      const sinop = Math.sin(nodep);
      const cosop = Math.cos(nodep);
      const sinopD = cosop * nodepD;
      const cosopD = -sinop * nodepD;
      let alfdp = sinip * sinop;
      let betdp = sinip * cosop;
      let alfdpD = sinipD * sinop + sinip * sinopD;
      let betdpD = sinipD * cosop + sinip * cosopD;
      const dalf = ph * cosop + pinc * cosip * sinop;
      const dbet = -ph * sinop + pinc * cosip * cosop;
      alfdpD += phD * cosop + ph * cosopD + pincD * cosip * sinop + pinc * cosipD * sinop + pinc * cosip * sinopD;
      betdpD += -phD * sinop - ph * sinopD + pincD * cosip * cosop + pinc * cosipD * cosop + pinc * cosip * cosopD;
      alfdp += dalf;
      betdp += dbet;
      nodep %= TWO_PI;
      if (nodep < 0.0 && rec[RateField.afspcMode] !== 0) nodep += TWO_PI;
      let xls = mp + argpp + cosip * nodep;
      let xlsD = mpD + argppD + cosipD * nodep + cosip * nodepD;
      const dls = pl + pgh - pinc * nodep * sinip;
      const dlsD = plD + pghD - pincD * nodep * sinip - pinc * nodepD * sinip - pinc * nodep * sinipD;
      xls += dls;
      xlsD += dlsD;
      const xnoh = nodep;
      nodep = Math.atan2(alfdp, betdp);
      nodepD = (betdp * alfdpD - alfdp * betdpD) / (alfdp * alfdp + betdp * betdp);
      if (nodep < 0.0 && rec[RateField.afspcMode] !== 0) nodep += TWO_PI;
      if (Math.abs(xnoh - nodep) > PI) {
        if (nodep < xnoh) nodep += TWO_PI;
        else nodep -= TWO_PI;
      }
      mp += pl;
      mpD += plD;
      argpp = xls - mp - cosip * nodep;
      argppD = xlsD - mpD - cosipD * nodep - cosip * nodepD;
    }
    if (xincp < 0.0) {
      xincp = -xincp;
      xincpD = -xincpD;
      nodep += PI;
      argpp -= PI;
    }
    if (ep < 0.0 || ep > 1.0) return PERTURBED_ECCENTRICITY;
  }

  // ------- long-period periodics -------
  let aycof = rec[RateField.aycof];
  let aycofD = 0;
  let xlcof = rec[RateField.xlcof];
  let xlcofD = 0;
  let cosipD = 0;
  let sinipD = 0;
  if (deep) {
    sinip = Math.sin(xincp);
    cosip = Math.cos(xincp);
    sinipD = cosip * xincpD;
    cosipD = -sinip * xincpD;
    aycof = -0.5 * c.j3oj2 * sinip;
    aycofD = -0.5 * c.j3oj2 * sinipD;
    const num = -0.25 * c.j3oj2 * sinip * (3.0 + 5.0 * cosip);
    const numD = -0.25 * c.j3oj2 * (sinipD * (3.0 + 5.0 * cosip) + sinip * 5.0 * cosipD);
    if (Math.abs(cosip + 1.0) > 1.5e-12) {
      xlcof = num / (1.0 + cosip);
      xlcofD = (numD - xlcof * cosipD) / (1.0 + cosip);
    } else {
      xlcof = num / 1.5e-12;
      xlcofD = numD / 1.5e-12;
    }
  }
  const cosargp = Math.cos(argpp);
  const sinargp = Math.sin(argpp);
  const axnl = ep * cosargp;
  const axnlD = epD * cosargp - ep * sinargp * argppD;
  const den = am * (1.0 - ep * ep);
  let temp = 1.0 / den;
  const tempD = -temp * temp * (amD * (1.0 - ep * ep) - am * 2 * ep * epD);
  const aynl = ep * sinargp + temp * aycof;
  const aynlD = epD * sinargp + ep * cosargp * argppD + tempD * aycof + temp * aycofD;
  const xl = mp + argpp + nodep + temp * xlcof * axnl;
  const xlD = mpD + argppD + nodepD + tempD * xlcof * axnl + temp * xlcofD * axnl + temp * xlcof * axnlD;

  // ------- Kepler's equation (same iteration, then the implicit derivative) -------
  const u = (xl - nodep) % TWO_PI;
  const uD = xlD - nodepD;
  let eo1 = u;
  let tem5 = 9999.9;
  let ktr = 1;
  let sineo1 = 0;
  let coseo1 = 0;
  while (Math.abs(tem5) >= 1.0e-12 && ktr <= 10) {
    sineo1 = Math.sin(eo1);
    coseo1 = Math.cos(eo1);
    tem5 = 1.0 - coseo1 * axnl - sineo1 * aynl;
    tem5 = (u - aynl * coseo1 + axnl * sineo1 - eo1) / tem5;
    if (Math.abs(tem5) >= 0.95) tem5 = tem5 > 0.0 ? 0.95 : -0.95;
    eo1 += tem5;
    ktr += 1;
  }
  const eD = (uD - aynlD * coseo1 + axnlD * sineo1) / (1.0 - axnl * coseo1 - aynl * sineo1);
  const sineo1D = coseo1 * eD;
  const coseo1D = -sineo1 * eD;

  // ------- short-period preliminaries -------
  const ecose = axnl * coseo1 + aynl * sineo1;
  const ecoseD = axnlD * coseo1 + axnl * coseo1D + aynlD * sineo1 + aynl * sineo1D;
  const esine = axnl * sineo1 - aynl * coseo1;
  const esineD = axnlD * sineo1 + axnl * sineo1D - aynlD * coseo1 - aynl * coseo1D;
  const el2 = axnl * axnl + aynl * aynl;
  const el2D = 2 * (axnl * axnlD + aynl * aynlD);
  const pl = am * (1.0 - el2);
  const plD = amD * (1.0 - el2) - am * el2D;
  if (pl < 0.0) return SEMI_LATUS_RECTUM;
  const rl = am * (1.0 - ecose);
  const rlD = amD * (1.0 - ecose) - am * ecoseD;
  const betal = Math.sqrt(1.0 - el2);
  const betalD = -el2D / (2 * betal);
  temp = esine / (1.0 + betal);
  const tD = (esineD - temp * betalD) / (1.0 + betal);
  const k = am / rl;
  const kD = (amD - k * rlD) / rl;
  const sa = sineo1 - aynl - axnl * temp;
  const saD = sineo1D - aynlD - axnlD * temp - axnl * tD;
  const ca = coseo1 - axnl + aynl * temp;
  const caD = coseo1D - axnlD + aynlD * temp + aynl * tD;
  const sinu = k * sa;
  const sinuD = kD * sa + k * saD;
  const cosu = k * ca;
  const cosuD = kD * ca + k * caD;
  let su = Math.atan2(sinu, cosu);
  let suD = (cosu * sinuD - sinu * cosuD) / (sinu * sinu + cosu * cosu);
  const sin2u = (cosu + cosu) * sinu;
  const sin2uD = 2 * (cosuD * sinu + cosu * sinuD);
  const cos2u = 1.0 - 2.0 * sinu * sinu;
  const cos2uD = -4.0 * sinu * sinuD;
  temp = 1.0 / pl;
  const invPlD = -temp * temp * plD;
  const temp1 = 0.5 * c.j2 * temp;
  const temp1D = 0.5 * c.j2 * invPlD;
  const temp2 = temp1 * temp;
  const temp2D = temp1D * temp + temp1 * invPlD;

  // ------- short-period periodics -------
  let con41 = rec[RateField.con41];
  let x1mth2 = rec[RateField.x1mth2];
  let x7thm1 = rec[RateField.x7thm1];
  let con41D = 0;
  let x1mth2D = 0;
  let x7thm1D = 0;
  if (deep) {
    const cosisq = cosip * cosip;
    const cosisqD = 2 * cosip * cosipD;
    con41 = 3.0 * cosisq - 1.0;
    con41D = 3.0 * cosisqD;
    x1mth2 = 1.0 - cosisq;
    x1mth2D = -cosisqD;
    x7thm1 = 7.0 * cosisq - 1.0;
    x7thm1D = 7.0 * cosisqD;
  }
  const mrt = rl * (1.0 - 1.5 * temp2 * betal * con41) + 0.5 * temp1 * x1mth2 * cos2u;
  const mrtD =
    rlD * (1.0 - 1.5 * temp2 * betal * con41) -
    rl * 1.5 * (temp2D * betal * con41 + temp2 * betalD * con41 + temp2 * betal * con41D) +
    0.5 * (temp1D * x1mth2 * cos2u + temp1 * x1mth2D * cos2u + temp1 * x1mth2 * cos2uD);
  if (mrt < 1.0) return DECAYED;
  su -= 0.25 * temp2 * x7thm1 * sin2u;
  suD -= 0.25 * (temp2D * x7thm1 * sin2u + temp2 * x7thm1D * sin2u + temp2 * x7thm1 * sin2uD);
  const xnode = nodep + 1.5 * temp2 * cosip * sin2u;
  const xnodeD = nodepD + 1.5 * (temp2D * cosip * sin2u + temp2 * cosipD * sin2u + temp2 * cosip * sin2uD);
  const xinc = xincp + 1.5 * temp2 * cosip * sinip * cos2u;
  const xincD = xincpD + 1.5 * (temp2D * cosip * sinip * cos2u + temp2 * cosipD * sinip * cos2u + temp2 * cosip * sinipD * cos2u + temp2 * cosip * sinip * cos2uD);

  // ------- orientation and position -------
  const sinsu = Math.sin(su);
  const cossu = Math.cos(su);
  const snod = Math.sin(xnode);
  const cnod = Math.cos(xnode);
  const sini = Math.sin(xinc);
  const cosi = Math.cos(xinc);
  const xmx = -snod * cosi;
  const xmy = cnod * cosi;
  const ux = xmx * sinsu + cnod * cossu;
  const uy = xmy * sinsu + snod * cossu;
  const uz = sini * sinsu;
  // d/dt of the unit vector: through su, xnode and xinc.
  const xmxD = -cnod * xnodeD * cosi + snod * sini * xincD;
  const xmyD = -snod * xnodeD * cosi - cnod * sini * xincD;
  const uxD = xmxD * sinsu + xmx * cossu * suD - snod * xnodeD * cossu - cnod * sinsu * suD;
  const uyD = xmyD * sinsu + xmy * cossu * suD + cnod * xnodeD * cossu - snod * sinsu * suD;
  const uzD = cosi * xincD * sinsu + sini * cossu * suD;
  const re = c.earthRadius;
  out[0] = mrt * ux * re;
  out[1] = mrt * uy * re;
  out[2] = mrt * uz * re;
  // Per minute → per second.
  const k60 = re / 60;
  out[3] = (mrtD * ux + mrt * uxD) * k60;
  out[4] = (mrtD * uy + mrt * uyD) * k60;
  out[5] = (mrtD * uz + mrt * uzD) * k60;
  return SGP4_OK;
}
