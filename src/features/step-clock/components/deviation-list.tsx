import type { DeviationSeverity } from '../../../../shared/session/session-events';
import {
  AlertIcon,
  CheckCircleIcon,
  InfoIcon,
  StatusStoppedIcon,
} from '../../../components/ui/icons';
import type { SessionDeviation } from '../api/session-state-schema';
import { formatFigurePair } from '../../../../shared/format/precision';

const severityLooks: Record<
  DeviationSeverity,
  { word: string; Icon: typeof AlertIcon; box: string }
> = {
  minor: { word: 'Minor', Icon: InfoIcon, box: 'border-paper-400 bg-white' },
  major: { word: 'Major', Icon: AlertIcon, box: 'border-alarm-600 bg-alarm-50' },
  critical: {
    word: 'Critical',
    Icon: StatusStoppedIcon,
    box: 'border-alarm-800 border-2 bg-alarm-100',
  },
};

/** Deviations from the protocol as the server finds them, each with its severity in a word and an icon. */
export function DeviationList({
  deviations,
  headingId,
}: {
  deviations: readonly SessionDeviation[];
  headingId: string;
}) {
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-2">
      <h2 id={headingId} className="font-semibold text-paper-950">
        Deviations from protocol{deviations.length > 0 ? ` (${deviations.length})` : ''}
      </h2>
      {deviations.length === 0 ? (
        <p className="flex items-center gap-2 text-sm text-paper-700">
          <CheckCircleIcon className="size-5" />
          None so far.
        </p>
      ) : (
        <ul className="flex flex-col gap-2">
          {deviations.map((deviation) => {
            const look = severityLooks[deviation.severity];
            return (
              <li
                key={deviation.id}
                className={`rounded-lg border px-3 py-2 text-sm text-paper-950 ${look.box}`}
              >
                <p className="flex items-center gap-1.5 font-semibold">
                  <look.Icon className="size-4" />
                  {look.word}
                </p>
                <p>{deviation.message}</p>
                {(deviation.expected !== null || deviation.actual !== null) && (
                  <p className="numerals-steady text-paper-800">
                    Expected{' '}
                    {
                      formatFigurePair(deviation.expected, deviation.actual, deviation.unit)
                        .expected
                    }{' '}
                    · actual{' '}
                    {formatFigurePair(deviation.expected, deviation.actual, deviation.unit).actual}
                  </p>
                )}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
