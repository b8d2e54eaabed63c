import {
  AlertIcon,
  CheckCircleIcon,
  StatusCompletedIcon,
  StatusStoppedIcon,
} from '../../../components/ui/icons';
import { outcomeWords } from './dose-record-words';

/** How the session ended, as a word and an icon. */
export function OutcomeLabel({ outcome }: { outcome: 'completed' | 'stopped' }) {
  const Icon = outcome === 'completed' ? StatusCompletedIcon : StatusStoppedIcon;
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap font-medium ${outcome === 'stopped' ? 'text-alarm-800' : 'text-paper-900'}`}
    >
      <Icon className="size-4" />
      {outcomeWords[outcome]}
    </span>
  );
}

/** The number of deviations a session had, with an icon that differs between none and some. */
export function DeviationCount({ count }: { count: number }) {
  return count === 0 ? (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-paper-800">
      <CheckCircleIcon className="size-4" />
      No deviations
    </span>
  ) : (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap font-semibold text-alarm-800">
      <AlertIcon className="size-4" />
      {count} {count === 1 ? 'deviation' : 'deviations'}
    </span>
  );
}
