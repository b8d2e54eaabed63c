import type { DeviationSeverity } from '../../../../shared/session/session-events';
import type { GivenRecord } from '../api/order-response-schemas';

export const sessionOutcomeWords: Record<GivenRecord['outcome'], string> = {
  'not-started': 'Not started',
  'in-progress': 'In progress',
  completed: 'Completed',
  stopped: 'Stopped early',
};

export { severityWords as deviationSeverityWords } from '../../../lib/deviation-words';

/** Most severe first, so the worst departure is read first. */
export const deviationSeverityOrder: readonly DeviationSeverity[] = ['critical', 'major', 'minor'];
