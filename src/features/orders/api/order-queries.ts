import { queryOptions } from '@tanstack/react-query';
import { isSessionRunning } from '../../../../shared/orders/lifecycle';
import type { SigningFactsQuery } from '../../../../shared/schemas/orders';
import { orderKeys, orderListQuery, orderQuery } from '../../../lib/queries/orders';
import {
  patientMeasurementsQuery,
  patientQuery,
  patientSearchQuery,
} from '../../../lib/queries/patients';
import { protocolListQuery, protocolVersionQuery } from '../../../lib/queries/protocols';
import { sessionQuery } from '../../../lib/queries/sessions';
import { getSigningFacts } from './get-signing-facts';

/**
 * The orders feature's queries, composed from the one cache per resource in src/lib/queries:
 * an order here is the same cached order the pharmacist, the step clock and the reviews read.
 */
export const orderQueries = {
  all: orderKeys.all,
  lists: orderKeys.lists,
  list: orderListQuery,
  details: orderKeys.details,
  detail: orderQuery,
  /** The session's dose record and live deviations; polled while the session runs. */
  session: (id: number) =>
    queryOptions({
      ...sessionQuery(id),
      refetchInterval: (query) =>
        query.state.data && isSessionRunning(query.state.data.status) ? 10_000 : false,
    }),

  protocolChoices: protocolListQuery,
  protocolDefinition: (key: string, version: number) =>
    queryOptions({
      ...protocolVersionQuery({ key, version }),
      // An approved version never changes.
      staleTime: Infinity,
    }),
  patientChoices: patientSearchQuery,
  patient: (id: number) =>
    queryOptions({ ...patientQuery(id), select: (history) => history.patient }),
  /** The patient's other open orders and recent treatments a signature would be held to. */
  signingFacts: (query: SigningFactsQuery) =>
    queryOptions({
      queryKey: [...orderKeys.signingFacts(query.patientId), query] as const,
      queryFn: ({ signal }) => getSigningFacts(query, { signal }),
    }),
  patientMeasurements: patientMeasurementsQuery,
};
