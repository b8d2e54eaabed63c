import { useState } from 'react';
import { TextField } from '../../../components/ui/text-field';
import { unitDatePattern } from '../../../lib/unit-times';
import { monthPattern } from '../hooks/use-trend-params';

type MonthFieldProps = {
  label: string;
  value: string | undefined;
  error?: string;
  onChange: (month: string | undefined) => void;
};

/** The unit's way of writing a month: its date pattern without the day ("MM/YYYY" for en-GB). */
function unitMonthPattern(): string {
  return unitDatePattern()
    .replace(/DD[^MY]*/, '')
    .replace(/[^MY]+$/, '');
}

/** YYYY-MM as the unit writes it ("03/2026"). */
function shownMonth(value: string | undefined): string {
  if (!value) return '';
  const [year, month] = value.split('-');
  return unitMonthPattern()
    .replace('YYYY', year ?? '')
    .replace('MM', month ?? '');
}

/** What was typed as YYYY-MM, in the unit's order (or as YYYY-MM), or null. */
function parseMonth(text: string): string | null {
  const trimmed = text.trim();
  if (monthPattern.test(trimmed)) return trimmed;
  const numbers = trimmed.split(/[/.\-\s]+/);
  if (numbers.length !== 2 || numbers.some((n) => !/^\d+$/.test(n))) return null;
  const order = unitMonthPattern().split(/[^MY]+/);
  const year = numbers[order.indexOf('YYYY')] ?? '';
  const month = (numbers[order.indexOf('MM')] ?? '').padStart(2, '0');
  const iso = `${year}-${month}`;
  return year.length === 4 && monthPattern.test(iso) ? iso : null;
}

/**
 * A month typed in the unit's order ("03/2026" for the demo unit), not in the browser's own
 * locale as a native month input would show it; a half-typed month waits instead of being dropped.
 */
export function MonthField({ label, value, error, onChange }: MonthFieldProps) {
  const pattern = unitMonthPattern();
  const [text, setText] = useState(shownMonth(value));
  const [problem, setProblem] = useState<string | undefined>();
  const [shown, setShown] = useState(value);
  // A month changed from outside (a cleared filter, a link) replaces what is typed.
  if (value !== shown) {
    setShown(value);
    if (parseMonth(text) !== (value ?? null)) setText(shownMonth(value));
    setProblem(undefined);
  }

  return (
    <TextField
      label={label}
      hint={`Month and year: ${pattern}, e.g. ${shownMonth('2026-03')}.`}
      placeholder={pattern}
      inputMode="numeric"
      autoComplete="off"
      value={text}
      error={problem ?? error}
      onChange={(event) => {
        const typed = event.target.value;
        setText(typed);
        const month = parseMonth(typed);
        if (typed.trim() === '') {
          setProblem(undefined);
          onChange(undefined);
        } else if (month !== null) {
          setProblem(undefined);
          onChange(month);
        } else {
          setProblem(`Give a month and year as ${pattern}, e.g. ${shownMonth('2026-03')}.`);
        }
      }}
    />
  );
}
