import { useEffect, useState } from 'react';
import { auditFilterSchema } from '../../../../shared/schemas/reviews';
import { TextField } from '../../../components/ui/text-field';

type StaffIdFieldProps = { value: number | undefined; error?: string; onChange: (staff: number | undefined) => void };

/**
 * The staff filter by person id: the people list is for administrators only, so names cannot be
 * offered here. The typed text is checked by the API's own rule before it becomes a filter.
 */
export function StaffIdField({ value, error, onChange }: StaffIdFieldProps) {
  const [text, setText] = useState(value === undefined ? '' : String(value));
  const [problem, setProblem] = useState<string | undefined>();

  // Follow the address when it changes from outside (clear filters, the back button).
  useEffect(() => {
    setText((current) => (/^\d+$/.test(current.trim()) && Number(current.trim()) === value ? current : value === undefined ? '' : String(value)));
    setProblem(undefined);
  }, [value]);

  return (
    <TextField
      label="Staff member (person id)"
      hint="Sessions this person ordered, checked, prepared or ran."
      inputMode="numeric"
      autoComplete="off"
      value={text}
      error={problem ?? error}
      onChange={(event) => {
        const next = event.target.value;
        setText(next);
        if (next.trim() === '') {
          setProblem(undefined);
          onChange(undefined);
          return;
        }
        const parsed = auditFilterSchema.shape.staff.safeParse(next.trim());
        if (parsed.success && parsed.data !== undefined && /^\d+$/.test(next.trim())) {
          setProblem(undefined);
          if (parsed.data !== value) onChange(parsed.data);
        } else {
          setProblem('Staff must be a person id: a whole number from 1.');
        }
      }}
    />
  );
}
