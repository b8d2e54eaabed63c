import { useQuery } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import {
  AlertIcon,
  MagnifierIcon,
  PatientCardIcon,
  PlusIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { TextField } from '../../../components/ui/text-field';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import { patientQueries } from '../api/patient-queries';
import { useDebouncedValue } from '../hooks/use-debounced-value';
import { AddPatientForm } from './add-patient-form';
import { PatientsTable } from './patients-table';

export function PatientsScreen({ canAdd }: { canAdd: boolean }) {
  const [searchParams, setSearchParams] = useSearchParams();
  const navigate = useNavigate();
  const [text, setText] = useState(() => searchParams.get('q') ?? '');
  const settled = useDebouncedValue(text.trim(), 300);
  const [adding, setAdding] = useState(false);
  const addButtonRef = useRef<HTMLButtonElement>(null);
  const formId = useId();

  const wasAdding = useRef(false);
  useEffect(() => {
    if (wasAdding.current && !adding) addButtonRef.current?.focus();
    wasAdding.current = adding;
  }, [adding]);

  const results = useQuery(patientQueries.search(settled));

  return (
    <>
      <PageHeader
        title="Patients"
        lead="Find a patient by record number or name, see each eye’s treatments, and start an order."
        actions={
          canAdd && (
            <Button
              ref={addButtonRef}
              variant={adding ? 'secondary' : 'primary'}
              icon={<PlusIcon />}
              aria-expanded={adding}
              aria-controls={adding ? formId : undefined}
              onClick={() => setAdding((open) => !open)}
            >
              Add a patient
            </Button>
          )
        }
      />

      {adding && (
        <AddPatientForm
          id={formId}
          onCancel={() => setAdding(false)}
          onCreated={(patient) => navigate(paths.patient.getHref(patient.id))}
        />
      )}

      <div role="search" aria-label="Patients" className="mb-6 max-w-xl">
        <form onSubmit={(event) => event.preventDefault()}>
          <TextField
            label="Find a patient"
            hint="The first letters of the record number, family name or given name"
            type="search"
            autoComplete="off"
            spellCheck={false}
            value={text}
            onChange={(event) => {
              const next = event.target.value;
              setText(next);
              // The address keeps the search, so a reload or the back button shows the same list. It is
              // written as the person types, never later, so it cannot undo a link they have just followed.
              setSearchParams(next.trim() ? { q: next.trim() } : {}, { replace: true });
            }}
          />
        </form>
      </div>

      {results.isPending ? (
        <LoadingPanel label="Looking for patients…" />
      ) : results.isError && !results.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="Patients could not be looked up"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={results.isFetching}
              onClick={() => void results.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(results.error)}</p>
        </StatusPanel>
      ) : results.data.length === 0 ? (
        <StatusPanel
          icon={
            settled ? <MagnifierIcon className="size-6" /> : <PatientCardIcon className="size-6" />
          }
          title={settled ? `No patient matches “${settled}”` : 'No patients yet'}
        >
          <p>
            {settled
              ? 'Check the spelling, or search by the record number.'
              : canAdd
                ? 'Add the first patient with “Add a patient”.'
                : 'Patients are added by clinicians and administrators.'}
          </p>
        </StatusPanel>
      ) : (
        <>
          {results.isError && (
            <Alert tone="error" title="The list may be out of date" className="mb-4">
              {describeError(results.error)}
            </Alert>
          )}
          <p role="status" className="mb-3 text-sm text-paper-700">
            {results.data.length === 50
              ? 'The first 50 matches are shown; type more letters to narrow the list.'
              : `${results.data.length} ${results.data.length === 1 ? 'patient' : 'patients'} shown.`}
          </p>
          <PatientsTable patients={results.data} searchText={settled} />
        </>
      )}
    </>
  );
}
