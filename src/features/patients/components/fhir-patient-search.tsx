import { useMutation } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { describeError } from '../../../lib/api-client';
import { searchFhirPatients, type FhirCandidate } from '../api/fhir-patients';
import { formatCalendarDate } from '../../../lib/unit-times';

type Props = {
  /** Fills the add-patient form from the chosen hospital record. */
  onPick: (candidate: FhirCandidate) => void;
};

/** Finds the patient in the hospital record (FHIR) by record number or name. */
export function FhirPatientSearch({ onPick }: Props) {
  const [text, setText] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const headingId = useId();
  const search = useMutation({
    mutationFn: (typed: string) =>
      searchFhirPatients(
        /^[A-Za-z]{1,4}-?\d[\dA-Za-z-]*$/.test(typed) ? { recordNumber: typed } : { name: typed },
      ),
  });
  const submit = () => {
    const typed = text.trim();
    if (typed.length < 2) {
      setProblem('Type a record number or at least two letters of a name');
      return;
    }
    setProblem(null);
    search.mutate(typed);
  };
  const found = search.data?.patients ?? [];

  return (
    <section
      aria-labelledby={headingId}
      className="mb-6 rounded-xl border border-paper-200 bg-paper-50 p-4"
    >
      <h3 id={headingId} className="mb-2 font-semibold text-paper-950">
        Find in the hospital record
      </h3>
      <div className="flex flex-wrap items-end gap-3">
        <div className="min-w-64 flex-1">
          <TextField
            label="Record number or name"
            hint="e.g. MP-100301 or Ferncastle; the search runs on the hospital's FHIR server"
            autoComplete="off"
            spellCheck={false}
            value={text}
            error={problem ?? undefined}
            onChange={(e) => setText(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === 'Enter') {
                e.preventDefault();
                submit();
              }
            }}
          />
        </div>
        <Button variant="secondary" onClick={submit} busy={search.isPending}>
          {search.isPending ? 'Searching…' : 'Search the hospital record'}
        </Button>
      </div>
      {search.isError && (
        <div className="mt-3">
          <Alert tone="error" title="The hospital record could not be searched">
            {describeError(search.error)} The form below still works: type the patient in.
          </Alert>
        </div>
      )}
      {search.isSuccess && (
        <div className="mt-3" aria-live="polite">
          {found.length === 0 ? (
            <p className="text-paper-800">No patient found in the hospital record.</p>
          ) : (
            <ul className="divide-y divide-paper-200 rounded-lg border border-paper-200 bg-white">
              {found.map((c) => (
                <li key={c.fhirId} className="flex flex-wrap items-center gap-3 px-3 py-2">
                  <span className="flex-1">
                    <strong className="font-semibold">
                      {c.familyName}, {c.givenName}
                    </strong>{' '}
                    · record {c.recordNumber ?? 'none'} · born{' '}
                    {c.dateOfBirth ? formatCalendarDate(c.dateOfBirth) : 'not recorded'}
                  </span>
                  {c.luxtempoPatientId !== null ? (
                    <span className="text-sm text-paper-700">Already in Luxtempo</span>
                  ) : (
                    <Button
                      variant="secondary"
                      disabled={!c.recordNumber}
                      onClick={() => onPick(c)}
                      aria-label={`Fill the form with ${c.givenName} ${c.familyName}, record ${c.recordNumber ?? 'none'}`}
                    >
                      Fill the form
                    </Button>
                  )}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
