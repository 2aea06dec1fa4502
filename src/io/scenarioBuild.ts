/**
 * Cross-field checks and the typed scenario: times parsed, defaults applied, ids unique, orbits
 * checked for gross sense (perigee above the ground, position outside the Earth, TLE lines).
 */
import { dirname, resolve } from 'node:path';
import { ORBIT_KINDS, type ClockSpec, type OrbitSpec, type ResetPolicySpec, type SatelliteSpec, type ScenarioSpec, type StationSpec, type TleOrbitSpec } from '../model/scenario.ts';
import type { Context } from './scenarioIssues.ts';
import { IAU_MOON_MEAN_RADIUS_M } from '../orbit/moonBody.ts';
import { DEFAULT_HORIZON, FIELD_HINTS, formatPath, STATION_MAX_HEIGHT_M, STATION_MIN_HEIGHT_M, WGS84_A_KM, WGS84_POLAR_RADIUS_KM, type PathSeg, type RawScenario } from './scenarioSchema.ts';

/** Radius of the Moon's reference sphere [km] (IAU, 1737.4 km). */
const MOON_RADIUS_KM = IAU_MOON_MEAN_RADIUS_M / 1000;

export function buildSpec(raw: RawScenario, ctx: Context): ScenarioSpec {
  const start = ctx.time(raw.window.start, ['window', 'start']);
  const end = ctx.time(raw.window.end, ['window', 'end']);
  if (!(end.minusS(start) > 0)) {
    throw ctx.error(
      ['window', 'end'],
      `window end ${JSON.stringify(raw.window.end)} is not after its start ${JSON.stringify(raw.window.start)}`,
      'make window.end later than window.start',
    );
  }

  const seenIds = new Map<string, string>();
  const claimId = (id: string, path: PathSeg[]): void => {
    const previous = seenIds.get(id);
    if (previous !== undefined) {
      throw ctx.error(path, `id ${JSON.stringify(id)} is already used by ${previous}`, 'give every satellite and station its own id (ids name clocks in compare and resets)');
    }
    seenIds.set(id, formatPath(path.slice(0, -1)));
  };

  const satellites = raw.satellites.map((sat, i): SatelliteSpec => {
    const base: PathSeg[] = ['satellites', i];
    claimId(sat.id, [...base, 'id']);
    const orbit = buildOrbit(sat.orbit, [...base, 'orbit'], ctx);
    let name: string | null = sat.name ?? null;
    if (name === null && orbit.kind === 'tle' && orbit.nameLine !== null) name = orbit.nameLine.replace(/^0 /, '').trim() || null;
    if (name === null && orbit.kind === 'omm' && typeof orbit.fields.OBJECT_NAME === 'string') name = orbit.fields.OBJECT_NAME.trim() || null;
    const c = sat.clock;
    const clock: ClockSpec | null =
      c === undefined
        ? null
        : {
            epoch: c.epoch === undefined ? start : ctx.time(c.epoch, [...base, 'clock', 'epoch']),
            offsetNs: c.offsetNs ?? 0,
            hardwareFractionalOffset: c.hardwareFractionalOffset ?? 0,
            agingPerDay: c.agingPerDay ?? 0,
            noise: {
              whiteFmAdev1s: c.noise?.whiteFmAdev1s ?? 0,
              flickerFmFloor: c.noise?.flickerFmFloor ?? 0,
              randomWalkFmAdev1d: c.noise?.randomWalkFmAdev1d ?? 0,
            },
            keepInNs: c.keepInNs ?? null,
            ...clockSteps(c, [...base, 'clock'], ctx),
          };
    const measurementsFile = sat.measurements === undefined ? null : resolve(dirname(resolve(ctx.fileName)), sat.measurements);
    return { id: sat.id, name, orbit, clock, measurementsFile, path: formatPath(base) };
  });

  const stations = (raw.stations ?? []).map((st, i): StationSpec => {
    const base: PathSeg[] = ['stations', i];
    claimId(st.id, [...base, 'id']);
    const onMoon = st.body === 'moon';
    if (!onMoon && !(st.heightM >= STATION_MIN_HEIGHT_M && st.heightM <= STATION_MAX_HEIGHT_M)) {
      throw ctx.error([...base, 'heightM'], `height ${st.heightM} m is outside ${STATION_MIN_HEIGHT_M} … ${STATION_MAX_HEIGHT_M} m for a station on the Earth`, FIELD_HINTS.heightM);
    }
    return {
      id: st.id,
      ...(onMoon ? { body: 'moon' as const } : {}),
      latDeg: st.latDeg,
      lonDeg: st.lonDeg,
      heightM: st.heightM,
      geoidHeightM: st.geoidHeightM ?? 0,
      geoidHeightGiven: st.geoidHeightM !== undefined,
      maskDeg: st.maskDeg ?? 10,
      minPassS: st.minPassS ?? 300,
      uplink: st.uplink ?? true,
      path: formatPath(base),
    };
  });

  const p = raw.policy;
  const policy: ResetPolicySpec = {
    marginNs: p?.marginNs ?? 0,
    leadTimeS: p?.leadTime === undefined ? null : ctx.durationS(p.leadTime, ['policy', 'leadTime']),
    prefer: p?.prefer ?? 'combined',
    horizonS: ctx.durationS(p?.horizon ?? DEFAULT_HORIZON, ['policy', 'horizon']),
    targetNs: p?.target?.offsetNs ?? 0,
    blackouts: (p?.blackouts ?? []).map((b, i) => {
      const at: PathSeg[] = ['policy', 'blackouts', i];
      const bStart = ctx.time(b.start, [...at, 'start']);
      const bEnd = ctx.time(b.end, [...at, 'end']);
      if (!(bEnd.minusS(bStart) > 0)) throw ctx.error([...at, 'end'], `blackout end ${JSON.stringify(b.end)} is not after its start ${JSON.stringify(b.start)}`, 'make each blackout end later than it starts');
      (b.satellites ?? []).forEach((id, k) => {
        if (!satellites.some((sat) => sat.id === id)) throw ctx.error([...at, 'satellites', k], `no satellite ${JSON.stringify(id)} in the scenario`, `use one of ${satellites.map((sat) => sat.id).join(', ')}`);
      });
      return { start: bStart, end: bEnd, satellites: b.satellites ?? null };
    }),
    minSpacingS: p?.minSpacing === undefined ? 0 : ctx.durationS(p.minSpacing, ['policy', 'minSpacing']),
  };
  if (!(policy.horizonS > 0)) throw ctx.error(['policy', 'horizon'], 'the horizon is zero', 'give a span greater than zero, e.g. 180d');
  if (policy.minSpacingS < 0) throw ctx.error(['policy', 'minSpacing'], `minimum spacing ${p?.minSpacing} is negative`, 'give a span of 0 or more, e.g. 2d');
  for (const sat of satellites) {
    const limit = sat.clock?.keepInNs ?? null;
    if (limit !== null && !(policy.marginNs < limit)) {
      throw ctx.error(
        ['policy', 'marginNs'],
        `margin ${policy.marginNs} ns is not below the keep-in limit ${limit} ns of ${sat.path}.clock.keepInNs`,
        'make policy.marginNs smaller than every satellite keepInNs',
      );
    }
    if (limit !== null && !(Math.abs(policy.targetNs) < limit - policy.marginNs)) {
      throw ctx.error(
        ['policy', 'target', 'offsetNs'],
        `target ${policy.targetNs} ns is outside the keep-in limit ${limit} ns minus the margin ${policy.marginNs} ns of ${sat.path}`,
        `give a target between −${limit - policy.marginNs} and ${limit - policy.marginNs} ns (0 steers to the reference)`,
      );
    }
  }

  return {
    name: raw.name ?? baseName(ctx.fileName),
    fileName: ctx.fileName,
    folder: dirname(resolve(ctx.fileName)),
    window: { start, end },
    gravity: raw.gravity ?? 'zonal',
    tides: raw.tides ?? false,
    reference: raw.reference ?? 'GPS',
    satellites,
    stations,
    policy,
  };
}

/** Default nominal oscillator frequency [Hz] (contract, `size --nominal-hz` default). */
const DEFAULT_NOMINAL_HZ = 10.23e6;

/** `clock.steps` and `clock.nominalHz`, frequency steps made fractional, with the cross-field checks. */
function clockSteps(c: NonNullable<RawScenario['satellites'][number]['clock']>, path: PathSeg[], ctx: Context): Pick<ClockSpec, 'steps' | 'nominalHz'> {
  const nominalHz = c.nominalHz ?? DEFAULT_NOMINAL_HZ;
  const s = c.steps;
  if (s?.frequencyResolution !== undefined && s.frequencyResolutionHz !== undefined) {
    throw ctx.error([...path, 'steps', 'frequencyResolutionHz'], 'both frequencyResolution and frequencyResolutionHz given', 'give the resolution once: fractional (frequencyResolution) or in Hz (frequencyResolutionHz)');
  }
  const frequencyResolution = s?.frequencyResolution ?? (s?.frequencyResolutionHz === undefined ? null : s.frequencyResolutionHz / nominalHz);
  const maxFrequencyStep = s?.maxFrequencyStep ?? null;
  if (maxFrequencyStep !== null && frequencyResolution !== null && maxFrequencyStep < frequencyResolution) {
    throw ctx.error([...path, 'steps', 'maxFrequencyStep'], `largest step ${maxFrequencyStep} is smaller than the resolution ${frequencyResolution}`, 'make maxFrequencyStep at least one resolution step (both fractional)');
  }
  return { steps: { phaseResolutionNs: s?.phaseResolutionNs ?? null, frequencyResolution, maxFrequencyStep }, nominalHz };
}

function buildOrbit(o: RawScenario['satellites'][number]['orbit'], path: PathSeg[], ctx: Context): OrbitSpec {
  const given = ORBIT_KINDS.filter((k) => o[k] !== undefined);
  if (given.length !== 1) {
    throw ctx.error(
      path,
      given.length === 0 ? 'no orbit given' : `${given.length} orbit kinds given (${given.join(', ')})`,
      `give exactly one of ${ORBIT_KINDS.join(', ')}`,
    );
  }
  if (o.tle !== undefined) return buildTle(o.tle, [...path, 'tle'], ctx);
  if (o.omm !== undefined) return { kind: 'omm', fields: { ...o.omm } };
  if (o.keplerian !== undefined && o.keplerian.body === 'moon') {
    const { body: _moon, ...k } = o.keplerian;
    const periKm = k.aKm * (1 - k.e);
    if (!(periKm > MOON_RADIUS_KM)) {
      throw ctx.error(
        [...path, 'keplerian', 'aKm'],
        `periselene radius aKm·(1 − e) = ${periKm.toFixed(3)} km is not above the Moon's reference sphere ${MOON_RADIUS_KM} km: the orbit intersects the Moon`,
        "with body: moon, aKm is measured from the Moon's centre (altitude + 1737.4 km); raise aKm or lower e",
      );
    }
    return { kind: 'keplerian', body: 'moon', ...k, epoch: ctx.time(k.epoch, [...path, 'keplerian', 'epoch']) };
  }
  if (o.keplerian !== undefined) {
    const { body: _earth, ...k } = o.keplerian;
    const perigeeKm = k.aKm * (1 - k.e);
    if (!(perigeeKm > WGS84_A_KM)) {
      throw ctx.error(
        [...path, 'keplerian', 'aKm'],
        `perigee radius aKm·(1 − e) = ${perigeeKm.toFixed(3)} km is not above the Earth's equatorial radius ${WGS84_A_KM} km`,
        "aKm is measured from the Earth's centre (altitude + 6378.137 km); raise aKm or lower e",
      );
    }
    return { kind: 'keplerian', ...k, epoch: ctx.time(k.epoch, [...path, 'keplerian', 'epoch']) };
  }
  if (o.state !== undefined) {
    const s = o.state;
    const rKm = Math.hypot(...s.positionKm);
    const lunar = s.frame === 'LCRS';
    if (s.body !== undefined && (s.body === 'moon') !== lunar) {
      throw ctx.error(
        [...path, 'state', 'frame'],
        `frame ${s.frame} does not match body ${s.body}: ${lunar ? 'LCRS is Moon-centred' : `${s.frame} is Earth-centred`}`,
        s.body === 'moon' ? 'give a state about the Moon in frame LCRS (Moon-centred, ICRS axes)' : 'give a state about the Earth in GCRF or TEME',
      );
    }
    if (lunar && !(rKm >= MOON_RADIUS_KM)) {
      throw ctx.error(
        [...path, 'state', 'positionKm'],
        `position is ${rKm.toFixed(3)} km from the Moon's centre, inside the Moon (reference sphere ${MOON_RADIUS_KM} km)`,
        'give the Moon-centred position in km (LCRS), not metres or an altitude',
      );
    }
    if (!lunar && !(rKm >= WGS84_POLAR_RADIUS_KM)) {
      throw ctx.error(
        [...path, 'state', 'positionKm'],
        `position is ${rKm.toFixed(3)} km from the Earth's centre, inside the Earth (polar radius ${WGS84_POLAR_RADIUS_KM.toFixed(3)} km)`,
        'give the geocentric position in km, not metres or an altitude',
      );
    }
    return {
      kind: 'state',
      epoch: ctx.time(s.epoch, [...path, 'state', 'epoch']),
      frame: s.frame,
      positionKm: [...s.positionKm],
      velocityKmPerS: [...s.velocityKmPerS],
    };
  }
  if (o.oem !== undefined) return { kind: 'oem', file: o.oem.file, resolvedFile: resolve(dirname(resolve(ctx.fileName)), o.oem.file), object: o.oem.object ?? null };
  const sp3 = o.sp3!;
  return { kind: 'sp3', file: sp3.file, resolvedFile: resolve(dirname(resolve(ctx.fileName)), sp3.file), id: sp3.id };
}

function buildTle(tle: string | string[], path: PathSeg[], ctx: Context): TleOrbitSpec {
  const lines = (typeof tle === 'string' ? tle.split(/\r?\n/) : tle).map((l) => l.trimEnd()).filter((l) => l.trim() !== '');
  if (lines.length !== 2 && lines.length !== 3) {
    throw ctx.error(path, `the TLE has ${lines.length} non-empty line${lines.length === 1 ? '' : 's'}, expected 2 (or 3 with a name line)`, FIELD_HINTS.tle);
  }
  const [line1, line2] = lines.slice(-2);
  for (const [n, line] of [
    [1, line1],
    [2, line2],
  ] as const) {
    if (!line.startsWith(`${n} `)) {
      const shown = line.length > 20 ? `${line.slice(0, 20)}...` : line;
      throw ctx.error(path, `TLE line ${n} should start with "${n} ", found ${JSON.stringify(shown)}`, 'give the element lines in order: optional name, then line 1, then line 2');
    }
  }
  const nameLine = lines.length === 3 ? lines[0] : null;
  return { kind: 'tle', nameLine, line1, line2, text: lines.join('\n') };
}

function baseName(fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? fileName;
  return base.replace(/\.(json|ya?ml)$/i, '') || fileName;
}
