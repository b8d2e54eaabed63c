import { useId, type ReactNode } from 'react';
import type { UseFormRegisterReturn } from 'react-hook-form';
import { FieldError } from '../../../components/ui/text-field';

type MeasureFieldProps = {
  label: string;
  hint?: string;
  error?: string;
  value: UseFormRegisterReturn;
  /** The unit chooser, when the measurement can be typed in more than one unit. */
  unit?: { registration: UseFormRegisterReturn; options: readonly string[] };
  /** A fixed unit shown after the box. */
  fixedUnit?: ReactNode;
};

/** A measurement box with its unit beside it; label, range hint and error are tied to the box. */
export function MeasureField({ label, hint, error, value, unit, fixedUnit }: MeasureFieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="font-medium text-paper-900">
        {label}
      </label>
      {hint && (
        <p id={hintId} className="text-sm text-paper-600">
          {hint}
        </p>
      )}
      <div className="flex items-center gap-2">
        <input
          id={id}
          inputMode="decimal"
          autoComplete="off"
          aria-invalid={error ? true : undefined}
          aria-describedby={[hintId, errorId].filter(Boolean).join(' ') || undefined}
          className={`min-h-tap w-full min-w-0 flex-1 rounded-lg border bg-white px-3 py-2 text-base text-paper-950 ${error ? 'border-2 border-alarm-700' : 'border-paper-500'}`}
          {...value}
        />
        {unit && (
          <>
            <label htmlFor={`${id}-unit`} className="sr-only">
              {label} unit
            </label>
            <select
              id={`${id}-unit`}
              className="min-h-tap w-24 shrink-0 rounded-lg border border-paper-500 bg-white px-2 py-2 text-base text-paper-950"
              {...unit.registration}
            >
              {unit.options.map((option) => (
                <option key={option} value={option}>
                  {option}
                </option>
              ))}
            </select>
          </>
        )}
        {fixedUnit && <span className="shrink-0 text-paper-800">{fixedUnit}</span>}
      </div>
      <FieldError id={errorId} message={error} />
    </div>
  );
}
