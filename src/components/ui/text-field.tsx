import { useId, type InputHTMLAttributes, type Ref } from 'react';
import { AlertIcon } from './icons-start';

type TextFieldProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> & {
  label: string;
  /** A short rule or example shown under the label, always visible. */
  hint?: string;
  error?: string;
  ref?: Ref<HTMLInputElement>;
};

/**
 * A labelled input whose hint and error are tied to it with aria-describedby, so a screen
 * reader hears the rule and the problem when the field gets focus.
 */
export function TextField({
  label,
  hint,
  error,
  className = '',
  ref,
  ...inputProps
}: TextFieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;

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
      <input
        id={id}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={
          'min-h-tap w-full rounded-lg border bg-white px-3 py-2 text-base text-paper-950 ' +
          'placeholder:text-paper-600 ' +
          (error ? 'border-alarm-700 border-2' : 'border-paper-500')
        }
        {...inputProps}
      />
      <FieldError id={errorId} message={error} />
    </div>
  );
}

export function FieldError({
  id,
  message,
}: {
  id: string | undefined;
  message: string | undefined;
}) {
  if (!message) return null;
  return (
    <p id={id} className="flex items-start gap-1.5 text-sm font-medium text-alarm-700">
      <AlertIcon className="mt-px size-4" />
      <span>{message}</span>
    </p>
  );
}
