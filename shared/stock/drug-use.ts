/**
 * How a preparation counts in the monthly drug report. Given: its order's session started and it
 * was the order's last preparation (the one infused). Never infused: made up, then replaced by a
 * later preparation (past its beyond-use time) or the order was cancelled or replaced. Pending:
 * the order may still be treated.
 */
export type PreparationUse = 'given' | 'never-infused' | 'pending';

const started = ['in-session', 'completed', 'stopped', 'reviewed'];
const ended = ['cancelled', 'superseded'];

export function preparationUse(facts: { isLatest: boolean; orderStatus: string }): PreparationUse {
  if (!facts.isLatest) return 'never-infused';
  if (started.includes(facts.orderStatus)) return 'given';
  if (ended.includes(facts.orderStatus)) return 'never-infused';
  return 'pending';
}

export interface MonthUse {
  month: string;
  vialsIssued: number;
  givenMg: number;
  discardedMg: number;
  givenPct: number | null;
  discardedPct: number | null;
  preparedNeverInfused: number;
}

/**
 * One month's figures from its preparations. Discarded drug is what the pharmacist recorded as
 * discarded plus every dose made up and never infused; the percentages are of given + discarded.
 */
export function monthUse(
  month: string,
  preparations: readonly {
    use: PreparationUse;
    doseMg: number;
    discardedMg: number;
    vialsIssued: number;
  }[],
): MonthUse {
  let givenMg = 0;
  let discardedMg = 0;
  let vialsIssued = 0;
  let preparedNeverInfused = 0;
  for (const p of preparations) {
    vialsIssued += p.vialsIssued;
    discardedMg += p.discardedMg;
    if (p.use === 'given') givenMg += p.doseMg;
    if (p.use === 'never-infused') {
      discardedMg += p.doseMg;
      preparedNeverInfused += 1;
    }
  }
  const total = givenMg + discardedMg;
  const pct = (part: number) => (total > 0 ? Number(((part / total) * 100).toFixed(1)) : null);
  return {
    month,
    vialsIssued,
    givenMg: Number(givenMg.toFixed(2)),
    discardedMg: Number(discardedMg.toFixed(2)),
    givenPct: pct(givenMg),
    discardedPct: pct(discardedMg),
    preparedNeverInfused,
  };
}
