/**
 * HTML pages of `tauplan navclock`: the generated sets with a plot of the expected clock error
 * against age of data (one curve per satellite), and the broadcast evaluation with its error
 * against age. Only draws what src/plan computed.
 */
import type { NavClockResult } from '../plan/navclock.ts';
import type { BroadcastEvalResult } from '../plan/navclockBroadcast.ts';
import { Instant } from '../time/instant.ts';
import type { TimeSystem } from '../time/timeSystem.ts';
import { page } from './htmlReport.ts';
import { BROADCAST_OFFSET_TEXT, BROADCAST_PERIODIC_TEXT, BROADCAST_SELECTION_TEXT, type BroadcastEvalMeta } from './navclockEvalReport.ts';
import { NAVCLOCK_AGE_RULE, NAVCLOCK_CONVENTION, type NavClockMeta } from './navclockReport.ts';
import { ageErrorPlot } from './svg.ts';

const hours = (s: number): string => `${+(s / 3600).toFixed(2)} h`;

export function navClockToHtml(r: NavClockResult, meta: NavClockMeta, ts: TimeSystem): string {
  const utc = (t: number): string => ts.format(Instant.fromTtJ2000S(t));
  return page('tauplan — navigation-message clock parameters', r.message, [
    { label: 'source', value: meta.source },
    { label: 'sets', value: `degree ${r.degree}, every ${hours(r.intervalS)}, fit interval ${hours(r.fitIntervalS)}` },
  ], [
    {
      heading: 'Expected clock error against age of data',
      intro: [NAVCLOCK_AGE_RULE, `Band: ${meta.bandRule}`, ...meta.notes].join('\n\n'),
      figures: [{
        svg: ageErrorPlot('Expected clock error against age of data (worst set per satellite)', r.satellites.map((s) => ({ label: s.satellite, ageS: s.errorAgainstAge.map((p) => p.ageS), errorNs: s.errorAgainstAge.map((p) => p.errorNs) }))),
        caption: 'One curve per satellite; multiply by c (0.2998 m/ns) for the range error.',
      }],
    },
    {
      heading: 'Parameter sets',
      intro: NAVCLOCK_CONVENTION,
      tables: r.satellites.map((s) => ({
        caption: `${s.satellite}: ${s.sets.length} sets`,
        columns: ['toc (UTC)', 'GPS week', { label: 'sow', unit: 's' }, { label: 'af0', unit: 's', format: (v) => v.toExponential(10) }, { label: 'af1', unit: 's/s', format: (v) => v.toExponential(10) }, { label: 'af2', unit: 's/s²', format: (v) => v.toExponential(6) }, { label: 'fit max', unit: 'ns' }, { label: 'quantisation max', unit: 'ns' }, { label: 'error at 0', unit: 'ns' }, { label: 'error at 24 h', unit: 'ns' }],
        rows: s.sets.map((x) => [utc(x.tocTtJ2000S), x.tocGpsWeek, x.tocGpsSecondsOfWeek, x.af0S, x.af1, x.af2PerS, x.fitResidualMaxNs, x.quantisationErrorMaxNs, x.expectedErrorNs.age0, x.expectedErrorNs.age24h]),
      })),
    },
  ]);
}

export function broadcastEvalToHtml(r: BroadcastEvalResult, meta: BroadcastEvalMeta): string {
  const systems = [...new Set(r.errorAgainstAge.map((b) => b.system))];
  return page('tauplan — broadcast clock error', meta.navFile, [
    { label: 'precise clocks', value: `${meta.preciseFile} (${meta.preciseAgency})` },
    { label: 'orbit', value: meta.orbitFile },
  ], [
    {
      heading: 'Broadcast minus precise clock',
      intro: [BROADCAST_PERIODIC_TEXT, BROADCAST_OFFSET_TEXT, BROADCAST_SELECTION_TEXT, ...meta.notes].join('\n\n'),
      figures: [{
        svg: ageErrorPlot('Broadcast clock error (RMS) against age of data t − toc', systems.map((sys) => {
          const bins = r.errorAgainstAge.filter((b) => b.system === sys);
          return { label: sys === 'gps' ? 'GPS' : 'Galileo', ageS: bins.map((b) => b.ageFromS + (b.ageToS - b.ageFromS) / 2), errorNs: bins.map((b) => b.rmsNs) };
        }), 'RMS broadcast − precise'),
        caption: 'All satellites of a system, half-hour bins, common offset per epoch removed.',
      }],
      tables: [{
        caption: 'Per satellite',
        columns: ['satellite', 'epochs', { label: 'RMS', unit: 'ns' }, { label: 'max |Δ|', unit: 'ns' }, { label: 'mean', unit: 'ns' }],
        rows: r.satellites.map((s) => [s.satellite, s.epochs, s.rmsNs, s.maxAbsNs, s.meanNs]),
      }],
    },
  ]);
}
