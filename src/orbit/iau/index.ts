/**
 * Celestial-to-terrestrial rotations to the IAU 2006/2000A standard (IERS Conventions 2010 ch. 5),
 * one module per concept. Time arguments: t in TT Julian centuries since J2000.0, UT1 as days
 * since J2000.0. Equinox-based: GCRS → true of date by N·P·B, then Earth rotation by GST.
 */
export { ARCSEC_TO_RAD, multiply, multiplyAll, rotate, rotX, rotY, rotZ, transposeMatrix, type Matrix3 } from './rotation.ts';
export { nutation2000a, nutation2006a, type Nutation } from './nutation.ts';
export { meanObliquity2006Rad } from './obliquity.ts';
export { biasPrecessionMatrix, biasPrecessionNutationMatrix, fukushimaWilliamsAngles, fukushimaWilliamsMatrix } from './precession.ts';
export { frameBiasMatrix, precessionMatrix } from './frameBias.ts';
export { earthRotationAngleRad, equationOfEquinoxesRad, equinoxComplementaryTermsRad, gmst2006Rad } from './earthRotation.ts';
export { polarMotionMatrix, tioLocatorRad } from './polarMotion.ts';
