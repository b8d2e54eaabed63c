import { formatDuration } from '../../shared/format/figures';
import { formatReading } from '../../shared/format/precision';

/** The record's figures for what was given (shared/session/dose-record.ts). */
export interface GivenFigures {
  volumeGivenMl: number | null;
  volumeGivenSource?: 'entered' | 'derived' | null;
  doseGivenMg?: number | null;
  plannedDoseMg?: number | null;
}

/** "about 4.4 mg of 10.92 mg": the milligrams in the volume infused, never "as ordered". */
export function doseGivenText(record: GivenFigures): string | null {
  if (record.doseGivenMg == null || record.plannedDoseMg == null) return null;
  // Both at the precision a dose is read at, so the share never reads larger than the whole.
  return `about ${formatReading('doseMg', record.doseGivenMg)} of ${formatReading('doseMg', record.plannedDoseMg)}`;
}

/** "12 mL, read off the pump" or "30 mL, worked out from the planned rate and the infusion time". */
export function volumeGivenText(record: GivenFigures): string | null {
  if (record.volumeGivenMl == null) return null;
  const how =
    record.volumeGivenSource === 'entered'
      ? 'read off the pump'
      : 'worked out from the planned rate and the infusion time';
  return `${formatReading('volumeMl', record.volumeGivenMl)}, ${how}`;
}

/** "4 min 10 s" for a receipt delay: the record's words for a duration. */
export function delayText(seconds: number): string {
  return formatDuration(seconds, 'words');
}
