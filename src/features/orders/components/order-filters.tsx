import { useQuery } from '@tanstack/react-query';
import { orderStatuses, type OrderListQuery } from '../../../../shared/schemas/orders';
import { Button } from '../../../components/ui/button';
import { UnitDateField } from '../../../components/ui/unit-date-field';
import { orderQueries } from '../api/order-queries';
import { SelectField } from '../../../components/ui/select-field';
import { orderStatusWords } from '../../../components/ui/order-status-words';

type OrderFiltersProps = {
  query: OrderListQuery;
  filtered: boolean;
  onChange: (changes: Partial<OrderListQuery>) => void;
};

/** Filters act at once; the address keeps them. */
export function OrderFilters({ query, filtered, onChange }: OrderFiltersProps) {
  const protocols = useQuery(orderQueries.protocolChoices());
  const rangeError =
    query.from && query.to && query.from > query.to
      ? 'The “from” date is after the “to” date, so no order can match.'
      : undefined;
  return (
    <form
      aria-label="Filter the orders"
      onSubmit={(event) => event.preventDefault()}
      className="mb-4 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-[repeat(4,minmax(0,1fr))_auto] lg:items-end"
    >
      <SelectField
        label="Status"
        value={query.status ?? ''}
        onChange={(e) =>
          onChange({ status: (e.target.value || undefined) as OrderListQuery['status'] })
        }
      >
        <option value="">Any status</option>
        {orderStatuses.map((status) => (
          <option key={status} value={status}>
            {orderStatusWords(status)}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Protocol"
        value={query.protocol ?? ''}
        error={protocols.isError ? 'The protocol list could not be loaded.' : undefined}
        onChange={(e) => onChange({ protocol: e.target.value || undefined })}
      >
        <option value="">Any protocol</option>
        {(protocols.data ?? []).map((p) => (
          <option key={p.key} value={p.key}>
            {p.title}
          </option>
        ))}
        {query.protocol && !protocols.data?.some((p) => p.key === query.protocol) && (
          <option value={query.protocol}>{query.protocol}</option>
        )}
      </SelectField>
      <UnitDateField
        label="Created from"
        value={query.from}
        onChange={(from) => onChange({ from })}
        error={rangeError}
      />
      <UnitDateField label="Created to" value={query.to} onChange={(to) => onChange({ to })} />
      <Button
        variant="secondary"
        disabled={!filtered}
        onClick={() =>
          onChange({ status: undefined, protocol: undefined, from: undefined, to: undefined })
        }
      >
        Clear filters
      </Button>
    </form>
  );
}
