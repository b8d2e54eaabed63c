import { useId } from 'react';
import { useQuery } from '@tanstack/react-query';
import { staffQuery } from '../../lib/queries/people';
import { roleLabels } from '../../../shared/roles';

type StaffFieldProps = {
  /** "Staff member" and the sessions hint unless said. */
  label?: string;
  hint?: string;
  value: number | undefined;
  error?: string;
  onChange: (staff: number | undefined) => void;
};

/**
 * The auditor's staff filter: a person chosen by name (from `GET /api/staff`, which auditors may
 * read). Used by the deviations queue and the dose records, so it lives with the shared controls.
 */
export function StaffField({
  label = 'Staff member',
  hint = 'Sessions this person ordered, checked, prepared or ran.',
  value,
  error,
  onChange,
}: StaffFieldProps) {
  const staff = useQuery(staffQuery());
  const id = useId();
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="font-medium text-paper-900">
        {label}
      </label>
      <p id={`${id}-hint`} className="text-sm text-paper-600">
        {hint}
      </p>
      <select
        id={id}
        aria-describedby={`${id}-hint${error || staff.isError ? ` ${id}-error` : ''}`}
        aria-invalid={error ? true : undefined}
        value={value === undefined ? '' : String(value)}
        onChange={(event) =>
          onChange(event.target.value === '' ? undefined : Number(event.target.value))
        }
        className={`min-h-tap w-full rounded-lg border bg-white px-3 py-2 text-base text-paper-950 ${error ? 'border-2 border-alarm-700' : 'border-paper-500'}`}
      >
        <option value="">Anyone</option>
        {staff.data?.staff.map((person) => (
          <option key={person.id} value={person.id}>
            {person.displayName} — {person.roles.map((r) => roleLabels[r]).join(', ')}
            {person.active ? '' : ' (deactivated)'}
          </option>
        ))}
        {value !== undefined && staff.data && !staff.data.staff.some((p) => p.id === value) ? (
          <option value={value}>Person {value}</option>
        ) : null}
      </select>
      {error || staff.isError ? (
        <p id={`${id}-error`} className="text-sm font-medium text-alarm-700">
          {error ?? 'The staff list could not be loaded; try again in a moment.'}
        </p>
      ) : null}
    </div>
  );
}
