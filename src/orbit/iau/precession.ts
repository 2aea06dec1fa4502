/**
 * IAU 2006 precession with the frame bias, through the Fukushima–Williams angles (IERS Conventions
 * 2010 §5.6.4, eqs. 5.39–5.40; Hilton et al. 2006 table 1; Wallace & Capitaine 2006):
 *
 *   GCRS → mean of date:  P·B = R1(−ε_A) · R3(−ψ̄) · R1(φ̄) · R3(γ̄)
 *   GCRS → true of date:  N·P·B = R1(−(ε_A + Δε)) · R3(−(ψ̄ + Δψ)) · R1(φ̄) · R3(γ̄)
 *
 * The angles at t = 0 are the frame bias alone (./frameBias.ts). Time t: TT Julian centuries
 * since J2000.0.
 */
import { nutation2006a, type Nutation } from './nutation.ts';
import { meanObliquity2006Rad } from './obliquity.ts';
import { ARCSEC_TO_RAD, multiplyAll, rotX, rotZ, type Matrix3 } from './rotation.ts';

/** Fukushima–Williams angles [rad], frame bias included. */
export interface FukushimaWilliamsAngles {
  gammaBarRad: number;
  phiBarRad: number;
  psiBarRad: number;
  /** Mean obliquity of date ε_A. */
  epsilonARad: number;
}

/** The four angles at t (IERS Conventions 2010 eq. 5.40 polynomials, arcseconds). */
export function fukushimaWilliamsAngles(t: number): FukushimaWilliamsAngles {
  const gamma = -0.052928 + t * (10.556378 + t * (0.4932044 + t * (-0.00031238 + t * (-0.000002788 + t * 0.000000026))));
  const phi = 84381.412819 + t * (-46.811016 + t * (0.0511268 + t * (0.00053289 + t * (-0.00000044 + t * -0.0000000176))));
  const psi = -0.041775 + t * (5038.481484 + t * (1.5584175 + t * (-0.00018522 + t * (-0.000026452 + t * -0.0000000148))));
  return { gammaBarRad: gamma * ARCSEC_TO_RAD, phiBarRad: phi * ARCSEC_TO_RAD, psiBarRad: psi * ARCSEC_TO_RAD, epsilonARad: meanObliquity2006Rad(t) };
}

/** R1(−ε) · R3(−ψ) · R1(φ) · R3(γ). */
export function fukushimaWilliamsMatrix(gammaRad: number, phiRad: number, psiRad: number, epsRad: number): Matrix3 {
  return multiplyAll(rotX(-epsRad), rotZ(-psiRad), rotX(phiRad), rotZ(gammaRad));
}

/** Bias–precession matrix P·B (GCRS → mean equator and equinox of date) at t. */
export function biasPrecessionMatrix(t: number): Matrix3 {
  const a = fukushimaWilliamsAngles(t);
  return fukushimaWilliamsMatrix(a.gammaBarRad, a.phiBarRad, a.psiBarRad, a.epsilonARad);
}

/**
 * Bias–precession–nutation matrix N·P·B (GCRS → true equator and equinox of date) at t, with
 * the IAU 2006/2000A nutation unless one is given.
 */
export function biasPrecessionNutationMatrix(t: number, nutation: Nutation = nutation2006a(t)): Matrix3 {
  const a = fukushimaWilliamsAngles(t);
  return fukushimaWilliamsMatrix(a.gammaBarRad, a.phiBarRad, a.psiBarRad + nutation.dPsiRad, a.epsilonARad + nutation.dEpsRad);
}
