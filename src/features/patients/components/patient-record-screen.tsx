import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Patient } from '../../../../shared/schemas/patients';
import { Alert } from '../../../components/ui/alert';
import { formatUnitDateTime } from '../../../lib/unit-times';
import { invalidatePatient, refreshFromFhir } from '../api/fhir-patients';
import { LinkButton } from '../../../components/ui/button';
import { AlertIcon, ArrowLeftIcon, PlusIcon, ReloadIcon } from '../../../components/ui/icons';
import { Button } from '../../../components/ui/button';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { patientQueries } from '../api/patient-queries';
import { EyeHistory } from './eye-history';
import { formatCalendarDate } from '../../../lib/unit-times';
import { ageInYears } from './unit-dates';

/** Where the patient came from: typed in, or the hospital's FHIR record (which can be read again). */
function HospitalRecordSource({ patient }: { patient: Patient }) {
  const queryClient = useQueryClient();
  const refresh = useMutation({
    mutationFn: () => refreshFromFhir(patient.id),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invalidatePatient() }),
  });
  const source = patient.fhirSource;
  return (
    <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-paper-200 pt-3 text-sm">
      <p className="flex-1 text-paper-800">
        {source ? (
          <>
            Source: hospital record, FHIR Patient/{source.id} at {source.baseUrl}
            {source.readAt ? `, last read ${formatUnitDateTime(source.readAt)}` : ''}.
          </>
        ) : (
          'Source: entered by hand in Luxtempo.'
        )}
      </p>
      {source && (
        <Button variant="secondary" busy={refresh.isPending} onClick={() => refresh.mutate()}>
          {refresh.isPending ? 'Reading…' : 'Read again from the hospital record'}
        </Button>
      )}
      {refresh.isSuccess && (
        <p role="status" className="w-full text-paper-800">
          {refresh.data.changed.length
            ? `Updated from the hospital record: ${refresh.data.changed.join(', ')}.`
            : 'The hospital record says the same: nothing changed.'}
        </p>
      )}
      {refresh.isError && (
        <div className="w-full">
          <Alert tone="error" title="The hospital record could not be read">
            {describeError(refresh.error)}
          </Alert>
        </div>
      )}
    </div>
  );
}

export function PatientRecordScreen({
  patientId,
  canOrder,
}: {
  patientId: number;
  canOrder: boolean;
}) {
  const history = useQuery(patientQueries.history(patientId));

  if (history.isPending) {
    return (
      <>
        <title>Patient · Luxtempo</title>
        <LoadingPanel label="Loading the patient…" />
      </>
    );
  }
  if (history.isError) {
    const missing = isApiRequestError(history.error) && history.error.status === 404;
    return (
      <>
        <title>Patient · Luxtempo</title>
        <StatusPanel
          role="alert"
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title={missing ? 'There is no such patient' : 'The patient could not be loaded'}
          actions={
            <>
              <LinkButton to={paths.patients.getHref()} icon={<ArrowLeftIcon />}>
                All patients
              </LinkButton>
              {!missing && (
                <Button
                  variant="primary"
                  icon={<ReloadIcon />}
                  busy={history.isFetching}
                  onClick={() => void history.refetch()}
                >
                  Try again
                </Button>
              )}
            </>
          }
        >
          <p>{describeError(history.error)}</p>
        </StatusPanel>
      </>
    );
  }

  const { patient, eyes } = history.data;
  const age = ageInYears(patient.dateOfBirth);
  return (
    <>
      <title>{`Patient ${patient.recordNumber} · Luxtempo`}</title>
      <PageHeader
        title={`${patient.familyName}, ${patient.givenName}`}
        lead={
          <>
            Record number{' '}
            <strong className="font-semibold text-paper-900">{patient.recordNumber}</strong>
          </>
        }
        actions={
          <>
            <LinkButton to={paths.patients.getHref()} icon={<ArrowLeftIcon />}>
              All patients
            </LinkButton>
            {canOrder && (
              <LinkButton
                variant="primary"
                to={paths.newOrder.getHref(patient.id)}
                icon={<PlusIcon />}
              >
                New order for this patient
              </LinkButton>
            )}
          </>
        }
      />

      <section
        aria-labelledby="patient-details-heading"
        className="mb-8 rounded-2xl border border-paper-200 bg-white px-5 py-4"
      >
        <h2 id="patient-details-heading" className="sr-only">
          Details
        </h2>
        <dl className="grid gap-x-8 gap-y-3 sm:grid-cols-2 lg:grid-cols-[1fr_1fr_2fr_1fr]">
          <div>
            <dt className="text-sm text-paper-600">Record number</dt>
            <dd className="font-medium text-paper-950">{patient.recordNumber}</dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">Date of birth</dt>
            <dd className="font-medium text-paper-950">
              {formatCalendarDate(patient.dateOfBirth)}
              {age !== null && <span className="font-normal text-paper-700"> ({age} years)</span>}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">E-mail</dt>
            <dd className="font-medium text-paper-950 [overflow-wrap:anywhere]">
              {patient.email ?? 'None recorded'}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-paper-600">Agreed to e-mail</dt>
            <dd className="font-medium text-paper-950">{patient.emailConsent ? 'Yes' : 'No'}</dd>
          </div>
        </dl>
        <HospitalRecordSource patient={patient} />
      </section>

      <p className="mb-4 text-sm text-paper-700">
        Times are shown in the unit’s time zone ({unitTimeZone}). The gap since the previous
        treatment counts signed orders of the same kind on the same eye; drafts, orders sent back
        and replaced revisions are not treatments.
      </p>
      <div className="grid gap-6">
        <EyeHistory eye="right" treatments={eyes.right} />
        <EyeHistory eye="left" treatments={eyes.left} />
      </div>
    </>
  );
}
