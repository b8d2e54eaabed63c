import { useId, type InputHTMLAttributes, type Ref } from 'react';

type CheckboxProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'type' | 'id'> & {
  label: string;
  description?: string;
  ref?: Ref<HTMLInputElement>;
};

/** A checkbox whose whole row is the tap target, large enough for a finger on a tablet. */
export function Checkbox({
  label,
  description,
  className = '',
  ref,
  ...inputProps
}: CheckboxProps) {
  const id = useId();
  const descriptionId = description ? `${id}-description` : undefined;
  return (
    <div className={`flex items-start gap-3 rounded-lg px-2 py-2 hover:bg-paper-100 ${className}`}>
      <input
        id={id}
        ref={ref}
        type="checkbox"
        aria-describedby={descriptionId}
        className="mt-0.5 size-5 shrink-0 cursor-pointer accent-iris-700"
        {...inputProps}
      />
      <div className="min-w-0">
        {/* The label holds only the name, so the accessible name stays short ("Nurse"); the
            description is read after it through aria-describedby. */}
        <label htmlFor={id} className="cursor-pointer font-medium text-paper-900">
          {label}
        </label>
        {description && (
          <p id={descriptionId} className="text-sm text-paper-600">
            {description}
          </p>
        )}
      </div>
    </div>
  );
}
