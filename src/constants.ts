/**
 * Physical and model constants, one per line, with unit and source.
 * Generic names are avoided: each constant names the model it belongs to.
 */

/** Speed of light in vacuum [m/s]. SI definition (exact). */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;

/** Earth's gravitational parameter [m³/s²]. WGS-84 (NIMA TR8350.2, 3rd ed., 2000); tauplan contract default. */
export const WGS84_GM_M3_PER_S2 = 3.986004418e14;

/** WGS-84 equatorial radius [m]. NIMA TR8350.2, 3rd ed. */
export const WGS84_A_M = 6_378_137.0;

/** WGS-84 inverse flattening [1]. NIMA TR8350.2, 3rd ed. */
export const WGS84_INV_F = 298.257223563;

/** WGS-84 nominal mean angular velocity of the Earth [rad/s]. NIMA TR8350.2, 3rd ed. */
export const WGS84_OMEGA_RAD_PER_S = 7.292115e-5;

/** L_G, defining rate constant TT vs TCG [1]. IAU 2000 Resolution B1.9; IERS Conventions 2010, Table 1.1. */
export const IERS2010_L_G = 6.969290134e-10;

/** EGM2008 normalised zonal coefficient C̄20 [1]. EGM2008 (Pavlis et al. 2012), tide-free. */
export const EGM2008_C20 = -0.484165143790815e-3;
/** EGM2008 normalised zonal coefficient C̄30 [1]. */
export const EGM2008_C30 = 0.957161207093473e-6;
/** EGM2008 normalised zonal coefficient C̄40 [1]. */
export const EGM2008_C40 = 0.539965866638991e-6;
/** EGM2008 normalised zonal coefficient C̄50 [1]. */
export const EGM2008_C50 = 0.686702913736681e-7;
/** EGM2008 normalised zonal coefficient C̄60 [1]. */
export const EGM2008_C60 = -0.149953927978527e-6;

/** Unnormalised zonal J_n = −√(2n+1)·C̄n0, index n (entries 0 and 1 unused) [1]. Derived from EGM2008. */
export const EGM2008_J: readonly number[] = [
  0,
  0,
  -Math.sqrt(5) * EGM2008_C20,
  -Math.sqrt(7) * EGM2008_C30,
  -Math.sqrt(9) * EGM2008_C40,
  -Math.sqrt(11) * EGM2008_C50,
  -Math.sqrt(13) * EGM2008_C60,
];

/** Standard gravity [m/s²]. CGPM 1901 (exact by definition); used for height-to-rate conversions. */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;

/** TT − TAI [s]. IAU 1991 (exact). */
export const TT_MINUS_TAI_S = 32.184;
/** TAI − GPS time [s]. IS-GPS-200 (GPS time = UTC at 1980-01-06, when TAI − UTC was 19 s). */
export const TAI_MINUS_GPS_S = 19;
/** TAI − BDT [s]: BDT = GPS − 14 s (BDT epoch 2006-01-01 UTC, TAI − UTC was 33 s). BeiDou ICD B1I v3.0. */
export const TAI_MINUS_BDT_S = 33;
/** TAI − GST [s]: Galileo system time follows the GPS second. Galileo OS SIS ICD 2.0. */
export const TAI_MINUS_GST_S = 19;

/** Seconds per day [s]. */
export const SECONDS_PER_DAY = 86_400;

/** Julian date of the J2000.0 epoch, 2000-01-01T12:00:00 TT [d]. IERS Conventions 2010, §1.1 (confirmed). */
export const JD_J2000 = 2451545.0;

/** Nominal 10.23 MHz fundamental frequency of GNSS clocks [Hz]. IS-GPS-200 §3.3.1.1. */
export const GNSS_NOMINAL_HZ = 10.23e6;

/** Heliocentric gravitational constant GM_Sun [m³/s²] (TDB-compatible). IERS Conventions 2010, Table 1.1. */
export const IERS2010_GM_SUN_M3_PER_S2 = 1.32712442099e20;

/** Moon–Earth mass ratio [1]. IERS Conventions 2010, Table 1.1. */
export const IERS2010_MOON_EARTH_MASS_RATIO = 0.0123000371;

/** Astronomical unit [m]. IAU 2012 Resolution B2 (exact). */
export const IAU2012_AU_M = 149_597_870_700;
