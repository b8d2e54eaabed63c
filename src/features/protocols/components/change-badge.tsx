import type { ProtocolComparisonRow } from '../../../../shared/protocol/diff-versions';
import { EqualsIcon, MinusIcon, PlusIcon, SwapIcon } from '../../../components/ui/icons';

const looks: Record<
  ProtocolComparisonRow['change'],
  { word: string; Icon: typeof PlusIcon; box: string }
> = {
  added: { word: 'Added', Icon: PlusIcon, box: 'border-iris-300 bg-iris-50 text-iris-800' },
  removed: {
    word: 'Removed',
    Icon: MinusIcon,
    box: 'border-dashed border-paper-500 bg-paper-100 text-paper-800',
  },
  changed: {
    word: 'Changed',
    Icon: SwapIcon,
    box: 'border-paper-700 bg-white text-paper-950 font-semibold',
  },
  unchanged: { word: 'Same', Icon: EqualsIcon, box: 'border-transparent text-paper-600' },
};

export function ChangeBadge({ change }: { change: ProtocolComparisonRow['change'] }) {
  const { word, Icon, box } = looks[change];
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2 py-0.5 text-sm font-medium ${box}`}
    >
      <Icon className="size-4" />
      {word}
    </span>
  );
}
