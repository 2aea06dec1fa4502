/**
 * tauplan as a library: the same use cases as the command line, returning the objects the
 * commands print with `--format json` (plain data, contract field names, units in the names,
 * times as UTC ISO strings). Options are the commands' flags in camelCase; times may be given as
 * ISO text or as an {@link Instant}, durations as text (`7d`, `90min`, `P1D`) or seconds.
 *
 * Input faults throw {@link InputError} subclasses carrying `what`, `where` and `fix`, the same
 * errors the CLI prints. Predictions are planning aids: verify them independently before any uplink.
 *
 * Only {@link loadScenario} reads files (the scenario and the SP3 files it names); the default
 * time system reads the packaged leap-second table once. Everything else computes in memory.
 */

import { enableWasmSgp4 } from './orbit/sgp4.ts';

// The same SGP4 engine as the CLI (WASM for deep-space resonant orbits), loaded once on import so
// that library and CLI give the same numbers to the last bit.
await enableWasmSgp4();

// Use cases
export { loadScenario, type LoadScenarioOptions } from './api/scenario.ts';
export { sizeOrbit, DEFAULT_ELEMENTS_EPOCH, type SizeOptions, type OrbitInput, type KeplerianOrbit, type ScenarioSatellite } from './api/size.ts';
/** Sizing of a clock about or on the Moon, against TT and against a lunar surface reference clock (`size --body moon`). */
export { sizeLunarOrbit, type LunarSizeOptions, type LunarKeplerianOrbit, type LunarSurfaceClock } from './api/lunarSize.ts';
/** Clock rate against altitude above the Moon, and the altitude matching a lunar surface clock (`sweep --body moon`). */
export { sweepLunarAltitude, type LunarSweepOptions } from './api/lunarSweep.ts';
export { predictPasses, type PassesOptions } from './api/passes.ts';
export { planResets, type ResetsOptions } from './api/resets.ts';
export { fitClock, type FitClockOptions, type MeasurementInput, type MeasurementsInput } from './api/fit.ts';
export { compareClocks, type CompareOptions } from './api/compare.ts';
export { sweepAltitude, type SweepOptions } from './api/sweep.ts';
export { trackSatellite, type TrackOptions, type TrackInput } from './api/track.ts';
export { navigationClockSets, evaluateBroadcastClocks, type NavClockSetOptions, type BroadcastEvalInput, type BroadcastEvalOptions } from './api/navclock.ts';
export { frequencyStability, type StabilityRecord, type StabilityResult } from './api/stability.ts';
export { parseInstant, defaultTimeSystem } from './api/time.ts';
export type { CommonOptions, TimeInput, DurationInput } from './api/common.ts';

// Results (the JSON objects of the commands)
export type { SizeJson } from './report/sizeReport.ts';
export type { LunarSizeJson } from './report/lunarSizeReport.ts';
export type { LunarSweepJson } from './report/lunarSweepReport.ts';
export type { PassesJson } from './report/passesReport.ts';
export type { ResetsJson } from './report/resetsReport.ts';
export type { FitJson } from './report/fitReport.ts';
export type { CompareJson, SweepJson, TrackJson } from './report/analysisReports.ts';

// Inputs as data
export type { ScenarioSpec, SatelliteSpec, StationSpec, ClockSpec, OrbitSpec, ResetPolicySpec, GravityModelName, ReferenceScale, AdjustmentKind } from './model/scenario.ts';
export type { TleRecord, OmmRecord, ElementSetRecord } from './model/elementSet.ts';
export type { Station } from './model/station.ts';
/** Parse TLE / 3LE text into element sets (`fileName` names it in messages). */
export { parseTleFile } from './io/tle.ts';
/** Parse CCSDS OMM text (JSON, KVN or XML) into element sets. */
export { parseOmmFile } from './io/omm.ts';
/** Parse RINEX 3 navigation text (3.02–3.05; GPS and Galileo clock records) for {@link evaluateBroadcastClocks}. */
export { parseRinexNav, type RinexNavFile } from './io/rinexNav.ts';
/** Parse SP3-c / SP3-d text (positions [km], clocks [µs]) for {@link evaluateBroadcastClocks}. */
export { parseSp3 } from './io/sp3.ts';
export type { Sp3File } from './model/sp3.ts';

// Time
export { Instant, TIME_SCALES, type TimeScale } from './time/instant.ts';
export { TimeSystem } from './time/timeSystem.ts';

// Errors
export { InputError, ScenarioError, TimeError, OrbitFileError, SpanError, PropagationError, InternalError } from './errors.ts';
