import { useId } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';
import { roleLabels, roles } from '../../../../shared/roles';
import { Checkbox } from '../../../components/ui/checkbox';
import { FieldError } from '../../../components/ui/text-field';
import { roleDuties } from '../../../config/role-duties';

type RoleCheckboxesProps = {
  registration: UseFormRegisterReturn<'roles'>;
  error?: string;
  legend?: string;
};

/** All five roles as checkboxes in one fieldset; the form receives the checked roles as a list. */
export function RoleCheckboxes({ registration, error, legend = 'Roles' }: RoleCheckboxesProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = error ? `${id}-error` : undefined;
  return (
    <fieldset
      aria-describedby={[hintId, errorId].filter(Boolean).join(' ')}
      className="flex flex-col gap-1"
    >
      <legend className="font-medium text-paper-900">{legend}</legend>
      <p id={hintId} className="mb-1 text-sm text-paper-600">
        Choose at least one. One person may hold several roles.
      </p>
      <div
        className={`grid gap-x-4 gap-y-1 rounded-lg border p-2 sm:grid-cols-2 ${error ? 'border-2 border-alarm-700' : 'border-paper-300'}`}
      >
        {roles.map((role) => (
          <Checkbox
            key={role}
            value={role}
            label={roleLabels[role]}
            description={roleDuties[role]}
            aria-invalid={error ? true : undefined}
            {...registration}
          />
        ))}
      </div>
      <FieldError id={errorId} message={error} />
    </fieldset>
  );
}
