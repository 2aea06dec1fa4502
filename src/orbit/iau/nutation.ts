/**
 * Nutation in longitude Δψ and obliquity Δε [rad], IAU 2000A (MHB2000 without free core
 * nutation; IERS Conventions 2010 §5.5.4, tables 5.3a/5.3b) and its IAU 2006 form (§5.6.3: the
 * IAU 2000A amplitudes scaled for the IAU 2006 J2 rate, Capitaine et al. 2005).
 *
 * The luni-solar series uses the IERS 2003 arguments except l' and D, and the planetary series the
 * simplified MHB2000 arguments, as the IAU 2000A model was published (the differences are below
 * 0.1 µas; kept so that the SOFA test values are met to the last digit). Series data:
 * ./data/nutation2000a.ts. Time t: TT Julian centuries since J2000.0.
 */
import { LUNI_SOLAR_ROWS, PLANETARY_ROWS } from './data/nutation2000a.ts';
import {
  earthLongitudeRad,
  generalPrecessionRad,
  jupiterLongitudeRad,
  marsLongitudeRad,
  mercuryLongitudeRad,
  moonArgumentOfLatitudeRad,
  moonMeanAnomalyRad,
  moonNodeRad,
  saturnLongitudeRad,
  uranusLongitudeRad,
  venusLongitudeRad,
} from './fundamentalArguments.ts';
import { ARCSEC_TO_RAD, TWO_PI } from './rotation.ts';

/** Units of the tables, 0.1 µas, in radians. */
const TENTH_MICROARCSEC_TO_RAD = ARCSEC_TO_RAD / 1e7;
/** One turn in arcseconds. */
const TURN_ARCSEC = 1296000;

/** Nutation angles [rad]. */
export interface Nutation {
  dPsiRad: number;
  dEpsRad: number;
}

function parseRows(text: string, width: number): Float64Array {
  const nums = text.trim().split(/\s+/).map(Number);
  if (nums.length % width !== 0 || nums.some((x) => !Number.isFinite(x))) throw new Error(`nutation table: ${nums.length} numbers is not rows of ${width}`);
  return Float64Array.from(nums);
}

const LS_WIDTH = 11;
const PL_WIDTH = 17;
let lsTable: Float64Array | null = null;
let plTable: Float64Array | null = null;

/** Parsed tables (678 × 11 and 687 × 17), built once. */
export function nutationTables(): { luniSolar: Float64Array; planetary: Float64Array } {
  lsTable ??= parseRows(LUNI_SOLAR_ROWS, LS_WIDTH);
  plTable ??= parseRows(PLANETARY_ROWS, PL_WIDTH);
  return { luniSolar: lsTable, planetary: plTable };
}

/** IAU 2000A nutation at t (TT Julian centuries since J2000.0). */
export function nutation2000a(t: number): Nutation {
  const { luniSolar, planetary } = nutationTables();
  // Luni-solar arguments: IERS 2003 l, F, Ω; MHB2000 l' and D.
  const l = moonMeanAnomalyRad(t);
  const lp = ((1287104.79305 + t * (129596581.0481 + t * (-0.5532 + t * (0.000136 + t * -0.00001149)))) % TURN_ARCSEC) * ARCSEC_TO_RAD;
  const f = moonArgumentOfLatitudeRad(t);
  const d = ((1072260.70369 + t * (1602961601.209 + t * (-6.3706 + t * (0.006593 + t * -0.00003169)))) % TURN_ARCSEC) * ARCSEC_TO_RAD;
  const om = moonNodeRad(t);
  let dp = 0;
  let de = 0;
  // Summed smallest first, as published, for the last bits. The arguments stay below ~300 rad, so
  // sin and cos need no reduction (a reduction per term would triple the cost).
  for (let i = luniSolar.length / LS_WIDTH - 1; i >= 0; i--) {
    const o = i * LS_WIDTH;
    const arg = luniSolar[o] * l + luniSolar[o + 1] * lp + luniSolar[o + 2] * f + luniSolar[o + 3] * d + luniSolar[o + 4] * om;
    const s = Math.sin(arg);
    const c = Math.cos(arg);
    dp += (luniSolar[o + 5] + luniSolar[o + 6] * t) * s + luniSolar[o + 7] * c;
    de += (luniSolar[o + 8] + luniSolar[o + 9] * t) * c + luniSolar[o + 10] * s;
  }
  const dPsiLs = dp * TENTH_MICROARCSEC_TO_RAD;
  const dEpsLs = de * TENTH_MICROARCSEC_TO_RAD;

  // Planetary arguments: MHB2000 linear Delaunay arguments and Neptune, IERS 2003 planets and pA.
  const args = [
    (2.35555598 + 8328.6914269554 * t) % TWO_PI,
    (1.627905234 + 8433.466158131 * t) % TWO_PI,
    (5.198466741 + 7771.3771468121 * t) % TWO_PI,
    (2.1824392 - 33.757045 * t) % TWO_PI,
    mercuryLongitudeRad(t),
    venusLongitudeRad(t),
    earthLongitudeRad(t),
    marsLongitudeRad(t),
    jupiterLongitudeRad(t),
    saturnLongitudeRad(t),
    uranusLongitudeRad(t),
    (5.321159 + 3.8127774 * t) % TWO_PI,
    generalPrecessionRad(t),
  ];
  dp = 0;
  de = 0;
  for (let i = planetary.length / PL_WIDTH - 1; i >= 0; i--) {
    const o = i * PL_WIDTH;
    let arg = 0;
    for (let k = 0; k < 13; k++) arg += planetary[o + k] * args[k];
    const s = Math.sin(arg);
    const c = Math.cos(arg);
    dp += planetary[o + 13] * s + planetary[o + 14] * c;
    de += planetary[o + 15] * s + planetary[o + 16] * c;
  }
  return { dPsiRad: dPsiLs + dp * TENTH_MICROARCSEC_TO_RAD, dEpsRad: dEpsLs + de * TENTH_MICROARCSEC_TO_RAD };
}

/**
 * IAU 2000A nutation adjusted to IAU 2006 precession (IERS Conventions 2010 eq. 5.39 note:
 * Δψ × (1 + 0.4697e-6 − 2.7774e-6 t), Δε × (1 − 2.7774e-6 t)).
 */
export function nutation2006a(t: number): Nutation {
  const n = nutation2000a(t);
  const fj2 = -2.7774e-6 * t;
  return { dPsiRad: n.dPsiRad * (1 + 0.4697e-6 + fj2), dEpsRad: n.dEpsRad * (1 + fj2) };
}
