import { useId, type Ref, type TextareaHTMLAttributes } from 'react';
import { FieldError } from '../../../components/ui/text-field';

type LabelledTextareaProps = Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id'> & {
  label: string;
  hint?: string;
  error?: string;
  ref?: Ref<HTMLTextAreaElement>;
};

/** A multi-line field with its label, hint and error tied to it, like the shared text field. */
export function LabelledTextarea({
  label,
  hint,
  error,
  className = '',
  ref,
  ...rest
}: LabelledTextareaProps) {
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
      <textarea
        id={id}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={[hintId, errorId].filter(Boolean).join(' ') || undefined}
        className={`w-full rounded-lg border bg-white px-3 py-2 text-paper-950 ${error ? 'border-2 border-alarm-700' : 'border-paper-500'} ${className}`}
        {...rest}
      />
      <FieldError id={errorId} message={error} />
    </div>
  );
}
