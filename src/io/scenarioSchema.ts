/**
 * The scenario schema: shape and ranges as strict zod schemas (cross-field checks come later, in
 * `scenarioBuild.ts`), the hint shown for each key whose value is wrong, and JSON paths.
 */
import { z } from 'zod';
import { WGS84_A_M, WGS84_INV_F } from '../constants.ts';

/** Station height limits [m]: Dead Sea shore ≈ −410 m and Everest ≈ 8820 m ellipsoidal, with margin. */
export const STATION_MIN_HEIGHT_M = -500;
export const STATION_MAX_HEIGHT_M = 10_000;
/** |N| stays below ≈ 110 m on Earth; a larger value is probably a height, not an undulation. */
export const GEOID_HEIGHT_LIMIT_M = 150;
/** WGS-84 polar radius [km], derived from a and 1/f: 6356.752 km. */
export const WGS84_POLAR_RADIUS_KM = (WGS84_A_M * (1 - 1 / WGS84_INV_F)) / 1000;
export const WGS84_A_KM = WGS84_A_M / 1000;
export const DEFAULT_HORIZON = '180d';
/**
 * Plausibility bounds on clock keys, so an absurd value is an input error naming the key, never an
 * overflow deep in a plan. Each is orders of magnitude past any real clock (common practice):
 * - |offsetNs|, keepInNs, marginNs ≤ 1e12 ns (1000 s);
 * - keepInNs ≥ 0.01 ns (10 ps, below any phase-step resolution of a flight clock);
 * - |hardwareFractionalOffset| ≤ 1e-4 (100 ppm, an untuned quartz oscillator is ~1e-6);
 * - |agingPerDay| ≤ 1e-6 per day (quartz ages ~1e-10 per day);
 * - noise levels 0 or 1e-20 … 1e-6 (space clocks are 1e-15 … 1e-11 at 1 s).
 */
export const MAX_CLOCK_OFFSET_NS = 1e12;
export const MIN_KEEP_IN_NS = 0.01;
export const MAX_FRACTIONAL_OFFSET = 1e-4;
export const MAX_AGING_PER_DAY = 1e-6;
export const MIN_NOISE_LEVEL = 1e-20;
export const MAX_NOISE_LEVEL = 1e-6;
const noiseLevel = z
  .number()
  .min(0)
  .max(MAX_NOISE_LEVEL)
  .refine((v) => v === 0 || v >= MIN_NOISE_LEVEL, { message: `a noise level is 0 or at least ${MIN_NOISE_LEVEL}` });

const text = z.string().min(1);
const vec3 = z.tuple([z.number(), z.number(), z.number()]);
const TLE_SHAPE = 'a TLE must be a text of 2 or 3 lines, or a list [line1, line2] or [name, line1, line2]';

/** Lunar station heights [m] above the 1737.4 km sphere: relief spans about −9 … +11 km, with margin. */
export const LUNAR_STATION_HEIGHT_LIMIT_M = 20_000;
const body = z.enum(['earth', 'moon']);

const KeplerianSchema = z.strictObject({
  body: body.optional(),
  epoch: text,
  aKm: z.number().positive(),
  e: z.number().min(0).lt(1),
  iDeg: z.number().min(0).max(180),
  raanDeg: z.number(),
  argpDeg: z.number(),
  meanAnomalyDeg: z.number(),
});

const OrbitSchema = z.strictObject({
  tle: z.union([z.string(), z.array(z.string()).min(2).max(3)], { error: TLE_SHAPE }).optional(),
  omm: z.record(z.string(), z.union([z.string(), z.number()], { error: 'an OMM value must be a string or a number' })).optional(),
  keplerian: KeplerianSchema.optional(),
  state: z.strictObject({ body: body.optional(), epoch: text, frame: z.enum(['GCRF', 'TEME', 'LCRS']), positionKm: vec3, velocityKmPerS: vec3 }).optional(),
  sp3: z.strictObject({ file: text, id: text }).optional(),
  oem: z.strictObject({ file: text, object: text.optional() }).optional(),
});

const ClockSchema = z.strictObject({
  epoch: text.optional(),
  offsetNs: z.number().min(-MAX_CLOCK_OFFSET_NS).max(MAX_CLOCK_OFFSET_NS).optional(),
  hardwareFractionalOffset: z.number().min(-MAX_FRACTIONAL_OFFSET).max(MAX_FRACTIONAL_OFFSET).optional(),
  agingPerDay: z.number().min(-MAX_AGING_PER_DAY).max(MAX_AGING_PER_DAY).optional(),
  noise: z
    .strictObject({
      whiteFmAdev1s: noiseLevel.optional(),
      flickerFmFloor: noiseLevel.optional(),
      randomWalkFmAdev1d: noiseLevel.optional(),
    })
    .optional(),
  keepInNs: z.number().min(MIN_KEEP_IN_NS).max(MAX_CLOCK_OFFSET_NS).optional(),
  steps: z
    .strictObject({
      phaseResolutionNs: z.number().positive().optional(),
      frequencyResolution: z.number().positive().optional(),
      frequencyResolutionHz: z.number().positive().optional(),
      maxFrequencyStep: z.number().positive().optional(),
    })
    .optional(),
  nominalHz: z.number().positive().optional(),
});

const SatelliteSchema = z.strictObject({
  id: text,
  name: z.string().optional(),
  orbit: OrbitSchema,
  clock: ClockSchema.optional(),
  measurements: text.optional(),
});

const StationSchema = z.strictObject({
  id: text,
  body: body.optional(),
  latDeg: z.number().min(-90).max(90),
  lonDeg: z.number().min(-180).lt(360),
  // The Earth's range (−500 … 10 000 m) is checked in scenarioBuild.ts, where the body is known.
  heightM: z.number().min(-LUNAR_STATION_HEIGHT_LIMIT_M).max(LUNAR_STATION_HEIGHT_LIMIT_M),
  geoidHeightM: z.number().min(-GEOID_HEIGHT_LIMIT_M).max(GEOID_HEIGHT_LIMIT_M).optional(),
  maskDeg: z.number().min(-5).lt(90).optional(),
  minPassS: z.number().min(0).optional(),
  uplink: z.boolean().optional(),
});

const PolicySchema = z.strictObject({
  marginNs: z.number().min(0).max(MAX_CLOCK_OFFSET_NS).optional(),
  leadTime: text.optional(),
  prefer: z.enum(['phase', 'frequency', 'combined']).optional(),
  horizon: text.optional(),
  target: z.strictObject({ offsetNs: z.number() }).optional(),
  blackouts: z.array(z.strictObject({ start: text, end: text, satellites: z.array(text).optional() })).optional(),
  minSpacing: text.optional(),
});

export const ScenarioSchema = z.strictObject({
  name: z.string().optional(),
  window: z.strictObject({ start: text, end: text }),
  gravity: z.enum(['point', 'j2', 'zonal']).optional(),
  tides: z.boolean().optional(),
  reference: z.enum(['GPS', 'TAI', 'TT']).optional(),
  satellites: z.array(SatelliteSchema).min(1),
  stations: z.array(StationSchema).optional(),
  policy: PolicySchema.optional(),
});

/** The scenario as the schema accepts it, before defaults and cross-field checks. */
export type RawScenario = z.infer<typeof ScenarioSchema>;
/** One step of a JSON path: a key or a list index. */
export type PathSeg = string | number;

/** What each key means and its range, shown as the fix when its value is wrong. */
export const FIELD_HINTS: Record<string, string> = {
  latDeg: 'give the latitude in degrees, −90 … 90, north positive (geodetic on the Earth, selenographic on the Moon)',
  lonDeg: 'give the longitude in degrees east, −180 ≤ lon < 360',
  heightM: `give the height above the WGS-84 ellipsoid in metres, ${STATION_MIN_HEIGHT_M} … ${STATION_MAX_HEIGHT_M}`,
  geoidHeightM: `give the geoid undulation N in metres (−${GEOID_HEIGHT_LIMIT_M} … ${GEOID_HEIGHT_LIMIT_M}), not a height above the geoid`,
  maskDeg: 'give the elevation mask in degrees, −5 ≤ maskDeg < 90',
  minPassS: 'give the shortest useful pass in seconds, 0 or more',
  keepInNs: `give the keep-in limit on |offsetNs| in ns, greater than 0 (0.01 … 1e12)`,
  marginNs: 'give the margin in ns, 0 or more (and below every keepInNs)',
  offsetNs: `give the clock offset in ns, within ±1e12 (1000 s)`,
  hardwareFractionalOffset: `give the fractional frequency offset (dimensionless, e.g. -4.464e-10), within ±1e-4`,
  agingPerDay: `give the fractional frequency change per day (e.g. 2e-15), within ±1e-6`,
  aKm: "give the semi-major axis in km from the centre of the orbit's body, the Earth unless body: moon (not the altitude)",
  e: 'give the eccentricity, 0 ≤ e < 1 (a closed orbit)',
  iDeg: 'give the inclination in degrees, 0 … 180',
  whiteFmAdev1s: `noise levels are Allan deviations: 0, or 1e-20 … 1e-6`,
  flickerFmFloor: `noise levels are Allan deviations: 0, or 1e-20 … 1e-6`,
  randomWalkFmAdev1d: `noise levels are Allan deviations: 0, or 1e-20 … 1e-6`,
  positionKm: 'give exactly three numbers [x, y, z] in km',
  velocityKmPerS: 'give exactly three numbers [vx, vy, vz] in km/s',
  satellites: 'list at least one satellite under satellites:',
  tle: 'write the TLE as a block text (tle: |) or as a list [line1, line2]',
  omm: 'give CCSDS OMM keys with text or number values, e.g. OBJECT_NAME, EPOCH, MEAN_MOTION',
  phaseResolutionNs: 'give the smallest phase step in ns, greater than 0',
  frequencyResolution: 'give the smallest fractional frequency step, greater than 0 (e.g. 1e-15)',
  frequencyResolutionHz: 'give the smallest frequency step in Hz at clock.nominalHz, greater than 0',
  maxFrequencyStep: 'give the largest fractional frequency step, greater than 0 and at least the resolution',
  nominalHz: 'give the nominal oscillator frequency in Hz, greater than 0 (default 10.23e6)',
  uplink: 'write uplink: true or uplink: false',
  prefer: 'use phase, frequency or combined',
  body: 'use earth or moon (the central body of the orbit or station)',
  frame: 'use GCRF or TEME (Earth-centred), or LCRS (Moon-centred, ICRS axes)',
  id: 'give a non-empty text id; in YAML quote an id that looks like a number, e.g. id: "43873"',
};

/** Format a path as `satellites[2].clock.agingPerDay` (empty path: ''). */
export function formatPath(path: readonly PathSeg[]): string {
  let out = '';
  for (const seg of path) {
    if (typeof seg === 'number') out += `[${seg}]`;
    else if (/^[A-Za-z_$][\w$]*$/.test(seg)) out += out === '' ? seg : `.${seg}`;
    else out += `[${JSON.stringify(seg)}]`;
  }
  return out;
}
