import { useQuery } from '@tanstack/react-query';
import { deviationSeverities, deviationTypes } from '../../../../shared/session/session-events';
import { Button } from '../../../components/ui/button';
import { DateRangeFields } from '../../../components/ui/date-range-fields';
import { ProtocolVersionFields } from '../../../components/ui/protocol-version-fields';
import { deviationQueries } from '../api/deviation-queries';
import type { DeviationListParams, StatusChoice } from '../hooks/use-deviation-list-params';
import { deviationTypeWords, severityWords } from './deviation-words';
import { SelectField } from '../../../components/ui/select-field';
import { StaffField } from '../../../components/ui/staff-field';

type DeviationFiltersProps = {
  params: DeviationListParams;
  filtered: boolean;
  /** Problems the server found with the filter (a 400's `fields`), by parameter name. */
  fieldErrors: Record<string, string>;
  onChange: (changes: Partial<DeviationListParams>) => void;
};

/** Filters act at once; the address keeps them. */
export function DeviationFilters({
  params,
  filtered,
  fieldErrors,
  onChange,
}: DeviationFiltersProps) {
  const protocols = useQuery(deviationQueries.protocolChoices());

  return (
    <form
      aria-label="Filter the deviations"
      onSubmit={(event) => event.preventDefault()}
      className="mb-4 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4 print:hidden"
    >
      <DateRangeFields
        fromLabel="Detected from"
        toLabel="Detected to"
        from={params.from}
        to={params.to}
        errors={fieldErrors}
        onChange={onChange}
      />
      <ProtocolVersionFields
        choices={protocols.data}
        loadFailed={protocols.isError}
        protocol={params.protocol}
        version={params.version}
        errors={fieldErrors}
        onChange={onChange}
      />
      <SelectField
        label="Deviation type"
        value={params.type ?? ''}
        error={fieldErrors.type}
        onChange={(e) =>
          onChange({ type: (e.target.value || undefined) as DeviationListParams['type'] })
        }
      >
        <option value="">Any type</option>
        {deviationTypes.map((type) => (
          <option key={type} value={type}>
            {deviationTypeWords[type]}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Severity"
        value={params.severity ?? ''}
        error={fieldErrors.severity}
        onChange={(e) =>
          onChange({ severity: (e.target.value || undefined) as DeviationListParams['severity'] })
        }
      >
        <option value="">Any severity</option>
        {deviationSeverities.map((severity) => (
          <option key={severity} value={severity}>
            {severityWords[severity]}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Review status"
        value={params.status}
        error={fieldErrors.status}
        onChange={(e) => onChange({ status: e.target.value as StatusChoice })}
      >
        <option value="open">Open</option>
        <option value="closed">Closed</option>
        <option value="any">Open or closed</option>
      </SelectField>
      <StaffField
        value={params.staff}
        error={fieldErrors.staff}
        onChange={(staff) => onChange({ staff })}
      />
      <div className="flex items-end sm:col-span-2 lg:col-span-4">
        <Button
          variant="secondary"
          disabled={!filtered}
          onClick={() =>
            onChange({
              from: undefined,
              to: undefined,
              protocol: undefined,
              version: undefined,
              type: undefined,
              severity: undefined,
              staff: undefined,
              status: 'open',
            })
          }
        >
          Clear filters
        </Button>
      </div>
    </form>
  );
}
