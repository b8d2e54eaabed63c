import { UnitDateField } from './unit-date-field';

type DateRange = { from?: string; to?: string };

type DateRangeFieldsProps = {
  fromLabel: string;
  toLabel: string;
  from: string | undefined;
  to: string | undefined;
  /** Problems the server found with either date, by parameter name. */
  errors: Partial<Record<keyof DateRange, string>>;
  onChange: (changes: DateRange) => void;
};

/**
 * A from/to pair of date inputs for a list filter. A reversed range is said at once, on the
 * "from" date, because the server would simply return nothing. Both fields are returned
 * without a wrapper so they sit in the filter form's own grid.
 */
export function DateRangeFields({
  fromLabel,
  toLabel,
  from,
  to,
  errors,
  onChange,
}: DateRangeFieldsProps) {
  const rangeError =
    from && to && from > to
      ? 'The “from” date is after the “to” date, so nothing can match.'
      : undefined;
  return (
    <>
      <UnitDateField
        label={fromLabel}
        value={from}
        error={rangeError ?? errors.from}
        onChange={(date) => onChange({ from: date })}
      />
      <UnitDateField
        label={toLabel}
        value={to}
        error={errors.to}
        onChange={(date) => onChange({ to: date })}
      />
    </>
  );
}
