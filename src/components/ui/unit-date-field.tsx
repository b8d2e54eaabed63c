import { useState } from 'react';
import { unitDatePattern, formatCalendarDate, parseUnitDate } from '../../lib/unit-times';
import { TextField } from './text-field';

type UnitDateFieldProps = {
  label: string;
  hint?: string;
  /** The date as YYYY-MM-DD, or undefined when empty. */
  value: string | undefined;
  error?: string;
  onChange: (isoDate: string | undefined) => void;
};

/**
 * A date typed and shown in the unit's order (day/month/year for the demo unit's en-GB), not in
 * the browser's own locale as a native date input would. It hands on YYYY-MM-DD once the text is a
 * real date, and says how to write it when it is not.
 */
export function UnitDateField({ label, hint, value, error, onChange }: UnitDateFieldProps) {
  const pattern = unitDatePattern();
  const [text, setText] = useState(value ? formatCalendarDate(value) : '');
  const [shown, setShown] = useState(value);
  const [unreadable, setUnreadable] = useState(false);
  const [left, setLeft] = useState(false);
  // A value changed from outside (a cleared filter, a link) replaces what is typed.
  if (value !== shown) {
    setShown(value);
    setText(value ? formatCalendarDate(value) : '');
    setUnreadable(false);
  }
  return (
    <TextField
      label={label}
      hint={hint ?? `Day, month and year: ${pattern}`}
      placeholder={pattern}
      inputMode="numeric"
      autoComplete="off"
      spellCheck={false}
      value={text}
      error={unreadable && left ? `Write the date as ${pattern}.` : error}
      onBlur={() => setLeft(true)}
      onFocus={() => setLeft(false)}
      onChange={(event) => {
        const typed = event.target.value;
        setText(typed);
        if (typed.trim() === '') {
          setUnreadable(false);
          setShown(undefined);
          if (value !== undefined) onChange(undefined);
          return;
        }
        const iso = parseUnitDate(typed);
        setUnreadable(iso === null);
        if (iso !== null && iso !== value) {
          setShown(iso);
          onChange(iso);
        }
      }}
    />
  );
}
