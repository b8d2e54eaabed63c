import type { OrderDetail } from '../../../../shared/schemas/orders';

/** The order the bedside works from: the one cached order (src/lib/queries/orders.ts). */
export type SessionOrder = OrderDetail;
