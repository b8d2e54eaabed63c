import { auditTrailQuerySchema, type AuditTrailQuery } from '../../../../shared/schemas/reviews';
import { Button } from '../../../components/ui/button';
import { UnitDateField } from '../../../components/ui/unit-date-field';
import { actionLabel, knownActions, recordTypes } from './audit-words';
import { CheckedTextField } from './checked-text-field';
import { SelectField } from '../../../components/ui/select-field';
import { StaffField } from '../../../components/ui/staff-field';

type AuditTrailFiltersProps = {
  query: AuditTrailQuery;
  filtered: boolean;
  fieldErrors: Record<string, string>;
  onChange: (changes: Partial<AuditTrailQuery>) => void;
};

/** Checks typed text by the API's own schema, in words a person can act on. */
function checker(key: 'entityId', message: string) {
  return (text: string) =>
    auditTrailQuerySchema.shape[key].safeParse(text).success && /^\d+$/.test(text) ? null : message;
}

export function AuditTrailFilters({
  query,
  filtered,
  fieldErrors,
  onChange,
}: AuditTrailFiltersProps) {
  const rangeError =
    query.from && query.to && query.from > query.to
      ? 'The “from” date is after the “to” date, so nothing can match.'
      : undefined;
  return (
    <form
      aria-label="Filter the audit trail"
      onSubmit={(e) => e.preventDefault()}
      className="mb-4 grid gap-4 rounded-2xl border border-paper-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4"
    >
      <UnitDateField
        label="From"
        value={query.from}
        error={rangeError ?? fieldErrors.from}
        onChange={(from) => onChange({ from })}
      />
      <UnitDateField
        label="To"
        value={query.to}
        error={fieldErrors.to}
        onChange={(to) => onChange({ to })}
      />
      <SelectField
        label="Action"
        value={query.action ?? ''}
        error={fieldErrors.action}
        onChange={(e) => onChange({ action: e.target.value || undefined })}
      >
        <option value="">Any action</option>
        {knownActions
          .map((action) => [action, actionLabel(action)] as const)
          .sort((a, b) => a[1].localeCompare(b[1]))
          .map(([action, label]) => (
            <option key={action} value={action}>
              {label}
            </option>
          ))}
        {query.action && !knownActions.includes(query.action) && (
          <option value={query.action}>{query.action}</option>
        )}
      </SelectField>
      <StaffField
        label="Done by"
        hint="What this person did, by name."
        value={query.actor}
        error={fieldErrors.actor}
        onChange={(actor) => onChange({ actor })}
      />
      <SelectField
        label="Record type"
        value={query.entityType ?? ''}
        error={fieldErrors.entityType}
        onChange={(e) => onChange({ entityType: e.target.value || undefined })}
      >
        <option value="">Any record</option>
        {Object.entries(recordTypes).map(([type, label]) => (
          <option key={type} value={type}>
            {label}
          </option>
        ))}
        {query.entityType && !(query.entityType in recordTypes) && (
          <option value={query.entityType}>{query.entityType}</option>
        )}
      </SelectField>
      <CheckedTextField
        label="Record id"
        hint="With a record type, one record’s whole history."
        inputMode="numeric"
        autoComplete="off"
        value={query.entityId}
        check={checker('entityId', 'A record id is a whole number.')}
        error={fieldErrors.entityId}
        onChange={(entityId) => onChange({ entityId })}
      />
      <SelectField
        label="Order of events"
        value={query.direction}
        onChange={(e) => onChange({ direction: e.target.value as AuditTrailQuery['direction'] })}
      >
        <option value="desc">Newest first</option>
        <option value="asc">Oldest first</option>
      </SelectField>
      <div className="flex items-end">
        <Button
          variant="secondary"
          disabled={!filtered}
          onClick={() =>
            onChange({
              from: undefined,
              to: undefined,
              action: undefined,
              actor: undefined,
              entityType: undefined,
              entityId: undefined,
            })
          }
        >
          Clear filters
        </Button>
      </div>
    </form>
  );
}
