import type { OrderStatus } from '../../../shared/schemas/orders';
import {
  ArchiveBoxIcon,
  CheckCircleIcon,
  CrossCircleIcon,
  DraftCircleIcon,
  SignatureIcon,
  StatusCheckedIcon,
  StatusCompletedIcon,
  StatusInSessionIcon,
  StatusPreparedIcon,
  StatusReturnedIcon,
  StatusStoppedIcon,
  SwapIcon,
} from './icons-first';

/**
 * How an order's status looks beside its word, so the label and the badge agree without colour
 * being the only cue: an unsigned or replaced order gets a dashed outline.
 */
export type OrderStatusTone =
  | 'unsigned'
  | 'waiting'
  | 'sent-back'
  | 'ready'
  | 'running'
  | 'done'
  | 'stopped'
  | 'filed'
  | 'replaced';

export type OrderStatusEntry = {
  /** The status's name: lists, badges, the patient's history, the status filter. */
  short: string;
  /** The name with what the order waits for, for the pharmacist's screens. */
  long: string;
  /** What the status means for the next person, in one sentence. */
  meaning: string;
  Icon: typeof CheckCircleIcon;
  tone: OrderStatusTone;
};

/**
 * What each order status is called and means: the one table every screen reads. The statuses,
 * their moves and their groups live in shared/orders/lifecycle.ts; this is only the wording.
 */
export const orderStatusTable: Readonly<Record<OrderStatus, OrderStatusEntry>> = {
  draft: {
    short: 'Draft',
    long: 'Draft',
    meaning: 'Not signed yet; it can still be edited.',
    Icon: DraftCircleIcon,
    tone: 'unsigned',
  },
  signed: {
    short: 'Signed',
    long: 'Signed, waiting for dose check',
    meaning: 'Signed by the clinician; waits for the pharmacist’s independent dose check.',
    Icon: SignatureIcon,
    tone: 'waiting',
  },
  returned: {
    short: 'Sent back',
    long: 'Sent back to the clinician',
    meaning:
      'Sent back by the pharmacist after the dose check twice disagreed; amend it or leave it.',
    Icon: StatusReturnedIcon,
    tone: 'sent-back',
  },
  checked: {
    short: 'Dose checked',
    long: 'Dose checked, waiting for preparation',
    meaning: 'The pharmacist’s own figures matched the plan; waits for preparation.',
    Icon: StatusCheckedIcon,
    tone: 'waiting',
  },
  prepared: {
    short: 'Prepared',
    long: 'Prepared',
    meaning: 'The drug is made up; the beyond-use time runs.',
    Icon: StatusPreparedIcon,
    tone: 'waiting',
  },
  ready: {
    short: 'Ready',
    long: 'Ready for treatment',
    meaning: 'Ready for the session.',
    Icon: CheckCircleIcon,
    tone: 'ready',
  },
  'in-session': {
    short: 'In session',
    long: 'In session',
    meaning: 'The session is running on the step clock.',
    Icon: StatusInSessionIcon,
    tone: 'running',
  },
  completed: {
    short: 'Completed',
    long: 'Completed',
    meaning: 'The treatment was given.',
    Icon: StatusCompletedIcon,
    tone: 'done',
  },
  stopped: {
    short: 'Stopped early',
    long: 'Stopped early',
    meaning: 'The session was stopped before the end.',
    Icon: StatusStoppedIcon,
    tone: 'stopped',
  },
  reviewed: {
    short: 'Reviewed',
    long: 'Reviewed',
    meaning: 'Reviewed by the auditor.',
    Icon: ArchiveBoxIcon,
    tone: 'filed',
  },
  superseded: {
    short: 'Replaced by an amendment',
    long: 'Replaced by an amendment',
    meaning: 'A later revision replaced this one; it is kept for the record.',
    Icon: SwapIcon,
    tone: 'replaced',
  },
  cancelled: {
    short: 'Cancelled',
    long: 'Cancelled before the session',
    meaning:
      'Cancelled before its session, with a reason; it is kept for the record and on no worklist.',
    Icon: CrossCircleIcon,
    tone: 'replaced',
  },
};

/** "short" names the status (lists, badges, Today); "long" adds what the order waits for (pharmacy). */
export type OrderStatusWording = 'long' | 'short';

export function orderStatusWords(
  status: OrderStatus,
  wording: OrderStatusWording = 'short',
): string {
  return orderStatusTable[status][wording];
}

export function orderStatusMeaning(status: OrderStatus): string {
  return orderStatusTable[status].meaning;
}

/** An unsigned or replaced order is drawn with a dashed outline: it is not (or no longer) a treatment on its way. */
export function hasDashedOutline(status: OrderStatus): boolean {
  const { tone } = orderStatusTable[status];
  return tone === 'unsigned' || tone === 'replaced';
}
