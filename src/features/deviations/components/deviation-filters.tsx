import { useQuery } from '@tanstack/react-query';
import { deviationSeverities, deviationTypes } from '../../../../shared/session/session-events';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
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
export function DeviationFilters({ params, filtered, fieldErrors, onChange }: DeviationFiltersProps) {
  const protocols = useQuery(deviationQueries.protocolChoices());
  const chosen = protocols.data?.find((p) => p.key === params.protocol);
  const rangeError = params.from && params.to && params.from > params.to ? 'The “from” date is after the “to” date, so nothing can match.' : undefined;

  return (
    <form
      aria-label="Filter the deviations"
      onSubmit={(event) => event.preventDefault()}
      className="mb-4 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4 print:hidden"
    >
      <TextField
        label="Detected from"
        type="date"
        value={params.from ?? ''}
        max={params.to}
        error={rangeError ?? fieldErrors.from}
        onChange={(e) => onChange({ from: e.target.value || undefined })}
      />
      <TextField label="Detected to" type="date" value={params.to ?? ''} min={params.from} error={fieldErrors.to} onChange={(e) => onChange({ to: e.target.value || undefined })} />
      <SelectField
        label="Protocol"
        value={params.protocol ?? ''}
        error={protocols.isError ? 'The protocol list could not be loaded; reload the page to try again.' : fieldErrors.protocol}
        onChange={(e) => onChange({ protocol: e.target.value || undefined })}
      >
        <option value="">Any protocol</option>
        {(protocols.data ?? []).map((p) => (
          <option key={p.key} value={p.key}>
            {p.title}
          </option>
        ))}
        {params.protocol && !chosen && <option value={params.protocol}>{params.protocol}</option>}
      </SelectField>
      <SelectField
        label="Protocol version"
        hint={params.protocol ? undefined : 'Choose a protocol first.'}
        value={params.version === undefined ? '' : String(params.version)}
        disabled={!params.protocol}
        error={fieldErrors.version}
        onChange={(e) => onChange({ version: e.target.value ? Number(e.target.value) : undefined })}
      >
        <option value="">Every version</option>
        {(chosen?.versions ?? []).map((v) => (
          <option key={v.version} value={v.version}>
            Version {v.version}
          </option>
        ))}
        {params.version !== undefined && !chosen?.versions.some((v) => v.version === params.version) && <option value={params.version}>Version {params.version}</option>}
      </SelectField>
      <SelectField label="Deviation type" value={params.type ?? ''} error={fieldErrors.type} onChange={(e) => onChange({ type: (e.target.value || undefined) as DeviationListParams['type'] })}>
        <option value="">Any type</option>
        {deviationTypes.map((type) => (
          <option key={type} value={type}>
            {deviationTypeWords[type]}
          </option>
        ))}
      </SelectField>
      <SelectField label="Severity" value={params.severity ?? ''} error={fieldErrors.severity} onChange={(e) => onChange({ severity: (e.target.value || undefined) as DeviationListParams['severity'] })}>
        <option value="">Any severity</option>
        {deviationSeverities.map((severity) => (
          <option key={severity} value={severity}>
            {severityWords[severity]}
          </option>
        ))}
      </SelectField>
      <SelectField label="Review status" value={params.status} error={fieldErrors.status} onChange={(e) => onChange({ status: e.target.value as StatusChoice })}>
        <option value="open">Open</option>
        <option value="closed">Closed</option>
        <option value="any">Open or closed</option>
      </SelectField>
      <StaffField value={params.staff} error={fieldErrors.staff} onChange={(staff) => onChange({ staff })} />
      <div className="flex items-end sm:col-span-2 lg:col-span-4">
        <Button
          variant="secondary"
          disabled={!filtered}
          onClick={() => onChange({ from: undefined, to: undefined, protocol: undefined, version: undefined, type: undefined, severity: undefined, staff: undefined, status: 'open' })}
        >
          Clear filters
        </Button>
      </div>
    </form>
  );
}
