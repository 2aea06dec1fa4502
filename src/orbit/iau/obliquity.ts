/**
 * Mean obliquity of the ecliptic, IAU 2006 (IERS Conventions 2010 eq. 5.40; Hilton et al. 2006),
 * ε_A = 84381.406″ − 46.836769″ t − 0.0001831″ t² + 0.00200340″ t³ − 0.000000576″ t⁴ − 0.0000000434″ t⁵,
 * t in TT Julian centuries since J2000.0.
 */
import { ARCSEC_TO_RAD } from './rotation.ts';

/** ε_A [rad] at t (TT Julian centuries since J2000.0). */
export function meanObliquity2006Rad(t: number): number {
  return (84381.406 + t * (-46.836769 + t * (-0.0001831 + t * (0.0020034 + t * (-0.000000576 + t * -0.0000000434))))) * ARCSEC_TO_RAD;
}
