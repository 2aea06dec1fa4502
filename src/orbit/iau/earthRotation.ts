/**
 * Earth rotation angle and Greenwich sidereal times, IERS Conventions 2010 ch. 5:
 *
 * - ERA = 2π(0.7790572732640 + 1.00273781191135448 D_U), D_U = JD(UT1) − 2451545.0 (eq. 5.15).
 * - GMST = ERA + 0.014506″ + 4612.156534″ t + 1.3915817″ t² − 0.00000044″ t³ − 0.000029956″ t⁴
 *   − 0.0000000368″ t⁵, t in TT Julian centuries (eq. 5.32).
 * - GST = GMST + EE (eq. 5.31 through the equinox-based route of §5.5.7), with
 *   EE = Δψ cos ε_A + complementary terms (eqs. 5.33 and 5.35, table 5.2e; Capitaine, Wallace &
 *   McCarthy 2003). Agrees with the CIO-based GST (ERA − EO) to well under 1 µas (tested).
 *
 * UT1 is given as days since J2000.0 split into two numbers whose sum is the date, so that the
 * fraction of the day keeps full precision.
 */
import { earthLongitudeRad, generalPrecessionRad, moonArgumentOfLatitudeRad, moonElongationRad, moonMeanAnomalyRad, moonNodeRad, sunMeanAnomalyRad, venusLongitudeRad } from './fundamentalArguments.ts';
import type { Nutation } from './nutation.ts';
import { ARCSEC_TO_RAD, normalizeAngleRad, TWO_PI } from './rotation.ts';

/** ERA [rad] at UT1 days since J2000.0 = `ut1DaysA + ut1DaysB`. */
export function earthRotationAngleRad(ut1DaysA: number, ut1DaysB = 0): number {
  const fraction = (ut1DaysA % 1) + (ut1DaysB % 1);
  return normalizeAngleRad(TWO_PI * (fraction + 0.779057273264 + 0.00273781191135448 * (ut1DaysA + ut1DaysB)));
}

/** GMST, IAU 2006 [rad]: UT1 days since J2000.0 (two parts) and TT Julian centuries t. */
export function gmst2006Rad(ut1DaysA: number, ut1DaysB: number, t: number): number {
  const poly = 0.014506 + t * (4612.156534 + t * (1.3915817 + t * (-0.00000044 + t * (-0.000029956 + t * -0.0000000368))));
  return normalizeAngleRad(earthRotationAngleRad(ut1DaysA, ut1DaysB) + poly * ARCSEC_TO_RAD);
}


/**
 * Complementary terms of the equation of the equinoxes, table 5.2e of IERS Conventions 2010:
 * rows of multipliers of l, l', F, D, Ω, L_Ve, L_E, pA, then sine and cosine amplitudes [µas].
 */
const COMPLEMENTARY_T0: readonly (readonly number[])[] = [
  [0, 0, 0, 0, 1, 0, 0, 0, 2640.96, -0.39],
  [0, 0, 0, 0, 2, 0, 0, 0, 63.52, -0.02],
  [0, 0, 2, -2, 3, 0, 0, 0, 11.75, 0.01],
  [0, 0, 2, -2, 1, 0, 0, 0, 11.21, 0.01],
  [0, 0, 2, -2, 2, 0, 0, 0, -4.55, 0],
  [0, 0, 2, 0, 3, 0, 0, 0, 2.02, 0],
  [0, 0, 2, 0, 1, 0, 0, 0, 1.98, 0],
  [0, 0, 0, 0, 3, 0, 0, 0, -1.72, 0],
  [0, 1, 0, 0, 1, 0, 0, 0, -1.41, -0.01],
  [0, 1, 0, 0, -1, 0, 0, 0, -1.26, -0.01],
  [1, 0, 0, 0, -1, 0, 0, 0, -0.63, 0],
  [1, 0, 0, 0, 1, 0, 0, 0, -0.63, 0],
  [0, 1, 2, -2, 3, 0, 0, 0, 0.46, 0],
  [0, 1, 2, -2, 1, 0, 0, 0, 0.45, 0],
  [0, 0, 4, -4, 4, 0, 0, 0, 0.36, 0],
  [0, 0, 1, -1, 1, -8, 12, 0, -0.24, -0.12],
  [0, 0, 2, 0, 0, 0, 0, 0, 0.32, 0],
  [0, 0, 2, 0, 2, 0, 0, 0, 0.28, 0],
  [1, 0, 2, 0, 3, 0, 0, 0, 0.27, 0],
  [1, 0, 2, 0, 1, 0, 0, 0, 0.26, 0],
  [0, 0, 2, -2, 0, 0, 0, 0, -0.21, 0],
  [0, 1, -2, 2, -3, 0, 0, 0, 0.19, 0],
  [0, 1, -2, 2, -1, 0, 0, 0, 0.18, 0],
  [0, 0, 0, 0, 0, 8, -13, -1, -0.1, 0.05],
  [0, 0, 0, 2, 0, 0, 0, 0, 0.15, 0],
  [2, 0, -2, 0, -1, 0, 0, 0, -0.14, 0],
  [1, 0, 0, -2, 1, 0, 0, 0, 0.14, 0],
  [0, 1, 2, -2, 2, 0, 0, 0, -0.14, 0],
  [1, 0, 0, -2, -1, 0, 0, 0, 0.14, 0],
  [0, 0, 4, -2, 4, 0, 0, 0, 0.13, 0],
  [0, 0, 2, -2, 4, 0, 0, 0, -0.11, 0],
  [1, 0, -2, 0, -3, 0, 0, 0, 0.11, 0],
  [1, 0, -2, 0, -1, 0, 0, 0, 0.11, 0],
];
/** The one term of order t¹ in table 5.2e [µas per century]. */
const COMPLEMENTARY_T1: readonly (readonly number[])[] = [[0, 0, 0, 0, 1, 0, 0, 0, -0.87, 0]];

/** Complementary terms of the equation of the equinoxes [rad] at t (TT Julian centuries). */
export function equinoxComplementaryTermsRad(t: number): number {
  const fa = [moonMeanAnomalyRad(t), sunMeanAnomalyRad(t), moonArgumentOfLatitudeRad(t), moonElongationRad(t), moonNodeRad(t), venusLongitudeRad(t), earthLongitudeRad(t), generalPrecessionRad(t)];
  const sum = (rows: readonly (readonly number[])[]): number => {
    let s = 0;
    for (let i = rows.length - 1; i >= 0; i--) {
      let a = 0;
      for (let j = 0; j < 8; j++) a += rows[i][j] * fa[j];
      s += rows[i][8] * Math.sin(a) + rows[i][9] * Math.cos(a);
    }
    return s;
  };
  return (sum(COMPLEMENTARY_T0) + sum(COMPLEMENTARY_T1) * t) * 1e-6 * ARCSEC_TO_RAD;
}

/** Equation of the equinoxes [rad]: Δψ cos ε_A + complementary terms (IERS 2010 eq. 5.35). */
export function equationOfEquinoxesRad(t: number, nutation: Nutation, meanObliquityRad: number): number {
  return nutation.dPsiRad * Math.cos(meanObliquityRad) + equinoxComplementaryTermsRad(t);
}
