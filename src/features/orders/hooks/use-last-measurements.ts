import { useQuery } from '@tanstack/react-query';
import {
  lastRecordedWeight,
  weightChangeNeedingReason,
  type WeightChange,
} from '../../../../shared/orders/weight-change';
import type { PlanInputs } from '../../../../shared/schemas/calculation';
import { orderQueries } from '../api/order-queries';

/**
 * The patient's last recorded measurements and, for the weight typed now, the change that needs a
 * reason under the unit's rule: the same function the server applies when the order is signed.
 * `excludeOrderIds` leaves out the revision being amended, as the server does.
 */
export function useLastMeasurements(
  patientId: number | null,
  weight: PlanInputs['weight'],
  excludeOrderIds: readonly (number | null | undefined)[],
) {
  const query = useQuery({
    ...orderQueries.patientMeasurements(patientId ?? 0),
    enabled: patientId !== null,
  });
  const measurements = (query.data?.measurements ?? []).filter(
    (m) => !excludeOrderIds.includes(m.orderId),
  );
  const rule = query.data?.weightChangeRule ?? null;
  const weightChange: WeightChange | null = rule
    ? // Judged at the time the measurements were read, so a render never reads the clock.
      weightChangeNeedingReason(lastRecordedWeight(measurements), weight, query.dataUpdatedAt, rule)
    : null;
  return { query, measurements, rule, weightChange };
}
