import type { OrderStatus } from '../../../../shared/schemas/orders';
import {
  ArchiveBoxIcon,
  CheckCircleIcon,
  DraftCircleIcon,
  SignatureIcon,
  StatusCheckedIcon,
  StatusCompletedIcon,
  StatusInSessionIcon,
  StatusPreparedIcon,
  StatusReturnedIcon,
  StatusStoppedIcon,
  SwapIcon,
} from '../../../components/ui/icons';
import { statusWords } from './order-words';

const looks: Record<OrderStatus, { Icon: typeof CheckCircleIcon; box: string }> = {
  draft: { Icon: DraftCircleIcon, box: 'border-dashed border-paper-500 bg-white text-paper-800' },
  signed: { Icon: SignatureIcon, box: 'border-iris-300 bg-iris-50 text-iris-800' },
  returned: { Icon: StatusReturnedIcon, box: 'border-alarm-700 bg-alarm-50 text-alarm-800' },
  checked: { Icon: StatusCheckedIcon, box: 'border-iris-300 bg-iris-50 text-iris-800' },
  prepared: { Icon: StatusPreparedIcon, box: 'border-iris-300 bg-iris-50 text-iris-800' },
  ready: { Icon: CheckCircleIcon, box: 'border-iris-700 bg-iris-700 text-white' },
  'in-session': { Icon: StatusInSessionIcon, box: 'border-iris-700 bg-white text-iris-800' },
  completed: { Icon: StatusCompletedIcon, box: 'border-paper-400 bg-paper-100 text-paper-900' },
  stopped: { Icon: StatusStoppedIcon, box: 'border-alarm-700 bg-white text-alarm-800' },
  reviewed: { Icon: ArchiveBoxIcon, box: 'border-paper-300 bg-paper-200 text-paper-800' },
  superseded: { Icon: SwapIcon, box: 'border-dashed border-paper-400 bg-paper-100 text-paper-700' },
};

/** An order's status as a word and an icon; the outline is a third cue, colour never the only one. */
export function OrderStatusBadge({ status, size = 'sm' }: { status: OrderStatus; size?: 'sm' | 'lg' }) {
  const { Icon, box } = looks[status];
  const scale = size === 'lg' ? 'px-3.5 py-1 text-base' : 'px-2.5 py-0.5 text-sm';
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border font-medium ${scale} ${box}`}>
      <Icon className={size === 'lg' ? 'size-5' : 'size-4'} />
      {statusWords[status]}
    </span>
  );
}
