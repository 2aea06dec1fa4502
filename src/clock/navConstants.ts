/**
 * Navigation-message clock constants, one per line, with unit and source.
 *
 * Status of each value (how it was checked):
 * - "confirmed": read in the ICD text, or agreed by two independent public renderings of it;
 * - "derived": computed here from confirmed values;
 * - "from memory": not found in a stored copy; treat with care.
 * Every value below is also checked in tests/is-gps-200-navigation-clock.test.ts or
 * tests/galileo-os-sis-icd.test.ts.
 */

/** Relativistic constant F of Δt_r = F·e·√A·sin E_k [s/√m]. IS-GPS-200 §20.3.3.3.3.1 (= −2√μ/c², μ = 3.986005e14). Confirmed. */
export const GPS_F_S_PER_SQRT_M = -4.442807633e-10;
/** Earth gravitational constant used by the GPS user algorithm [m³/s²]. IS-GPS-200 §20.3.3.4.3, Table 20-IV. Confirmed. */
export const GPS_MU_M3_PER_S2 = 3.986005e14;
/** Half a GPS week [s]: t − toc beyond ±302 400 s crosses a week end. IS-GPS-200 §20.3.3.3.3.1. Confirmed. */
export const GPS_HALF_WEEK_S = 302_400;
/** One week [s] added or subtracted at a week crossover. IS-GPS-200 §20.3.3.3.3.1. Confirmed. */
export const GNSS_WEEK_S = 604_800;

/** LNAV subframe 1 toc: scale factor [s]. IS-GPS-200 §20.3.3.3, Table 20-III. Confirmed. */
export const GPS_LNAV_TOC_SCALE_S = 16;
/** LNAV subframe 1 toc: bits (unsigned). IS-GPS-200 Table 20-III. Confirmed. */
export const GPS_LNAV_TOC_BITS = 16;
/** LNAV subframe 1 af0: scale factor [s] (2⁻³¹). IS-GPS-200 Table 20-III. Confirmed. */
export const GPS_LNAV_AF0_SCALE_S = 2 ** -31;
/** LNAV subframe 1 af0: bits (two's complement). IS-GPS-200 Table 20-III. Confirmed. */
export const GPS_LNAV_AF0_BITS = 22;
/** LNAV subframe 1 af1: scale factor [s/s] (2⁻⁴³). IS-GPS-200 Table 20-III. Confirmed. */
export const GPS_LNAV_AF1_SCALE = 2 ** -43;
/** LNAV subframe 1 af1: bits (two's complement). IS-GPS-200 Table 20-III. Confirmed. */
export const GPS_LNAV_AF1_BITS = 16;
/** LNAV subframe 1 af2: scale factor [s/s²] (2⁻⁵⁵). IS-GPS-200 Table 20-III. Confirmed. */
export const GPS_LNAV_AF2_SCALE_PER_S = 2 ** -55;
/** LNAV subframe 1 af2: bits (two's complement). IS-GPS-200 Table 20-III. Confirmed. */
export const GPS_LNAV_AF2_BITS = 8;
/** Nominal LNAV curve-fit interval [s] (fit interval flag 0). IS-GPS-200 §20.3.3.4.3.1 and §20.3.4.4. From memory. */
export const GPS_LNAV_NOMINAL_FIT_S = 4 * 3600;

/** Relativistic constant F [s/√m]. Galileo OS SIS ICD §5.1.4 (= −2√μ/c², μ = 3.986004418e14). Confirmed. */
export const GALILEO_F_S_PER_SQRT_M = -4.442807309e-10;
/** Earth gravitational constant of the Galileo user algorithm [m³/s²]. Galileo OS SIS ICD, GTRF constants table. Confirmed. */
export const GALILEO_MU_M3_PER_S2 = 3.986004418e14;

/** Galileo t0c: scale factor [s]. Galileo OS SIS ICD §5.1.3, clock correction parameters table. Confirmed. */
export const GALILEO_T0C_SCALE_S = 60;
/** Galileo t0c: bits (unsigned). Galileo OS SIS ICD §5.1.3. Confirmed. */
export const GALILEO_T0C_BITS = 14;
/** Galileo af0: scale factor [s] (2⁻³⁴). Galileo OS SIS ICD §5.1.3. Confirmed. */
export const GALILEO_AF0_SCALE_S = 2 ** -34;
/** Galileo af0: bits (two's complement). Galileo OS SIS ICD §5.1.3. Confirmed. */
export const GALILEO_AF0_BITS = 31;
/** Galileo af1: scale factor [s/s] (2⁻⁴⁶). Galileo OS SIS ICD §5.1.3. Confirmed. */
export const GALILEO_AF1_SCALE = 2 ** -46;
/** Galileo af1: bits (two's complement). Galileo OS SIS ICD §5.1.3. Confirmed. */
export const GALILEO_AF1_BITS = 21;
/** Galileo af2: scale factor [s/s²] (2⁻⁵⁹). Galileo OS SIS ICD §5.1.3. Confirmed. */
export const GALILEO_AF2_SCALE_PER_S = 2 ** -59;
/** Galileo af2: bits (two's complement). Galileo OS SIS ICD §5.1.3. Confirmed. */
export const GALILEO_AF2_BITS = 6;
