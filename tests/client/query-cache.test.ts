import { MutationObserver, QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import type { OrderDetail } from '../../shared/schemas/orders';
import { deviationQueries } from '../../src/features/deviations/api/deviation-queries';
import { doseCheckQueries } from '../../src/features/dose-checks/api/dose-check-queries';
import { doseRecordQueries } from '../../src/features/dose-records/api/dose-record-queries';
import { orderQueries } from '../../src/features/orders/api/order-queries';
import { signOrderMutation } from '../../src/features/orders/hooks/use-sign-order';
import { patientQueries } from '../../src/features/patients/api/patient-queries';
import { protocolQueries } from '../../src/features/protocols/api/protocol-queries';
import { stepClockQueries } from '../../src/features/step-clock/api/step-clock-queries';
import { todayQueries } from '../../src/features/today/api/today-queries';
import { trendQueries } from '../../src/features/trends/api/trend-queries';
import { orderKeys } from '../../src/lib/queries/orders';
import { patientKeys } from '../../src/lib/queries/patients';
import { protocolKeys } from '../../src/lib/queries/protocols';
import { sessionKeys } from '../../src/lib/queries/sessions';
import { todayKeys } from '../../src/lib/queries/today';

// One client cache per resource: every screen reads an order, a session, Today or a protocol under
// one key, and a change made on one screen invalidates that key. Ids and orders are made up.

const same = (keys: readonly (readonly unknown[])[]) =>
  new Set(keys.map((key) => JSON.stringify(key))).size;

describe('one cache per resource', () => {
  it('every feature reads an order, its session, Today and a protocol under the same key', () => {
    expect(
      same([
        orderQueries.detail(5).queryKey,
        doseCheckQueries.order(5).queryKey,
        stepClockQueries.order(5).queryKey,
        deviationQueries.order(5).queryKey,
        doseRecordQueries.order(5).queryKey,
      ]),
    ).toBe(1);
    expect(
      same([
        orderQueries.session(5).queryKey,
        stepClockQueries.session(5).queryKey,
        doseRecordQueries.session(5).queryKey,
      ]),
    ).toBe(1);
    expect(same([todayQueries.worklists().queryKey, doseCheckQueries.worklists().queryKey])).toBe(
      1,
    );
    expect(
      same([
        protocolQueries.list().queryKey,
        orderQueries.protocolChoices().queryKey,
        deviationQueries.protocolChoices().queryKey,
        doseRecordQueries.protocolChoices().queryKey,
        trendQueries.protocolChoices().queryKey,
      ]),
    ).toBe(1);
    expect(
      same([
        protocolQueries.version({ key: 'pdt-half-dose', version: 2 }).queryKey,
        orderQueries.protocolDefinition('pdt-half-dose', 2).queryKey,
        doseCheckQueries.protocolDrug('pdt-half-dose', 2).queryKey,
        stepClockQueries.protocol('pdt-half-dose', 2).queryKey,
        deviationQueries.protocolSteps('pdt-half-dose', 2).queryKey,
        doseRecordQueries.protocolSteps('pdt-half-dose', 2).queryKey,
      ]),
    ).toBe(1);
    expect(same([patientQueries.history(9).queryKey, orderQueries.patient(9).queryKey])).toBe(1);
    expect(
      same([patientQueries.search('ab').queryKey, orderQueries.patientChoices('ab').queryKey]),
    ).toBe(1);
  });

  it('different orders, versions and sessions are different keys', () => {
    expect(same([orderKeys.detail(5), orderKeys.detail(6)])).toBe(2);
    expect(same([sessionKeys.detail(5), orderKeys.detail(5)])).toBe(2);
    expect(
      same([
        protocolKeys.version({ key: 'a', version: 1 }),
        protocolKeys.version({ key: 'a', version: 2 }),
      ]),
    ).toBe(2);
  });
});

describe('signing an order', () => {
  const draft = {
    id: 5,
    status: 'draft',
    version: 3,
    patient: { id: 9 },
    previousRevisionId: 4,
  } as unknown as OrderDetail;
  const signed = { ...draft, status: 'signed', version: 4 } as OrderDetail;

  async function sign() {
    const queryClient = new QueryClient();
    queryClient.setQueryData(orderKeys.detail(5), draft);
    queryClient.setQueryData(orderKeys.detail(4), { ...draft, id: 4, status: 'signed' });
    queryClient.setQueryData(orderKeys.detail(7), { ...draft, id: 7 });
    queryClient.setQueryData(orderKeys.list({ page: 1, pageSize: 20 } as never), { orders: [] });
    queryClient.setQueryData(todayKeys.all(), { lists: [], clockOffsetMs: 0 });
    queryClient.setQueryData(sessionKeys.detail(5), { orderId: 5 });
    queryClient.setQueryData(patientKeys.detail(9), { patient: { id: 9 } });
    queryClient.setQueryData(patientKeys.detail(10), { patient: { id: 10 } });
    queryClient.setQueryData(protocolKeys.lists(), []);
    const mutation = new MutationObserver(queryClient, {
      ...signOrderMutation(queryClient),
      // The server's answer, without a network: what is tested is what the cache does with it.
      mutationFn: async (_request: { id: number; password: string; version: number }) => signed,
    });
    await mutation.mutate({ id: 5, password: 'x', version: 3 });
    const invalidated = (key: readonly unknown[]) =>
      queryClient.getQueryState(key)?.isInvalidated ?? false;
    return { queryClient, invalidated };
  }

  it('puts the signed order in its one key and invalidates Today, the lists, its session and the patient', async () => {
    const { queryClient, invalidated } = await sign();
    expect(queryClient.getQueryData<OrderDetail>(orderKeys.detail(5))?.status).toBe('signed');
    expect(invalidated(todayKeys.all())).toBe(true);
    expect(invalidated(orderKeys.list({ page: 1, pageSize: 20 } as never))).toBe(true);
    expect(invalidated(sessionKeys.detail(5))).toBe(true);
    expect(invalidated(patientKeys.detail(9))).toBe(true);
  });

  it('invalidates the revision it supersedes, and nothing unrelated', async () => {
    const { invalidated } = await sign();
    expect(invalidated(orderKeys.detail(4))).toBe(true);
    expect(invalidated(orderKeys.detail(7))).toBe(false);
    expect(invalidated(patientKeys.detail(10))).toBe(false);
    expect(invalidated(protocolKeys.lists())).toBe(false);
  });
});
