import type { OrderStatus } from '../../../shared/schemas/orders';
import { hasDashedOutline, orderStatusTable, type OrderStatusWording } from './order-status-words';

/**
 * The order's status as an icon and words in a calm outlined chip, for worklists, the pharmacy
 * screens and the patient's history. Words and icon come from the one status table.
 */
export function OrderStatusLabel({
  status,
  wording,
}: {
  status: OrderStatus;
  wording: OrderStatusWording;
}) {
  const { Icon } = orderStatusTable[status];
  // The short words never need to wrap; the long ones may, in a narrow list.
  const wrap = wording === 'short' ? 'whitespace-nowrap' : '';
  const outline = hasDashedOutline(status) ? 'border-dashed border-paper-500' : 'border-paper-400';
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full border bg-white px-2.5 py-0.5 text-sm font-medium text-paper-800 ${outline} ${wrap}`}
    >
      <Icon className="size-4" />
      {orderStatusTable[status][wording]}
    </span>
  );
}
