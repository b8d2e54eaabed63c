import type { DeviationSeverity } from '../../../../shared/session/session-events';
import { AlertIcon, InfoIcon } from '../../../components/ui/icons';
import { deviationSeverityWords } from './session-words';

const looks: Record<DeviationSeverity, { Icon: typeof AlertIcon; box: string }> = {
  critical: { Icon: AlertIcon, box: 'border-alarm-700 bg-alarm-700 text-white' },
  major: { Icon: AlertIcon, box: 'border-alarm-700 bg-white text-alarm-800' },
  minor: { Icon: InfoIcon, box: 'border-paper-500 bg-white text-paper-800' },
};

/** A deviation's severity as a word and an icon in a chip; colour is never the only cue. */
export function DeviationSeverityLabel({ severity }: { severity: DeviationSeverity }) {
  const { Icon, box } = looks[severity];
  return (
    <span
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2 py-0.5 text-sm font-semibold ${box}`}
    >
      <Icon className="size-4" />
      {deviationSeverityWords[severity]}
    </span>
  );
}
