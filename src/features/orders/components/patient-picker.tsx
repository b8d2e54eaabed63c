import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState, type Ref } from 'react';
import type { Patient } from '../../../../shared/schemas/patients';
import { Button } from '../../../components/ui/button';
import { PatientCardIcon, SpinnerIcon } from '../../../components/ui/icons';
import { FieldError, TextField } from '../../../components/ui/text-field';
import { describeError } from '../../../lib/api-client';
import { useDebouncedValue } from '../../../lib/use-debounced-value';
import { orderQueries } from '../api/order-queries';
import { formatCalendarDate } from '../../../lib/unit-times';

type PatientPickerProps = {
  /** The chosen patient's id as text, or '' for none. */
  value: string;
  onChange: (patientId: string) => void;
  /** An amendment keeps its patient. */
  locked: boolean;
  error?: string;
  ref?: Ref<HTMLElement>;
};

function PatientLine({ patient }: { patient: Patient }) {
  return (
    <>
      <span className="font-semibold text-paper-950">
        {patient.familyName}, {patient.givenName}
      </span>
      <span className="text-paper-700">
        {' '}
        · {patient.recordNumber} · born {formatCalendarDate(patient.dateOfBirth)}
      </span>
    </>
  );
}

/** The chosen patient, or a search that lists matching patients to choose from. */
export function PatientPicker({ value, onChange, locked, error, ref }: PatientPickerProps) {
  const id = useId();
  const chosenId = /^\d+$/.test(value) ? Number(value) : null;
  const chosen = useQuery({ ...orderQueries.patient(chosenId ?? 0), enabled: chosenId !== null });
  const [text, setText] = useState('');
  const settled = useDebouncedValue(text.trim(), 300);
  const matches = useQuery({
    ...orderQueries.patientChoices(settled),
    enabled: chosenId === null && settled.length > 0,
  });
  const errorId = error ? `${id}-error` : undefined;
  // After a choice, focus goes to the chosen patient's card, not back to the top of the page.
  const focusAfterChoice = useRef(false);
  const changeButton = useRef<HTMLButtonElement | null>(null);
  useEffect(() => {
    if (chosenId !== null && focusAfterChoice.current) {
      focusAfterChoice.current = false;
      changeButton.current?.focus();
    }
  }, [chosenId]);

  if (chosenId !== null) {
    return (
      <section aria-labelledby={`${id}-heading`} className="flex flex-col gap-1.5">
        <h3 id={`${id}-heading`} className="font-medium text-paper-900">
          Patient
        </h3>
        <div
          className={`flex flex-wrap items-center justify-between gap-3 rounded-lg border bg-white px-4 py-3 ${error ? 'border-2 border-alarm-700' : 'border-paper-300'}`}
          aria-describedby={errorId}
        >
          <p className="flex min-w-0 items-center gap-3">
            <PatientCardIcon className="size-6 text-paper-700" />
            {chosen.data ? (
              <span>
                <PatientLine patient={chosen.data} />
              </span>
            ) : chosen.isError ? (
              <span className="text-alarm-700">{describeError(chosen.error)}</span>
            ) : (
              <span className="flex items-center gap-2 text-paper-700">
                <SpinnerIcon className="size-4" /> Loading the patient…
              </span>
            )}
          </p>
          {!locked && (
            <Button
              variant="secondary"
              size="sm"
              ref={(element) => {
                changeButton.current = element;
                if (typeof ref === 'function') ref(element);
                else if (ref) (ref as { current: HTMLElement | null }).current = element;
              }}
              onClick={() => {
                setText('');
                onChange('');
              }}
            >
              Choose another patient
            </Button>
          )}
        </div>
        {locked && (
          <p className="text-sm text-paper-600">
            An amendment stays with the same patient. For another patient, start a new order.
          </p>
        )}
        <FieldError id={errorId} message={error} />
      </section>
    );
  }

  const results = matches.data ?? [];
  return (
    <div className="flex flex-col gap-3">
      <TextField
        ref={ref as Ref<HTMLInputElement>}
        label="Find the patient"
        hint="Type the first letters of the record number or a name, then choose the patient from the list"
        type="search"
        autoComplete="off"
        spellCheck={false}
        value={text}
        error={error}
        onChange={(event) => setText(event.target.value)}
      />
      {settled.length > 0 && (
        <div aria-live="polite">
          {matches.isPending ? (
            <p className="flex items-center gap-2 text-paper-700">
              <SpinnerIcon className="size-4" /> Looking for patients…
            </p>
          ) : matches.isError ? (
            <p className="text-alarm-700">{describeError(matches.error)}</p>
          ) : results.length === 0 ? (
            <p className="text-paper-700">No patient matches “{settled}”.</p>
          ) : (
            <div className="rounded-lg border border-paper-300 bg-white p-2">
              <p id={`${id}-matches`} className="px-1 text-sm font-medium text-paper-800">
                {results.length} matching {results.length === 1 ? 'patient' : 'patients'}: choose
                one
              </p>
              <ul aria-labelledby={`${id}-matches`} className="mt-1 max-h-64 overflow-y-auto">
                {results.map((patient) => (
                  <li key={patient.id}>
                    <button
                      type="button"
                      className="flex min-h-tap w-full items-center gap-3 rounded-md px-2 py-1.5 text-left hover:bg-paper-100"
                      onClick={() => {
                        focusAfterChoice.current = true;
                        onChange(String(patient.id));
                      }}
                    >
                      <PatientCardIcon className="size-5 text-paper-700" />
                      <span>
                        <span className="sr-only">Choose </span>
                        <PatientLine patient={patient} />
                      </span>
                    </button>
                  </li>
                ))}
              </ul>
            </div>
          )}
        </div>
      )}
    </div>
  );
}
