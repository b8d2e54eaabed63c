import { useState, type InputHTMLAttributes } from 'react';
import { TextField } from '../../../components/ui/text-field';

type CheckedTextFieldProps = Omit<
  InputHTMLAttributes<HTMLInputElement>,
  'value' | 'onChange' | 'id'
> & {
  label: string;
  hint?: string;
  value: string | undefined;
  /** The API's own rule for the value; text it would refuse stays in the box, marked, and is not sent. */
  check: (text: string) => string | null;
  error?: string;
  onChange: (value: string | undefined) => void;
};

/** A text filter that becomes part of the query only once it is valid. */
export function CheckedTextField({
  value,
  check,
  error,
  onChange,
  ...rest
}: CheckedTextFieldProps) {
  const [text, setText] = useState(value ?? '');
  const [problem, setProblem] = useState<string | null>(null);

  // A new value from outside (a reset filter, a link) replaces what is typed.
  const [shownValue, setShownValue] = useState(value);
  if (shownValue !== value) {
    setShownValue(value);
    setText(value ?? '');
    setProblem(null);
  }

  return (
    <TextField
      {...rest}
      value={text}
      error={problem ?? error}
      onChange={(event) => {
        const next = event.target.value;
        setText(next);
        const trimmed = next.trim();
        if (trimmed === '') {
          setProblem(null);
          onChange(undefined);
          return;
        }
        const found = check(trimmed);
        setProblem(found);
        if (found === null && trimmed !== value) onChange(trimmed);
      }}
    />
  );
}
