import { useState } from 'react';
import { TextField } from '../../../components/ui/text-field';
import { monthPattern } from '../hooks/use-trend-params';

type MonthFieldProps = {
  label: string;
  value: string | undefined;
  min?: string;
  max?: string;
  error?: string;
  onChange: (month: string | undefined) => void;
};

/**
 * A month picker (YYYY-MM). Browsers without one show a text box, so what is typed is checked
 * before it becomes a filter, and a half-typed month waits instead of being dropped.
 */
export function MonthField({ label, value, min, max, error, onChange }: MonthFieldProps) {
  const [text, setText] = useState(value ?? '');
  const [problem, setProblem] = useState<string | undefined>();

  // A new value from outside (a reset filter, a link) replaces what is typed.
  const [shownValue, setShownValue] = useState(value);
  if (shownValue !== value) {
    setShownValue(value);
    setText(value ?? '');
    setProblem(undefined);
  }

  return (
    <TextField
      label={label}
      type="month"
      hint="Year and month, e.g. 2026-03."
      placeholder="YYYY-MM"
      value={text}
      min={min}
      max={max}
      error={problem ?? error}
      onChange={(event) => {
        const next = event.target.value.trim();
        setText(event.target.value);
        if (next === '') {
          setProblem(undefined);
          onChange(undefined);
        } else if (monthPattern.test(next)) {
          setProblem(undefined);
          onChange(next);
        } else {
          setProblem('Give a year and month as YYYY-MM, e.g. 2026-03.');
        }
      }}
    />
  );
}
