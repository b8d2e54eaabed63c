import { useId, type ReactNode, type Ref, type SelectHTMLAttributes } from 'react';
import { FieldError } from './text-field';

type SelectFieldProps = Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> & {
  label: ReactNode;
  hint?: string;
  error?: string;
  children: ReactNode;
  ref?: Ref<HTMLSelectElement>;
};

/** A labelled drop-down whose hint and error are tied to it, like the shared text field. */
export function SelectField({
  label,
  hint,
  error,
  className = '',
  children,
  ref,
  ...rest
}: SelectFieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  return (
    <div className={`flex flex-col gap-1.5 ${className}`}>
      <label htmlFor={id} className="font-medium text-paper-900">
        {label}
      </label>
      {hint && (
        <p id={hintId} className="text-sm text-paper-600">
          {hint}
        </p>
      )}
      <select
        id={id}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={[hintId, errorId].filter(Boolean).join(' ') || undefined}
        className={`min-h-tap w-full rounded-lg border bg-white px-3 py-2 text-base text-paper-950 ${error ? 'border-2 border-alarm-700' : 'border-paper-500'}`}
        {...rest}
      >
        {children}
      </select>
      <FieldError id={errorId} message={error} />
    </div>
  );
}
