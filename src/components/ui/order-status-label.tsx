import type { OrderStatus } from '../../../shared/schemas/orders';
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
} from './icons';

/**
 * "long" says what the order waits for, for the pharmacist's screens; "short" fits a worklist
 * row on Today. Both use the same icon for a status, so the two screens read alike.
 */
export type OrderStatusWording = 'long' | 'short';

const labels: Record<OrderStatus, { long: string; short: string; Icon: typeof CheckCircleIcon }> = {
  draft: { long: 'Draft', short: 'Draft', Icon: DraftCircleIcon },
  signed: { long: 'Signed, waiting for dose check', short: 'Waiting for dose check', Icon: SignatureIcon },
  returned: { long: 'Sent back to the clinician', short: 'Sent back', Icon: TurnBackIcon },
  checked: { long: 'Dose checked, waiting for preparation', short: 'Dose checked', Icon: CheckCircleIcon },
  prepared: { long: 'Prepared', short: 'Prepared', Icon: VialCheckIcon },
  ready: { long: 'Ready for treatment', short: 'Ready', Icon: StartCircleIcon },
  'in-session': { long: 'In session', short: 'In session', Icon: HourglassIcon },
  completed: { long: 'Completed', short: 'Completed', Icon: CheckCircleIcon },
  stopped: { long: 'Stopped', short: 'Stopped', Icon: CrossCircleIcon },
  reviewed: { long: 'Reviewed', short: 'Reviewed', Icon: PauseCircleIcon },
  superseded: { long: 'Replaced by an amendment', short: 'Replaced', Icon: SwapIcon },
};

export function orderStatusWords(status: OrderStatus, wording: OrderStatusWording): string {
  return labels[status][wording];
}

/** The order's status as an icon and words, in an outlined chip so it reads without colour. */
export function OrderStatusLabel({ status, wording }: { status: OrderStatus; wording: OrderStatusWording }) {
  const { Icon } = labels[status];
  // The short words never need to wrap; the long ones may, in a narrow list.
  const wrap = wording === 'short' ? 'whitespace-nowrap' : '';
  return (
    <span className={`inline-flex items-center gap-1.5 rounded-full border border-paper-400 bg-white px-2.5 py-0.5 text-sm font-medium text-paper-800 ${wrap}`}>
      <Icon className="size-4" />
      {labels[status][wording]}
    </span>
  );
}
