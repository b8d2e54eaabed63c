import type { SessionEventType } from '../../shared/session/session-events';

/** A tap in a few words, as the step clock, the review timeline and the printed record name it. */
export const eventWords: Record<SessionEventType, string> = {
  'session-started': 'session start',
  'step-started': 'step start',
  'step-ended': 'step end',
  paused: 'pause',
  resumed: 'resume',
  'drop-given': 'drop',
  'thickness-measured': 'thickness reading',
  'thickness-override': 'thickness override',
  extravasation: 'extravasation',
  'exposure-recorded': 'laser exposure entered',
  'session-stopped': 'stop',
  'session-completed': 'completion',
  'tap-withdrawn': 'withdrawal of a tap',
  'identity-confirmed': 'identity and eye confirmed before the light',
  'aftercare-checked': 'after-care item done',
};

/** Words for a type read from the server as text; a type this client does not know shows as its key. */
export function eventWordsOf(type: string): string {
  return (eventWords as Record<string, string | undefined>)[type] ?? type;
}
