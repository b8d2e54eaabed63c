import { useQuery } from '@tanstack/react-query';
import type { DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
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
export function DoseRecordFilters({ filter, filtered, fieldErrors, onChange }: DoseRecordFiltersProps) {
  const protocols = useQuery(doseRecordQueries.protocolChoices());
  const chosen = protocols.data?.find((p) => p.key === filter.protocol);
  const rangeError = filter.from && filter.to && filter.from > filter.to ? 'The “from” date is after the “to” date, so nothing can match.' : undefined;
  return (
    <form aria-label="Filter the dose records" onSubmit={(event) => event.preventDefault()} className="mb-4 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4">
      <TextField label="Ended from" type="date" value={filter.from ?? ''} max={filter.to} error={rangeError ?? fieldErrors.from} onChange={(e) => onChange({ from: e.target.value || undefined })} />
      <TextField label="Ended to" type="date" value={filter.to ?? ''} min={filter.from} error={fieldErrors.to} onChange={(e) => onChange({ to: e.target.value || undefined })} />
      <SelectField
        label="Protocol"
        value={filter.protocol ?? ''}
        error={protocols.isError ? 'The protocol list could not be loaded; reload the page to try again.' : fieldErrors.protocol}
        onChange={(e) => onChange({ protocol: e.target.value || undefined })}
      >
        <option value="">Any protocol</option>
        {(protocols.data ?? []).map((p) => (
          <option key={p.key} value={p.key}>
            {p.title}
          </option>
        ))}
        {filter.protocol && !chosen && <option value={filter.protocol}>{filter.protocol}</option>}
      </SelectField>
      <SelectField
        label="Protocol version"
        hint={filter.protocol ? undefined : 'Choose a protocol first.'}
        value={filter.version === undefined ? '' : String(filter.version)}
        disabled={!filter.protocol}
        error={fieldErrors.version}
        onChange={(e) => onChange({ version: e.target.value ? Number(e.target.value) : undefined })}
      >
        <option value="">Every version</option>
        {(chosen?.versions ?? []).map((v) => (
          <option key={v.version} value={v.version}>
            Version {v.version}
          </option>
        ))}
        {filter.version !== undefined && !chosen?.versions.some((v) => v.version === filter.version) && <option value={filter.version}>Version {filter.version}</option>}
      </SelectField>
      <SelectField label="Outcome" value={filter.outcome ?? ''} error={fieldErrors.outcome} onChange={(e) => onChange({ outcome: (e.target.value || undefined) as DoseRecordFilter['outcome'] })}>
        <option value="">Completed or stopped</option>
        <option value="completed">{outcomeWords.completed}</option>
        <option value="stopped">{outcomeWords.stopped}</option>
      </SelectField>
      <StaffField value={filter.staff} error={fieldErrors.staff} onChange={(staff) => onChange({ staff })} />
      <div className="flex items-end sm:col-span-2">
        <Button variant="secondary" disabled={!filtered} onClick={() => onChange({ from: undefined, to: undefined, protocol: undefined, version: undefined, outcome: undefined, staff: undefined })}>
          Clear filters
        </Button>
      </div>
    </form>
  );
}
