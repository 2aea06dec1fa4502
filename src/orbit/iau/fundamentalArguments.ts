/**
 * Fundamental arguments of the nutation theory [rad] as functions of t, TT Julian centuries since
 * J2000.0. IERS Conventions 2010, ch. 5, eq. 5.43 (Delaunay arguments, from Simon et al. 1994) and
 * eq. 5.44 (planetary mean longitudes from Souchay et al. 1999, general precession pA from
 * Kinoshita & Souchay 1990). Polynomials in arcseconds unless noted.
 */
import { ARCSEC_TO_RAD, TWO_PI } from './rotation.ts';

/** One turn in arcseconds. */
const TURN_ARCSEC = 1296000;

function arcsecPolynomialRad(c0: number, c1: number, c2: number, c3: number, c4: number, t: number): number {
  return ((c0 + t * (c1 + t * (c2 + t * (c3 + t * c4)))) % TURN_ARCSEC) * ARCSEC_TO_RAD;
}

/** l, mean anomaly of the Moon (eq. 5.43). */
export function moonMeanAnomalyRad(t: number): number {
  return arcsecPolynomialRad(485868.249036, 1717915923.2178, 31.8792, 0.051635, -0.0002447, t);
}

/** l', mean anomaly of the Sun (eq. 5.43). */
export function sunMeanAnomalyRad(t: number): number {
  return arcsecPolynomialRad(1287104.793048, 129596581.0481, -0.5532, 0.000136, -0.00001149, t);
}

/** F = L − Ω, mean argument of latitude of the Moon (eq. 5.43). */
export function moonArgumentOfLatitudeRad(t: number): number {
  return arcsecPolynomialRad(335779.526232, 1739527262.8478, -12.7512, -0.001037, 0.00000417, t);
}

/** D, mean elongation of the Moon from the Sun (eq. 5.43). */
export function moonElongationRad(t: number): number {
  return arcsecPolynomialRad(1072260.703692, 1602961601.209, -6.3706, 0.006593, -0.00003169, t);
}

/** Ω, mean longitude of the Moon's ascending node (eq. 5.43). */
export function moonNodeRad(t: number): number {
  return arcsecPolynomialRad(450160.398036, -6962890.5431, 7.4722, 0.007702, -0.00005939, t);
}

/** Planetary mean longitudes [rad] (eq. 5.44; linear in t, radians). */
export function mercuryLongitudeRad(t: number): number {
  return (4.402608842 + 2608.7903141574 * t) % TWO_PI;
}
export function venusLongitudeRad(t: number): number {
  return (3.176146697 + 1021.3285546211 * t) % TWO_PI;
}
export function earthLongitudeRad(t: number): number {
  return (1.753470314 + 628.3075849991 * t) % TWO_PI;
}
export function marsLongitudeRad(t: number): number {
  return (6.203480913 + 334.06124267 * t) % TWO_PI;
}
export function jupiterLongitudeRad(t: number): number {
  return (0.599546497 + 52.9690962641 * t) % TWO_PI;
}
export function saturnLongitudeRad(t: number): number {
  return (0.874016757 + 21.329910496 * t) % TWO_PI;
}
export function uranusLongitudeRad(t: number): number {
  return (5.481293872 + 7.4781598567 * t) % TWO_PI;
}

/** pA, general accumulated precession in longitude [rad] (eq. 5.44). */
export function generalPrecessionRad(t: number): number {
  return (0.02438175 + 0.00000538691 * t) * t;
}
