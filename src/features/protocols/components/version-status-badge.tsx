import { ArchiveBoxIcon, CheckCircleIcon, DraftCircleIcon } from '../../../components/ui/icons';
import type { VersionStatus } from '../api/protocol-response-schemas';

const looks: Record<VersionStatus, { word: string; Icon: typeof CheckCircleIcon; box: string }> = {
  approved: { word: 'Approved', Icon: CheckCircleIcon, box: 'border-iris-300 bg-iris-50 text-iris-800' },
  draft: { word: 'Draft', Icon: DraftCircleIcon, box: 'border-dashed border-paper-500 bg-white text-paper-800' },
  retired: { word: 'Retired', Icon: ArchiveBoxIcon, box: 'border-paper-300 bg-paper-200 text-paper-800' },
};

/** Status as a word and an icon, with the outline style as a third cue; colour is never the only one. */
export function VersionStatusBadge({ status }: { status: VersionStatus }) {
  const { word, Icon, box } = looks[status];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-medium ${box}`}>
      <Icon className="size-4" />
      {word}
    </span>
  );
}
