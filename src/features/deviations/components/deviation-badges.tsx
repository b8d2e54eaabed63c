import type { ReviewClassification, ReviewStatus } from '../../../../shared/schemas/reviews';
import type { DeviationSeverity } from '../../../../shared/session/session-events';
import {
  AlertIcon,
  ArchiveBoxIcon,
  CheckCircleIcon,
  FlagIcon,
  HourglassIcon,
  SeverityLevelIcon,
} from '../../../components/ui/icons';
import { classificationWords, severityWords, statusWords } from './deviation-words';

const pill =
  'inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-medium';

const severityLooks: Record<DeviationSeverity, { level: 1 | 2 | 3; box: string }> = {
  minor: { level: 1, box: 'border-paper-400 bg-white text-paper-800' },
  major: { level: 2, box: 'border-alarm-700 bg-alarm-50 text-alarm-800' },
  critical: { level: 3, box: 'border-alarm-700 bg-alarm-700 text-white' },
};

/** Severity as a word and a bar count (one, two or three solid bars); the fill is a third cue. */
export function SeverityBadge({ severity }: { severity: DeviationSeverity }) {
  const { level, box } = severityLooks[severity];
  return (
    <span className={`${pill} ${box}`}>
      <SeverityLevelIcon level={level} className="size-4" />
      {severityWords[severity]}
    </span>
  );
}

/** Open or closed, as a word and an icon. */
export function ReviewStatusBadge({ status }: { status: ReviewStatus }) {
  const Icon = status === 'open' ? HourglassIcon : ArchiveBoxIcon;
  const box =
    status === 'open'
      ? 'border-iris-700 bg-white text-iris-800'
      : 'border-paper-300 bg-paper-200 text-paper-800';
  return (
    <span className={`${pill} ${box}`}>
      <Icon className="size-4" />
      {statusWords[status]}
    </span>
  );
}

const classificationIcons = {
  acceptable: CheckCircleIcon,
  'needs-follow-up': FlagIcon,
  incident: AlertIcon,
} as const;

export function ClassificationLabel({ classification }: { classification: ReviewClassification }) {
  const Icon = classificationIcons[classification];
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap font-medium text-paper-900">
      <Icon className="size-4" />
      {classificationWords[classification].label}
    </span>
  );
}

export { classificationIcons };
