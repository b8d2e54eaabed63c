import type { OrderStatus } from '../../../../shared/schemas/orders';
import {
  CheckCircleIcon,
  CrossCircleIcon,
  DraftCircleIcon,
  HourglassIcon,
  PauseCircleIcon,
  SignatureIcon,
  StartCircleIcon,
  SwapIcon,
  TurnBackIcon,
  VialCheckIcon,
} from '../../../components/ui/icons';

const labels: Record<OrderStatus, { words: string; Icon: typeof CheckCircleIcon }> = {
  draft: { words: 'Draft', Icon: DraftCircleIcon },
  signed: { words: 'Signed, waiting for dose check', Icon: SignatureIcon },
  returned: { words: 'Sent back to the clinician', Icon: TurnBackIcon },
  checked: { words: 'Dose checked, waiting for preparation', Icon: CheckCircleIcon },
  prepared: { words: 'Prepared', Icon: VialCheckIcon },
  ready: { words: 'Ready for treatment', Icon: StartCircleIcon },
  'in-session': { words: 'In session', Icon: HourglassIcon },
  completed: { words: 'Completed', Icon: CheckCircleIcon },
  stopped: { words: 'Stopped', Icon: CrossCircleIcon },
  reviewed: { words: 'Reviewed', Icon: PauseCircleIcon },
  superseded: { words: 'Replaced by an amendment', Icon: SwapIcon },
};

export function orderStatusWords(status: OrderStatus): string {
  return labels[status].words;
}

/** The order's status as an icon and words, in an outlined chip so it reads without colour. */
export function OrderStatusLabel({ status }: { status: OrderStatus }) {
  const { words, Icon } = labels[status];
  return (
    <span className="inline-flex items-center gap-1.5 rounded-full border border-paper-400 bg-white px-2.5 py-0.5 text-sm font-medium text-paper-800">
      <Icon className="size-4" />
      {words}
    </span>
  );
}
