import { useQuery } from '@tanstack/react-query';
import type { DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { Button } from '../../../components/ui/button';
import { DateRangeFields } from '../../../components/ui/date-range-fields';
import { ProtocolVersionFields } from '../../../components/ui/protocol-version-fields';
import { doseRecordQueries } from '../api/dose-record-queries';
import { outcomeWords } from './dose-record-words';
import { SelectField } from '../../../components/ui/select-field';
import { StaffField } from '../../../components/ui/staff-field';

type DoseRecordFiltersProps = {
  filter: DoseRecordFilter;
  filtered: boolean;
  fieldErrors: Record<string, string>;
  onChange: (changes: Partial<DoseRecordFilter>) => void;
};

/** Filters act at once; the address keeps them. */
export function DoseRecordFilters({
  filter,
  filtered,
  fieldErrors,
  onChange,
}: DoseRecordFiltersProps) {
  const protocols = useQuery(doseRecordQueries.protocolChoices());
  return (
    <form
      aria-label="Filter the dose records"
      onSubmit={(event) => event.preventDefault()}
      className="mb-4 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4"
    >
      <DateRangeFields
        fromLabel="Ended from"
        toLabel="Ended to"
        from={filter.from}
        to={filter.to}
        errors={fieldErrors}
        onChange={onChange}
      />
      <ProtocolVersionFields
        choices={protocols.data}
        loadFailed={protocols.isError}
        protocol={filter.protocol}
        version={filter.version}
        errors={fieldErrors}
        onChange={onChange}
      />
      <SelectField
        label="Outcome"
        value={filter.outcome ?? ''}
        error={fieldErrors.outcome}
        onChange={(e) =>
          onChange({ outcome: (e.target.value || undefined) as DoseRecordFilter['outcome'] })
        }
      >
        <option value="">Completed or stopped</option>
        <option value="completed">{outcomeWords.completed}</option>
        <option value="stopped">{outcomeWords.stopped}</option>
      </SelectField>
      <StaffField
        value={filter.staff}
        error={fieldErrors.staff}
        onChange={(staff) => onChange({ staff })}
      />
      <div className="flex items-end sm:col-span-2">
        <Button
          variant="secondary"
          disabled={!filtered}
          onClick={() =>
            onChange({
              from: undefined,
              to: undefined,
              protocol: undefined,
              version: undefined,
              outcome: undefined,
              staff: undefined,
            })
          }
        >
          Clear filters
        </Button>
      </div>
    </form>
  );
}
