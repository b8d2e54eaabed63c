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
  signed: { words: 'Waiting for dose check', Icon: SignatureIcon },
  returned: { words: 'Sent back', Icon: TurnBackIcon },
  checked: { words: 'Dose checked', Icon: CheckCircleIcon },
  prepared: { words: 'Prepared', Icon: VialCheckIcon },
  ready: { words: 'Ready', Icon: StartCircleIcon },
  'in-session': { words: 'In session', Icon: HourglassIcon },
  completed: { words: 'Completed', Icon: CheckCircleIcon },
  stopped: { words: 'Stopped', Icon: CrossCircleIcon },
  reviewed: { words: 'Reviewed', Icon: PauseCircleIcon },
  superseded: { words: 'Replaced', Icon: SwapIcon },
};

/** Status as an icon and a word in an outlined chip, so it reads the same without colour. */
export function OrderStatusLabel({ status }: { status: OrderStatus }) {
  const { words, Icon } = labels[status];
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border border-paper-400 bg-white px-2.5 py-0.5 text-sm font-medium text-paper-800">
      <Icon className="size-4" />
      {words}
    </span>
  );
}
