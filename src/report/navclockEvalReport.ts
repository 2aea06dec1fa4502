/**
 * Writers for the broadcast clock evaluation of `tauplan navclock --nav --precise --orbit`
 * ({@link BroadcastEvalResult} from src/plan/navclockBroadcast.ts). Pure string building.
 */
import type { NavSystem } from '../plan/navclockBroadcast.ts';
import type { BroadcastEvalResult } from '../plan/navclockBroadcast.ts';
import { PLANNING_CAUTION } from './caution.ts';
import { toCsv } from './csv.ts';
import { fixed, textTable } from './format.ts';

export interface BroadcastEvalMeta {
  navFile: string;
  preciseFile: string;
  orbitFile: string;
  /** Agency of the precise product (SP3 header), to cite. */
  preciseAgency: string;
  systems: NavSystem[];
  notes: string[];
}

export const BROADCAST_PERIODIC_TEXT =
  'both sides carry the periodic relativistic term: broadcast = af polynomial + Δt_r = F·e·√A·sin E from the record\'s Keplerian elements; precise = SP3 clock + (−2 r·v/c²) from the orbit file';
export const BROADCAST_OFFSET_TEXT =
  'the mean over the satellites of each system is removed at every epoch (precise clocks refer to their own ensemble, broadcast clocks to GPST or GST); epochs with one satellite of a system are dropped';
export const BROADCAST_SELECTION_TEXT =
  'record in use: the most recently transmitted healthy record whose toc is within its validity (GPS half its fit interval, Galileo 4 h); Galileo clocks for the E1/E5a pair where the satellite has them; age of data = t − toc';

export function broadcastEvalToJson(r: BroadcastEvalResult, meta: BroadcastEvalMeta) {
  return {
    satellites: r.satellites,
    commonOffsetRemoved: r.commonOffsetRemoved,
    commonOffset: BROADCAST_OFFSET_TEXT,
    periodicTerm: BROADCAST_PERIODIC_TEXT,
    recordSelection: BROADCAST_SELECTION_TEXT,
    errorAgainstAge: r.errorAgainstAge,
    systems: meta.systems,
    navFile: meta.navFile,
    preciseFile: meta.preciseFile,
    preciseAgency: meta.preciseAgency,
    orbitFile: meta.orbitFile,
    notes: meta.notes,
    caution: PLANNING_CAUTION,
  };
}

export const BROADCAST_CSV_COLUMNS = ['satellite', 'system', 'epochs', 'rmsNs', 'maxAbsNs', 'meanNs'] as const;

export function broadcastEvalToCsv(r: BroadcastEvalResult): string {
  return toCsv(BROADCAST_CSV_COLUMNS, r.satellites.map((s) => [s.satellite, s.system, s.epochs, s.rmsNs, s.maxAbsNs, s.meanNs]));
}

export function broadcastEvalToText(r: BroadcastEvalResult, meta: BroadcastEvalMeta): string {
  const out = [
    'Broadcast clock minus precise clock',
    `navigation: ${meta.navFile}`,
    `precise clocks: ${meta.preciseFile} (${meta.preciseAgency}); orbit: ${meta.orbitFile}`,
    `periodic term: ${BROADCAST_PERIODIC_TEXT}`,
    `common offset: ${BROADCAST_OFFSET_TEXT}`,
    `selection: ${BROADCAST_SELECTION_TEXT}`,
    ...meta.notes.map((n) => `note: ${n}`),
    '',
    textTable(
      ['satellite', 'epochs', 'RMS ns', 'max |Δ| ns', 'mean ns'],
      r.satellites.map((s) => [s.satellite, String(s.epochs), fixed(s.rmsNs, 3), fixed(s.maxAbsNs, 3), fixed(s.meanNs, 3)]),
    ),
    '',
    'Error against age of data (t − toc), all satellites of a system',
    textTable(
      ['system', 'age from h', 'age to h', 'epochs', 'RMS ns'],
      r.errorAgainstAge.map((b) => [b.system, fixed(b.ageFromS / 3600, 1), fixed(b.ageToS / 3600, 1), String(b.epochs), fixed(b.rmsNs, 3)]),
    ),
    '',
    PLANNING_CAUTION,
    '',
  ];
  return out.join('\n');
}
