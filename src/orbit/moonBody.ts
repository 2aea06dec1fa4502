/**
 * The Moon as a body: its constants and its orientation.
 *
 * Orientation: the IAU WGCCRE rotation model for the Moon (Archinal et al. 2011, "Report of the IAU
 * Working Group on Cartographic Coordinates and Rotational Elements: 2009", Celest. Mech. Dyn. Astr.
 * 109:101, Tables 1–2; the 2015 report, Archinal et al. 2018, CMDA 130:22, keeps these expressions
 * for the Moon). Coefficients as transcribed in the NAIF text PCK `pck00011.tpc` (BODY301_*, confirmed
 * via the search tool). The model approximates the mean-Earth/polar-axis (ME) frame to about 150 m
 * at the surface (stated in the 2009 report); selenographic latitude and longitude here are in it.
 *
 * Rotation: r_ME = R · r_ICRF with R = R_z(W)·R_x(90° − δ₀)·R_z(90° + α₀). Time argument TDB,
 * taken equal to TT here (|TDB − TT| < 2 ms: 2e-7° of W).
 */

/** GM of the Moon [m³/s²]. JPL DE430 (Folkner et al. 2014, IPN PR 42-196), 4902.800066 km³/s² (physics.md §12). */
export const DE430_GM_MOON_M3_PER_S2 = 4.902800066e12;
/** Mean radius of the Moon, the reference sphere for surface clocks and heights [m]. IAU WGCCRE 2015 (Archinal et al. 2018): 1737.4 km. */
export const IAU_MOON_MEAN_RADIUS_M = 1_737_400;
/** Reference radius of the lunar gravity coefficients below [m]. GRAIL fields (Konopliv et al. 2013, JGR Planets 118:1415): 1738.0 km. */
export const GRAIL_MOON_REFERENCE_RADIUS_M = 1_738_000;
/**
 * Lunar J2 (unnormalised, reference radius 1738 km) [1]. Derived from the GRAIL-era libration
 * parameters β = (C−A)/B = 631.0213e-6 and γ = (B−A)/C = 227.7317e-6 (Williams et al. 2014, JGR Planets
 * 119:1546, confirmed via SHTOOLS constants) and C/MR² = 0.393142 (JPL Horizons Moon data sheet,
 * confirmed): J2 = βB − γC/2 with B = C(1+γ)/(1+β). Agrees with GL0660B's C̄20 ≈ −9.088e-5 (√5·9.088e-5,
 * from memory) to 1e-8.
 */
export const GRAIL_MOON_J2 = 2.0322e-4;
/** Lunar C22 (unnormalised, reference radius 1738 km) [1]. Derived as γC/4 from the same values; GL0660B's C̄22 ≈ 3.4674e-5 (from memory) gives 2.2382e-5. */
export const GRAIL_MOON_C22 = 2.2383e-5;
/** Mean sidereal rotation rate of the Moon [rad/s], from W's 13.17635815°/day (IAU 2009). */
export const IAU_MOON_ROTATION_RAD_PER_S = ((13.17635815 * Math.PI) / 180) / 86_400;

const DEG = Math.PI / 180;
const SECONDS_PER_DAY = 86_400;
const DAYS_PER_CENTURY = 36_525;

/** Libration arguments E1..E13: constant [deg] and rate [deg per Julian century] (pck00011, BODY3_NUT_PREC_ANGLES). */
const E_CONST = [125.045, 250.089, 260.008, 176.625, 357.529, 311.589, 134.963, 276.617, 34.226, 15.134, 119.743, 239.961, 25.053];
const E_RATE = [-1935.5364525, -3871.072905, 475263.3328725, 487269.629985, 35999.0509575, 964468.49931, 477198.869325, 12006.300765, 63863.5132425, -5806.6093575, 131.84064, 6003.1503825, 473327.79642];
/** Pole right ascension amplitudes [deg] on sin Eᵢ (BODY301_NUT_PREC_RA). */
const RA_AMP = [-3.8787, -0.1204, 0.07, -0.0172, 0, 0.0072, 0, 0, 0, -0.0052, 0, 0, 0.0043];
/** Pole declination amplitudes [deg] on cos Eᵢ (BODY301_NUT_PREC_DEC). */
const DEC_AMP = [1.5419, 0.0239, -0.0278, 0.0068, 0, -0.0029, 0.0009, 0, 0, 0.0008, 0, 0, -0.0009];
/** Prime meridian amplitudes [deg] on sin Eᵢ (BODY301_NUT_PREC_PM). */
const PM_AMP = [3.561, 0.1208, -0.0642, 0.0158, 0.0252, -0.0066, -0.0047, -0.0046, 0.0028, 0.0052, 0.004, 0.0019, -0.0044];

/** Pole right ascension α₀, declination δ₀ and prime meridian W [rad] at seconds since J2000.0 TT. */
export function moonOrientationAngles(ttJ2000S: number): { alphaRad: number; deltaRad: number; wRad: number } {
  const d = ttJ2000S / SECONDS_PER_DAY;
  const t = d / DAYS_PER_CENTURY;
  let ra = 269.9949 + 0.0031 * t;
  let dec = 66.5392 + 0.013 * t;
  let w = 38.3213 + 13.17635815 * d - 1.4e-12 * d * d;
  for (let i = 0; i < 13; i++) {
    const e = (E_CONST[i] + E_RATE[i] * t) * DEG;
    const s = Math.sin(e);
    ra += RA_AMP[i] * s;
    dec += DEC_AMP[i] * Math.cos(e);
    w += PM_AMP[i] * s;
  }
  return { alphaRad: ra * DEG, deltaRad: dec * DEG, wRad: (w % 360) * DEG };
}

/** ICRF (GCRF/LCRS axes) → Moon ME body-fixed matrix at an instant, rows first (9 numbers): r_ME = M·r_ICRF. */
export function icrfToMoonFixedInto(ttJ2000S: number, out: Float64Array): Float64Array {
  const { alphaRad, deltaRad, wRad } = moonOrientationAngles(ttJ2000S);
  // R_z(W)·R_x(90° − δ)·R_z(90° + α), written out.
  const a = Math.PI / 2 + alphaRad;
  const b = Math.PI / 2 - deltaRad;
  const ca = Math.cos(a);
  const sa = Math.sin(a);
  const cb = Math.cos(b);
  const sb = Math.sin(b);
  const cw = Math.cos(wRad);
  const sw = Math.sin(wRad);
  // R_x(b)·R_z(a) rows: [ca, sa, 0], [−cb·sa, cb·ca, sb], [sb·sa, −sb·ca, cb]
  const m10 = -cb * sa;
  const m11 = cb * ca;
  const m12 = sb;
  out[0] = cw * ca + sw * m10;
  out[1] = cw * sa + sw * m11;
  out[2] = sw * m12;
  out[3] = -sw * ca + cw * m10;
  out[4] = -sw * sa + cw * m11;
  out[5] = cw * m12;
  out[6] = sb * sa;
  out[7] = -sb * ca;
  out[8] = cb;
  return out;
}

/**
 * ICRF → Moon mean-equator-of-epoch matrix (rows first): z along the IAU pole (α₀, δ₀) at the
 * instant, x toward the ascending node of the lunar equator on the ICRF equator. Inertial once
 * frozen at an epoch: the axes in which lunar Keplerian elements are given (a frozen orbit's
 * inclination is to the lunar equator).
 */
export function icrfToMoonEquatorInto(ttJ2000S: number, out: Float64Array): Float64Array {
  const { alphaRad, deltaRad } = moonOrientationAngles(ttJ2000S);
  const a = Math.PI / 2 + alphaRad;
  const b = Math.PI / 2 - deltaRad;
  const ca = Math.cos(a);
  const sa = Math.sin(a);
  const cb = Math.cos(b);
  const sb = Math.sin(b);
  out[0] = ca;
  out[1] = sa;
  out[2] = 0;
  out[3] = -cb * sa;
  out[4] = cb * ca;
  out[5] = sb;
  out[6] = sb * sa;
  out[7] = -sb * ca;
  out[8] = cb;
  return out;
}

/** Selenographic position on or above the reference sphere [m], ME body-fixed axes. */
export function selenographicToMoonFixedM(latDeg: number, lonDeg: number, heightM: number): [number, number, number] {
  const r = IAU_MOON_MEAN_RADIUS_M + heightM;
  const la = latDeg * DEG;
  const lo = lonDeg * DEG;
  return [r * Math.cos(la) * Math.cos(lo), r * Math.cos(la) * Math.sin(lo), r * Math.sin(la)];
}

/** Half-width of the central difference for the rotation's time derivative [s]. */
const ROTATION_DIFF_S = 60;

/**
 * Moon-centred inertial (LCRS: ICRS axes) position [m] and velocity [m/s] of a point fixed in the
 * ME frame. The velocity is the derivative of the rotated vector (central difference of the full
 * rotation, ±60 s: error below 1e-9 of ω·r), so libration in the rotation rate is included.
 */
export function moonFixedToLcrsState(ttJ2000S: number, fixedM: readonly number[]): { positionM: [number, number, number]; velocityMPerS: [number, number, number] } {
  const m0 = icrfToMoonFixedInto(ttJ2000S, new Float64Array(9));
  const mp = icrfToMoonFixedInto(ttJ2000S + ROTATION_DIFF_S, new Float64Array(9));
  const mm = icrfToMoonFixedInto(ttJ2000S - ROTATION_DIFF_S, new Float64Array(9));
  const [x, y, z] = fixedM;
  // r_ICRF = Mᵀ·r_ME
  const p: [number, number, number] = [m0[0] * x + m0[3] * y + m0[6] * z, m0[1] * x + m0[4] * y + m0[7] * z, m0[2] * x + m0[5] * y + m0[8] * z];
  const v: [number, number, number] = [0, 0, 0];
  for (let c = 0; c < 3; c++) {
    const plus = mp[c] * x + mp[3 + c] * y + mp[6 + c] * z;
    const minus = mm[c] * x + mm[3 + c] * y + mm[6 + c] * z;
    v[c] = (plus - minus) / (2 * ROTATION_DIFF_S);
  }
  return { positionM: p, velocityMPerS: v };
}
