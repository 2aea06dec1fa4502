/**
 * Scenario file validation: tauplan contract v1, "Scenario files" section (keys, defaults),
 * physics.md §4 (station fields), §6 (clock/noise fields), §7 (keep-in limit and policy margin).
 *
 * The scenario below is invented (stations "Kestrel Ridge" and "Low Fen", satellites SAT-A..SAT-D);
 * its orbits are made up and the TLE text is syntactically plausible filler (TLEs are not parsed here).
 * Expected values are the contract's own keys and defaults ("confirmed" against the contract text);
 * each fault case checks the JSON path and the words of the message, which are ours.
 */
import { resolve } from 'node:path';
import { describe, it, expect } from 'vitest';
import { parse as yamlParse, stringify as yamlStringify } from 'yaml';
import { ScenarioError } from '../src/errors.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { parseScenarioText, type ScenarioSpec } from '../src/io/scenario.ts';
import { editDistance, nearest } from '../src/io/suggest.ts';

const ts = defaultTimeSystem();

const VALID_YAML = `# invented scenario for validation tests
name: Validation fixture
window:
  start: 2027-03-01T00:00:00Z
  end: "2027-03-03T00:00:00 GPS"
gravity: j2
satellites:
  - id: SAT-A
    orbit:
      keplerian:
        epoch: 2027-03-01T00:00:00Z
        aKm: 26560.0
        e: 0.01
        iDeg: 55
        raanDeg: 10
        argpDeg: 20
        meanAnomalyDeg: 30
    clock:
      epoch: 2027-03-01T00:00:00Z
      offsetNs: 12.5
      hardwareFractionalOffset: -4.4647e-10
      agingPerDay: 1.0e-14
      noise: { whiteFmAdev1s: 1.0e-12, randomWalkFmAdev1d: 1.0e-15 }
      keepInNs: 1000
  - id: SAT-B
    orbit:
      tle: |
        0 INVENTED BIRD
        1 99901U 27001A   27060.00000000  .00000000  00000-0  00000-0 0  9990
        2 99901  55.0000  10.0000 0100000  20.0000  30.0000  2.00561000    00
  - id: SAT-C
    orbit:
      state:
        epoch: 2027-03-01T06:00:00 TT
        frame: GCRF
        positionKm: [6378.137, 0, 0]
        velocityKmPerS: [3.0, 0, 0]
  - id: SAT-D
    name: Precise one
    orbit:
      sp3: { file: orbits/invented.sp3, id: L99 }
stations:
  - id: Kestrel Ridge
    latDeg: 47.25
    lonDeg: 8.5
    heightM: 1210.0
    geoidHeightM: 48.5
  - { id: Low Fen, latDeg: -33.5, lonDeg: 300.0, heightM: -12.0, maskDeg: 5, minPassS: 0 }
policy:
  marginNs: 100
  leadTime: 2d
  prefer: frequency
`;

/** The same scenario written by hand as JSON (not generated from the YAML, so both readers are tested). */
const VALID_JSON = `{
  "name": "Validation fixture",
  "window": { "start": "2027-03-01T00:00:00Z", "end": "2027-03-03T00:00:00 GPS" },
  "gravity": "j2",
  "satellites": [
    {
      "id": "SAT-A",
      "orbit": {
        "keplerian": {
          "epoch": "2027-03-01T00:00:00Z",
          "aKm": 26560, "e": 0.01, "iDeg": 55, "raanDeg": 10, "argpDeg": 20, "meanAnomalyDeg": 30
        }
      },
      "clock": {
        "epoch": "2027-03-01T00:00:00Z",
        "offsetNs": 12.5,
        "hardwareFractionalOffset": -4.4647e-10,
        "agingPerDay": 1e-14,
        "noise": { "whiteFmAdev1s": 1e-12, "randomWalkFmAdev1d": 1e-15 },
        "keepInNs": 1000
      }
    },
    {
      "id": "SAT-B",
      "orbit": {
        "tle": [
          "0 INVENTED BIRD",
          "1 99901U 27001A   27060.00000000  .00000000  00000-0  00000-0 0  9990",
          "2 99901  55.0000  10.0000 0100000  20.0000  30.0000  2.00561000    00"
        ]
      }
    },
    {
      "id": "SAT-C",
      "orbit": {
        "state": {
          "epoch": "2027-03-01T06:00:00 TT", "frame": "GCRF",
          "positionKm": [6378.137, 0, 0], "velocityKmPerS": [3.0, 0, 0]
        }
      }
    },
    { "id": "SAT-D", "name": "Precise one", "orbit": { "sp3": { "file": "orbits/invented.sp3", "id": "L99" } } }
  ],
  "stations": [
    { "id": "Kestrel Ridge", "latDeg": 47.25, "lonDeg": 8.5, "heightM": 1210.0, "geoidHeightM": 48.5 },
    { "id": "Low Fen", "latDeg": -33.5, "lonDeg": 300.0, "heightM": -12.0, "maskDeg": 5, "minPassS": 0 }
  ],
  "policy": { "marginNs": 100, "leadTime": "2d", "prefer": "frequency" }
}
`;

/** Parse the valid YAML with one textual replacement; the replacement must apply. */
function parseEdited(from: string, to: string): ScenarioSpec {
  if (!VALID_YAML.includes(from)) throw new Error(`test bug: ${JSON.stringify(from)} not in the fixture`);
  return parseScenarioText(VALID_YAML.replace(from, to), 'edited.yaml', ts);
}

/** The ScenarioError thrown by `fn` (fails the test if there is none or it is of another kind). */
function scenarioError(fn: () => unknown): ScenarioError {
  try {
    fn();
  } catch (e) {
    if (e instanceof ScenarioError) return e;
    throw new Error(`wanted a ScenarioError, got ${String(e)}`);
  }
  throw new Error('wanted a ScenarioError, got no error');
}

const editError = (from: string, to: string): ScenarioError => scenarioError(() => parseEdited(from, to));

/** Parse the valid JSON after a structural edit of its object. */
function parseJsonEdited(edit: (doc: any) => void): ScenarioSpec {
  const doc = JSON.parse(VALID_JSON);
  edit(doc);
  return parseScenarioText(JSON.stringify(doc, null, 2), 'edited.json', ts);
}
const jsonEditError = (edit: (doc: any) => void): ScenarioError => scenarioError(() => parseJsonEdited(edit));

/** 1-based line of the first line of `text` containing `marker`. */
function lineOf(text: string, marker: string): number {
  const i = text.split('\n').findIndex((l) => l.includes(marker));
  if (i < 0) throw new Error(`test bug: ${marker} not found`);
  return i + 1;
}

describe('valid scenario', () => {
  const fromYaml = parseScenarioText(VALID_YAML, 'cases/fixture.yaml', ts);
  const fromJson = parseScenarioText(VALID_JSON, 'cases/fixture.json', ts);

  it('YAML and JSON give equal specs (apart from the file name)', () => {
    expect({ ...fromJson, fileName: '' }).toEqual({ ...fromYaml, fileName: '' });
  });

  it('applies the contract defaults (confirmed: contract "Scenario files")', () => {
    expect(fromYaml.reference).toBe('GPS');
    expect(fromYaml.gravity).toBe('j2'); // given, not defaulted
    const kestrel = fromYaml.stations[0];
    expect([kestrel.geoidHeightM, kestrel.maskDeg, kestrel.minPassS]).toEqual([48.5, 10, 300]);
    const fen = fromYaml.stations[1];
    expect([fen.geoidHeightM, fen.maskDeg, fen.minPassS]).toEqual([0, 5, 0]); // 0 kept, not replaced
    expect(fromYaml.satellites[0].clock?.noise.flickerFmFloor).toBe(0);
    expect(fromYaml.satellites[1].clock).toBeNull();
    const noGravity = parseEdited('gravity: j2\n', '');
    expect(noGravity.gravity).toBe('zonal');
    expect(noGravity.policy.horizonS).toBe(180 * 86400);
  });

  it('parses times and durations', () => {
    // derived: GPS = TAI − 19 s and TAI − UTC = 37 s (no leap second after 2017), so 00:00:00 GPS = 23:59:42 UTC the day before.
    expect(ts.format(fromYaml.window.end)).toBe('2027-03-02T23:59:42.000Z');
    // derived: TT − UTC = 37 + 32.184 s.
    const state = fromYaml.satellites[2].orbit;
    expect(state.kind).toBe('state');
    if (state.kind === 'state') expect(ts.format(state.epoch, 'UTC', 3)).toBe('2027-03-01T05:58:50.816Z');
    expect(fromYaml.policy.leadTimeS).toBe(2 * 86400);
    expect(fromYaml.policy.prefer).toBe('frequency');
  });

  it('takes the satellite name from the TLE name line, drops the "0 " prefix, keeps the lines', () => {
    const sat = fromYaml.satellites[1];
    expect(sat.name).toBe('INVENTED BIRD');
    expect(sat.orbit.kind).toBe('tle');
    if (sat.orbit.kind === 'tle') {
      expect(sat.orbit.line1.startsWith('1 99901U')).toBe(true);
      expect(sat.orbit.line2.startsWith('2 99901 ')).toBe(true);
      expect(sat.orbit.text.split('\n')).toHaveLength(3);
    }
    expect(fromYaml.satellites[0].name).toBeNull();
    expect(fromYaml.satellites[3].name).toBe('Precise one');
  });

  it('resolves an SP3 path against the scenario folder and keeps the path as written', () => {
    const orbit = fromYaml.satellites[3].orbit;
    expect(orbit.kind).toBe('sp3');
    if (orbit.kind === 'sp3') {
      expect(orbit.file).toBe('orbits/invented.sp3');
      expect(orbit.resolvedFile).toBe(resolve('cases', 'orbits', 'invented.sp3'));
    }
    expect(fromYaml.folder).toBe(resolve('cases'));
  });

  it('accepts a two-line TLE list, a [name, line1, line2] list and an inline OMM', () => {
    const two = parseJsonEdited((d) => d.satellites[1].orbit.tle.shift());
    const orbit = two.satellites[1].orbit;
    expect(orbit.kind === 'tle' && orbit.nameLine === null).toBe(true);
    expect(two.satellites[1].name).toBeNull();
    const omm = parseJsonEdited((d) => {
      d.satellites[1].orbit = { omm: { OBJECT_NAME: 'INVENTED OMM', EPOCH: '2027-03-01T00:00:00', MEAN_MOTION: 2.0056 } };
    });
    expect(omm.satellites[1].name).toBe('INVENTED OMM');
    expect(omm.satellites[1].orbit).toEqual({
      kind: 'omm',
      fields: { OBJECT_NAME: 'INVENTED OMM', EPOCH: '2027-03-01T00:00:00', MEAN_MOTION: 2.0056 },
    });
  });

  it('accepts the range edges: lat ±90, lon −180, mask −5 and 89.9, keepInNs just above the margin', () => {
    const spec = parseJsonEdited((d) => {
      d.stations[0].latDeg = 90;
      d.stations[1].latDeg = -90;
      d.stations[0].lonDeg = -180;
      d.stations[0].maskDeg = -5;
      d.stations[1].maskDeg = 89.9;
      d.satellites[0].clock.keepInNs = 100.001;
    });
    expect(spec.stations.map((s) => s.maskDeg)).toEqual([-5, 89.9]);
  });
});

describe('faults: each is one ScenarioError with the right path', () => {
  it('unknown key with a suggestion: agingPerDya → agingPerDay', () => {
    const e = editError('agingPerDay:', 'agingPerDya:');
    expect(e.path).toBe('satellites[0].clock.agingPerDya');
    expect(e.what).toContain('unknown key "agingPerDya"');
    expect(e.fix).toContain('"agingPerDay"');
    // the file line of the key, so the user finds it
    expect(e.what).toContain(`edited.yaml:${lineOf(VALID_YAML, 'agingPerDay:')}`);
  });

  it('unknown key with a suggestion: stations[0].latDge → latDeg (reported before the missing latDeg)', () => {
    const e = editError('latDeg: 47.25', 'latDge: 47.25');
    expect(e.path).toBe('stations[0].latDge');
    expect(e.fix).toContain('"latDeg"');
  });

  it('unknown orbit kind and unknown top-level key get suggestions too; JSON errors carry the line', () => {
    const e = jsonEditError((d) => {
      d.satellites[0].orbit = { keplarian: d.satellites[0].orbit.keplerian };
    });
    expect(e.path).toBe('satellites[0].orbit.keplarian');
    expect(e.fix).toContain('"keplerian"');
    const top = scenarioError(() => parseScenarioText(VALID_JSON.replace('"gravity"', '"gravty"'), 'x.json', ts));
    expect(top.path).toBe('gravty');
    expect(top.fix).toContain('"gravity"');
    expect(top.what).toContain(`x.json:${lineOf(VALID_JSON, '"gravity"')}`);
  });

  it('an unknown key far from every known key lists the allowed keys', () => {
    const e = editError('  prefer: frequency\n', '  prefer: frequency\n  zzzzzzzz: 1\n');
    expect(e.path).toBe('policy.zzzzzzzz');
    expect(e.fix).toContain('marginNs, leadTime, prefer, horizon');
  });

  it('wrong type: a quoted number where a number is wanted', () => {
    const e = editError('latDeg: 47.25', 'latDeg: "47.25"');
    expect(e.path).toBe('stations[0].latDeg');
    expect(e.what).toContain('found "47.25" (a text), expected a number');
    expect(e.fix).toContain('without quotes');
  });

  it('wrong type: an unquoted numeric id', () => {
    const e = editError('id: SAT-B', 'id: 43873');
    expect(e.path).toBe('satellites[1].id');
    expect(e.what).toContain('expected a text');
    expect(e.fix).toContain('"43873"');
  });

  it('missing field', () => {
    const e = editError('    heightM: 1210.0\n', '');
    expect(e.path).toBe('stations[0].heightM');
    expect(e.what).toContain('missing key "heightM"');
  });

  it('station latitude 91', () => {
    const e = editError('latDeg: 47.25', 'latDeg: 91');
    expect(e.path).toBe('stations[0].latDeg');
    expect(e.what).toContain('found 91, must be ≤ 90');
  });

  it('station longitude 360 and height 12 km are refused', () => {
    expect(editError('lonDeg: 8.5', 'lonDeg: 360').path).toBe('stations[0].lonDeg');
    expect(editError('heightM: 1210.0', 'heightM: 12000').path).toBe('stations[0].heightM');
  });

  it('mask −6 and mask 90', () => {
    const low = editError('maskDeg: 5', 'maskDeg: -6');
    expect(low.path).toBe('stations[1].maskDeg');
    expect(low.what).toContain('must be ≥ -5');
    const high = editError('maskDeg: 5', 'maskDeg: 90');
    expect(high.path).toBe('stations[1].maskDeg');
    expect(high.what).toContain('must be < 90');
  });

  it('negative minPassS', () => {
    expect(editError('minPassS: 0', 'minPassS: -1').path).toBe('stations[1].minPassS');
  });

  it('window end before start, and equal to it', () => {
    const before = editError('end: "2027-03-03T00:00:00 GPS"', 'end: 2027-02-28T00:00:00Z');
    expect(before.path).toBe('window.end');
    expect(before.what).toContain('not after its start');
    // same instant written in two scales: 2027-03-01T00:00:37 TAI = 00:00:00Z (derived, TAI − UTC = 37 s)
    expect(editError('end: "2027-03-03T00:00:00 GPS"', 'end: "2027-03-01T00:00:37 TAI"').path).toBe('window.end');
  });

  it('empty satellite list', () => {
    const e = jsonEditError((d) => {
      d.satellites = [];
    });
    expect(e.path).toBe('satellites');
    expect(e.what).toContain('empty');
  });

  it('two orbit kinds, and none', () => {
    const two = jsonEditError((d) => {
      d.satellites[2].orbit.sp3 = { file: 'x.sp3', id: 'L01' };
    });
    expect(two.path).toBe('satellites[2].orbit');
    expect(two.what).toContain('2 orbit kinds given (state, sp3)');
    const none = jsonEditError((d) => {
      d.satellites[2].orbit = {};
    });
    expect(none.path).toBe('satellites[2].orbit');
    expect(none.fix).toContain('tle, omm, keplerian, state, sp3');
  });

  it('negative keepInNs and negative noise level', () => {
    const e = editError('keepInNs: 1000', 'keepInNs: -5');
    expect(e.path).toBe('satellites[0].clock.keepInNs');
    expect(e.what).toContain('must be ≥ 0.01'); // the keep-in floor of src/io/scenarioSchema.ts (10 ps)
    expect(editError('whiteFmAdev1s: 1.0e-12', 'whiteFmAdev1s: -1.0e-12').path).toBe('satellites[0].clock.noise.whiteFmAdev1s');
  });

  it('policy margin not below a satellite keep-in limit', () => {
    const e = editError('keepInNs: 1000', 'keepInNs: 80');
    expect(e.path).toBe('policy.marginNs');
    expect(e.what).toContain('100 ns');
    expect(e.what).toContain('80 ns of satellites[0].clock.keepInNs');
  });

  it('enum typo suggests the option', () => {
    const e = editError('gravity: j2', 'gravity: zonl');
    expect(e.path).toBe('gravity');
    expect(e.fix).toContain('"zonal"');
    expect(editError('prefer: frequency', 'prefer: both').path).toBe('policy.prefer');
    expect(editError('frame: GCRF', 'frame: ITRF').path).toBe('satellites[2].orbit.state.frame');
  });

  it('duplicate ids across satellites and stations', () => {
    const e = editError('id: Low Fen', 'id: SAT-C');
    expect(e.path).toBe('stations[1].id');
    expect(e.what).toContain('satellites[2]');
  });

  it('a Keplerian perigee inside the Earth (aKm given as an altitude) and e = 1', () => {
    const e = editError('aKm: 26560.0', 'aKm: 500');
    expect(e.path).toBe('satellites[0].orbit.keplerian.aKm');
    expect(e.what).toContain('495.000 km'); // 500·(1 − 0.01), derived
    expect(editError('e: 0.01', 'e: 1').path).toBe('satellites[0].orbit.keplerian.e');
  });

  it('a state inside the Earth, and a position with two components', () => {
    // 6356 km is below the WGS-84 polar radius 6356.752 km (derived from a and 1/f).
    const inside = editError('positionKm: [6378.137, 0, 0]', 'positionKm: [0, 0, 6356.0]');
    expect(inside.path).toBe('satellites[2].orbit.state.positionKm');
    expect(inside.what).toContain('inside the Earth');
    const justOutside = parseEdited('positionKm: [6378.137, 0, 0]', 'positionKm: [0, 0, 6356.8]').satellites[2].orbit;
    expect(justOutside.kind === 'state' && justOutside.positionKm[2]).toBe(6356.8);
    const short = editError('positionKm: [6378.137, 0, 0]', 'positionKm: [6378.137, 0]');
    expect(short.path).toBe('satellites[2].orbit.state.positionKm');
  });

  it('a TLE with lines out of order', () => {
    const e = editError('        1 99901U', '        3 99901U');
    expect(e.path).toBe('satellites[1].orbit.tle');
    expect(e.what).toContain('line 1');
  });

  it('YAML syntax error reports file:line', () => {
    const text = VALID_YAML.replace('gravity: j2', 'gravity: j2: zonal');
    const e = scenarioError(() => parseScenarioText(text, 'broken.yaml', ts));
    expect(e.path).toBe(`broken.yaml:${lineOf(text, 'gravity: j2: zonal')}`);
    expect(e.what).toContain('YAML syntax error');
    const tab = VALID_YAML.replace('    lonDeg: 8.5', '\tlonDeg: 8.5');
    expect(scenarioError(() => parseScenarioText(tab, 'tab.yml', ts)).path).toBe(`tab.yml:${lineOf(tab, 'lonDeg: 8.5')}`);
  });

  it('JSON syntax error reports file:line (trailing comma)', () => {
    const text = VALID_JSON.replace('"prefer": "frequency" }', '"prefer": "frequency", }');
    const e = scenarioError(() => parseScenarioText(text, 'broken.json', ts));
    expect(e.path).toBe(`broken.json:${lineOf(text, '"prefer": "frequency", }')}`);
    expect(e.what).toContain('JSON syntax error');
  });

  it('content decides the format when the name has no known extension', () => {
    const a = parseScenarioText(VALID_JSON, '<embedded>', ts);
    const b = parseScenarioText(VALID_YAML, '<embedded>', ts);
    expect(a.satellites.map((s) => s.id)).toEqual(b.satellites.map((s) => s.id));
  });

  it('bad time strings carry their JSON path', () => {
    const noScale = editError('end: "2027-03-03T00:00:00 GPS"', 'end: 2027-03-03T00:00:00');
    expect(noScale.path).toBe('window.end');
    expect(noScale.what).toContain('no scale');
    const badDay = editError('epoch: 2027-03-01T06:00:00 TT', 'epoch: 2027-02-30T06:00:00 TT');
    expect(badDay.path).toBe('satellites[2].orbit.state.epoch');
    const clockEpoch = editError('      epoch: 2027-03-01T00:00:00Z\n      offsetNs', '      epoch: yesterday\n      offsetNs');
    expect(clockEpoch.path).toBe('satellites[0].clock.epoch');
    const lead = editError('leadTime: 2d', 'leadTime: 2 days');
    expect(lead.path).toBe('policy.leadTime');
  });

  it('an empty file', () => {
    const e = scenarioError(() => parseScenarioText('', 'empty.yaml', ts));
    expect(e.path).toBe('empty.yaml');
    expect(e.what).toContain('empty');
  });
});

describe('nearest (Damerau–Levenshtein, optimal string alignment)', () => {
  it('counts a swap of neighbours as one edit (common practice: OSA distance)', () => {
    expect(editDistance('agingPerDya', 'agingPerDay')).toBe(1);
    expect(editDistance('kitten', 'sitting')).toBe(3); // classic textbook pair, from memory
    expect(editDistance('', 'abc')).toBe(3);
  });

  it('picks the closest candidate, ignores case, refuses far ones', () => {
    expect(nearest('latDge', ['latDeg', 'lonDeg', 'heightM'])).toBe('latDeg');
    expect(nearest('MASKDEG', ['maskDeg', 'minPassS'])).toBe('maskDeg');
    expect(nearest('zzzzzzzz', ['marginNs', 'leadTime', 'prefer'])).toBeNull();
  });
});
