/**
 * Simulated clock-offset measurements for the demo and the fit tests. The data are invented:
 * a known polynomial clock plus seeded white Gaussian noise, nothing measured.
 *
 * Generator: mulberry32 (a 32-bit multiply–xorshift generator, public domain) seeded with an
 * unsigned 32-bit integer, and Box–Muller for Gaussian deviates. The same options always give
 * the same file, on every platform (only 32-bit integer arithmetic and IEEE doubles).
 *
 * Run: `node --import tsx scripts/make-demo-measurements.ts [OUT.csv]` writes the demo file
 * (data/demo/tsr1-offsets.csv by default) from the demo scenario's TSR-1 clock and prints its
 * provenance on stderr. simulateMeasurements() with demoOptions() serves the fit tests.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { loadScenarioContext } from '../src/cli/scenarioContext.ts';
import { defaultTimeSystem } from '../src/io/tables.ts';
import { Instant } from '../src/time/instant.ts';
import { gaussian, mulberry32 } from './prng.ts';
import type { TimeSystem } from '../src/time/timeSystem.ts';

/** Options of {@link simulateMeasurements}. */
export interface SimulationOptions {
  /** First sample time, s since J2000.0 TT; this is also the epoch of the parameters. */
  startTtJ2000S: number;
  /** Spacing of the samples, s. */
  stepS: number;
  /** Number of rows. */
  count: number;
  /** Offset at the first sample, ns. */
  offsetNs: number;
  /** Fractional frequency at the first sample (dimensionless). */
  fractionalFrequency: number;
  /** Change of fractional frequency per day (1/day). */
  driftPerDay: number;
  /** Standard deviation of the white measurement noise, ns (0 for none). */
  whiteNoiseNs: number;
  /** Seed of the generator, an integer (taken modulo 2³²). */
  seed: number;
  /** Write a `sigmaNs` column equal to `whiteNoiseNs` (default false). */
  withSigma?: boolean;
  /** Rows (0-based data index) whose offset is moved by `outlierNs`, to test clipping. */
  outlierRows?: readonly number[];
  /** Size of the injected outliers, ns (default 0). */
  outlierNs?: number;
}

export { gaussian, mulberry32 } from './prng.ts';

/**
 * CSV text `time,offsetNs[,sigmaNs]` of a simulated clock:
 * offsetNs(t) = offsetNs + y·t·1e9 + (driftPerDay/86400)·t²/2·1e9 + noise, t from the first sample.
 * Times are written as UTC with `Z` and milliseconds; keep `stepS` a whole number of ms.
 * @param timeSystem formats the times (default: the package's leap-second table)
 */
export function simulateMeasurements(o: SimulationOptions, timeSystem: TimeSystem = defaultTimeSystem()): string {
  const normal = gaussian(mulberry32(o.seed));
  const outliers = new Set(o.outlierRows ?? []);
  const driftPerS = o.driftPerDay / 86400;
  const lines = [o.withSigma === true ? 'time,offsetNs,sigmaNs' : 'time,offsetNs'];
  for (let k = 0; k < o.count; k++) {
    const tS = k * o.stepS;
    let offsetNs = o.offsetNs + (o.fractionalFrequency * tS + (driftPerS * tS * tS) / 2) * 1e9;
    offsetNs += o.whiteNoiseNs * normal();
    if (outliers.has(k)) offsetNs += o.outlierNs ?? 0;
    const time = timeSystem.format(Instant.fromTtJ2000S(o.startTtJ2000S + tS));
    const fields = [time, offsetNs.toPrecision(15)];
    if (o.withSigma === true) fields.push(String(o.whiteNoiseNs));
    lines.push(fields.join(','));
  }
  return `${lines.join('\n')}\n`;
}

/** Parameters of the demo file: one day of 5-min samples from 2027-01-01T00:00:00Z, an invented clock. */
export const demoOptions = (timeSystem: TimeSystem): SimulationOptions => ({
  startTtJ2000S: timeSystem.parse('2027-01-01T00:00:00Z', 'demo start').ttJ2000S,
  stepS: 300,
  count: 288,
  offsetNs: 125.0,
  fractionalFrequency: 4.2e-12,
  driftPerDay: 1.0e-13,
  whiteNoiseNs: 0.8,
  seed: 20270101,
  withSigma: false,
  outlierRows: [137],
  outlierNs: 15,
});

/**
 * The demo file: the invented scenario's TSR-1 clock (oscillator model plus relativity along its
 * SGP4 orbit, as tauplan predicts it) sampled every 5 min for one day, plus seeded white noise of
 * 0.8 ns (seed 20270104) and one 15 ns outlier at data row 137. Invented, not measured.
 */
export function demoMeasurementsFromScenario(timeSystem: TimeSystem, scenarioPath: string): string {
  const ctx = loadScenarioContext(scenarioPath, timeSystem, { sat: 'TSR-1', from: '2027-01-04T00:00:00Z', to: '2027-01-05T00:00:00Z' });
  const run = ctx.runs[0];
  const normal = gaussian(mulberry32(20270104));
  const lines = ['time,offsetNs'];
  for (let k = 0; k < 288; k++) {
    const t = ctx.fromTtJ2000S + 300 * k;
    const x = run.clock.offsetNs(t) + 0.8 * normal() + (k === 137 ? 15 : 0);
    lines.push(`${timeSystem.format(Instant.fromTtJ2000S(t))},${x.toPrecision(15)}`);
  }
  return `${lines.join('\n')}\n`;
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const timeSystem = defaultTimeSystem();
  const scenario = fileURLToPath(new URL('../data/demo/tessera.yaml', import.meta.url));
  const out = process.argv[2] ?? fileURLToPath(new URL('../data/demo/tsr1-offsets.csv', import.meta.url));
  writeFileSync(out, demoMeasurementsFromScenario(timeSystem, scenario));
  process.stderr.write(`wrote ${out}: SIMULATED offsets of the invented TSR-1 clock (scenario model + 0.8 ns white noise, seed 20270104, one 15 ns outlier)\n`);
}
