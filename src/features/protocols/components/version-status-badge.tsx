import {
  ArchiveBoxIcon,
  CheckCircleIcon,
  DraftCircleIcon,
  MinusIcon,
  SwapIcon,
} from '../../../components/ui/icons';
import type { VersionStatus } from '../api/protocol-response-schemas';

type Look = { word: string; Icon: typeof CheckCircleIcon; box: string };

const looks: Record<VersionStatus, Look> = {
  approved: {
    word: 'Approved',
    Icon: CheckCircleIcon,
    box: 'border-iris-300 bg-iris-50 text-iris-800',
  },
  draft: {
    word: 'Draft',
    Icon: DraftCircleIcon,
    box: 'border-dashed border-paper-500 bg-white text-paper-800',
  },
  retired: {
    word: 'Retired',
    Icon: ArchiveBoxIcon,
    box: 'border-paper-300 bg-paper-200 text-paper-800',
  },
  discarded: {
    word: 'Discarded',
    Icon: MinusIcon,
    box: 'border-dashed border-paper-400 bg-paper-100 text-paper-800',
  },
};

/** Approved, but a newer version of the same protocol is approved too (derived by the server). */
const superseded: Look = {
  word: 'Superseded',
  Icon: SwapIcon,
  box: 'border-paper-400 bg-white text-paper-800',
};

/** Status as a word and an icon, with the outline style as a third cue; colour is never the only one. */
export function VersionStatusBadge({
  status,
  supersededBy = null,
}: {
  status: VersionStatus;
  supersededBy?: number | null;
}) {
  const { word, Icon, box } =
    status === 'approved' && supersededBy !== null ? superseded : looks[status];
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-medium ${box}`}
    >
      <Icon className="size-4" />
      {word}
      {status === 'approved' && supersededBy !== null && (
        <span className="font-normal">by v{supersededBy}</span>
      )}
    </span>
  );
}
