import type { OrderStatus } from '../../../shared/schemas/orders';
import { orderStatusTable, type OrderStatusTone } from './order-status-words';

/** The badge's box per tone; the outline (dashed, solid, filled) is a cue beside the colour. */
const boxes: Record<OrderStatusTone, string> = {
  unsigned: 'border-dashed border-paper-500 bg-white text-paper-800',
  waiting: 'border-iris-300 bg-iris-50 text-iris-800',
  'sent-back': 'border-alarm-700 bg-alarm-50 text-alarm-800',
  ready: 'border-iris-700 bg-iris-700 text-white',
  running: 'border-iris-700 bg-white text-iris-800',
  done: 'border-paper-400 bg-paper-100 text-paper-900',
  stopped: 'border-alarm-700 bg-white text-alarm-800',
  filed: 'border-paper-300 bg-paper-200 text-paper-800',
  replaced: 'border-dashed border-paper-400 bg-paper-100 text-paper-700',
};

/** An order's status as its word and icon in a toned box (the Orders list, the order itself); colour is never the only cue. */
export function OrderStatusBadge({
  status,
  size = 'sm',
}: {
  status: OrderStatus;
  size?: 'sm' | 'lg';
}) {
  const { Icon, short, tone } = orderStatusTable[status];
  const scale = size === 'lg' ? 'px-3.5 py-1 text-base' : 'px-2.5 py-0.5 text-sm';
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border font-medium ${scale} ${boxes[tone]}`}
    >
      <Icon className={size === 'lg' ? 'size-5' : 'size-4'} />
      {short}
    </span>
  );
}
