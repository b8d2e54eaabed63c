import type { OrderStatus } from '../../../../shared/schemas/orders';
import {
  CheckCircleIcon,
  DraftCircleIcon,
  SignatureIcon,
  StatusCheckedIcon,
  StatusCompletedIcon,
  StatusInSessionIcon,
  StatusPreparedIcon,
  StatusReturnedIcon,
  StatusStoppedIcon,
  ArchiveBoxIcon,
  SwapIcon,
} from '../../../components/ui/icons';

const looks: Record<OrderStatus, { word: string; Icon: typeof CheckCircleIcon; dashed?: boolean }> = {
  draft: { word: 'Draft', Icon: DraftCircleIcon, dashed: true },
  signed: { word: 'Signed', Icon: SignatureIcon },
  returned: { word: 'Sent back', Icon: StatusReturnedIcon },
  checked: { word: 'Dose checked', Icon: StatusCheckedIcon },
  prepared: { word: 'Prepared', Icon: StatusPreparedIcon },
  ready: { word: 'Ready', Icon: CheckCircleIcon },
  'in-session': { word: 'In session', Icon: StatusInSessionIcon },
  completed: { word: 'Completed', Icon: StatusCompletedIcon },
  stopped: { word: 'Stopped early', Icon: StatusStoppedIcon },
  reviewed: { word: 'Reviewed', Icon: ArchiveBoxIcon },
  superseded: { word: 'Replaced by an amendment', Icon: SwapIcon, dashed: true },
};

/** An order's status on the patient's history: a word and an icon, never colour alone. */
export function TreatmentStatus({ status }: { status: OrderStatus }) {
  const { word, Icon, dashed } = looks[status];
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-medium text-paper-800 ${dashed ? 'border-dashed border-paper-500 bg-white' : 'border-paper-300 bg-paper-100'}`}
    >
      <Icon className="size-4" />
      {word}
    </span>
  );
}
