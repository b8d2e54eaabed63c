import { useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useId, useRef, useState } from 'react';
import type { Person } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import {
  AlertIcon,
  CheckCircleIcon,
  PeopleIcon,
  PlusIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { describeError } from '../../../lib/api-client';
import { AuditChainCheck } from '../../audit-trail/components/audit-chain-check';
import { peopleQueries } from '../api/people-queries';
import { AddPersonForm } from './add-person-form';
import { ChangeStatusDialog } from './change-status-dialog';
import { EditPersonDialog } from './edit-person-dialog';
import { useEndSessions, useSendPasswordLink } from '../hooks/use-account-actions';
import { PeopleTable } from './people-table';
import { RoleRequestsPanel } from './role-requests-panel';

export function PeopleScreen({ currentUserId }: { currentUserId: number }) {
  const peopleQuery = useQuery(peopleQueries.list());
  const [adding, setAdding] = useState(false);
  const [editing, setEditing] = useState<Person | null>(null);
  const [statusTarget, setStatusTarget] = useState<Person | null>(null);
  const [outcome, setOutcome] = useState('');
  const addButtonRef = useRef<HTMLButtonElement>(null);
  const formId = useId();

  const openEdit = useCallback((person: Person) => {
    setOutcome('');
    setEditing(person);
  }, []);
  const openStatus = useCallback((person: Person) => {
    setOutcome('');
    setStatusTarget(person);
  }, []);
  const sendLink = useSendPasswordLink();
  const endSessions = useEndSessions();
  const [actionError, setActionError] = useState('');
  const { mutate: mutateSendLink } = sendLink;
  const { mutate: mutateEndSessions } = endSessions;
  const onSendLink = useCallback(
    (person: Person) => {
      setOutcome('');
      setActionError('');
      mutateSendLink(person.id, {
        onSuccess: () =>
          setOutcome(
            `A link to set a password was e-mailed to ${person.displayName}. It works once.`,
          ),
        onError: (error) => setActionError(describeError(error)),
      });
    },
    [mutateSendLink],
  );
  const onEndSessions = useCallback(
    (person: Person) => {
      setOutcome('');
      setActionError('');
      mutateEndSessions(person.id, {
        onSuccess: ({ ended }) =>
          setOutcome(
            `${person.displayName} is signed out everywhere (${ended} ${ended === 1 ? 'session' : 'sessions'} ended).`,
          ),
        onError: (error) => setActionError(describeError(error)),
      });
    },
    [mutateEndSessions],
  );

  // When the form closes, focus goes back to the button that opened it, not to the page's top.
  const wasAdding = useRef(false);
  useEffect(() => {
    if (wasAdding.current && !adding) addButtonRef.current?.focus();
    wasAdding.current = adding;
  }, [adding]);
  const closeForm = () => setAdding(false);

  return (
    <>
      <PageHeader
        title="People"
        lead="Staff accounts and their roles. Roles decide what each person can see and do."
        actions={
          <Button
            ref={addButtonRef}
            variant={adding ? 'secondary' : 'primary'}
            icon={<PlusIcon />}
            aria-expanded={adding}
            aria-controls={adding ? formId : undefined}
            onClick={() => {
              setOutcome('');
              setAdding((open) => !open);
            }}
          >
            Add a person
          </Button>
        }
      />

      {adding && (
        <AddPersonForm
          id={formId}
          onCancel={closeForm}
          onCreated={(person) => {
            setOutcome(
              `${person.displayName} was added. A link to set their password was e-mailed to them.${person.pendingRoleRequest ? ' Their clinical role waits for another administrator’s approval.' : ''}`,
            );
            closeForm();
          }}
        />
      )}

      {/* Kept in the page at all times so screen readers announce each outcome as it changes. */}
      <div role="status" className={outcome ? 'mb-6' : 'sr-only'}>
        {outcome && (
          <p className="flex items-center gap-2 rounded-lg border border-iris-200 bg-iris-50 px-4 py-3 font-medium text-iris-900">
            <CheckCircleIcon className="size-5" />
            {outcome}
          </p>
        )}
      </div>

      {actionError && (
        <Alert tone="error" title="That was not done" className="mb-6">
          {actionError}
        </Alert>
      )}

      <RoleRequestsPanel currentUserId={currentUserId} onDecided={setOutcome} />

      {peopleQuery.isPending ? (
        <LoadingPanel label="Loading people…" />
      ) : peopleQuery.isError && !peopleQuery.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="The list of people could not be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={peopleQuery.isFetching}
              onClick={() => void peopleQuery.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(peopleQuery.error)}</p>
        </StatusPanel>
      ) : peopleQuery.data.length === 0 ? (
        <StatusPanel icon={<PeopleIcon className="size-6" />} title="No people yet">
          <p>Add the first person with “Add a person”.</p>
        </StatusPanel>
      ) : (
        <>
          {peopleQuery.isError && (
            <Alert tone="error" title="The list may be out of date" className="mb-4">
              {describeError(peopleQuery.error)}
            </Alert>
          )}
          <PeopleTable
            people={peopleQuery.data}
            currentUserId={currentUserId}
            onEdit={openEdit}
            onChangeStatus={openStatus}
            onSendLink={onSendLink}
            onEndSessions={onEndSessions}
          />
        </>
      )}

      <EditPersonDialog
        person={editing}
        onDismiss={() => setEditing(null)}
        onSaved={(person) => {
          setEditing(null);
          setOutcome(
            person.pendingRoleRequest
              ? `Changes to ${person.displayName} were saved; the clinical role waits for another administrator’s approval.`
              : `Changes to ${person.displayName} were saved.`,
          );
        }}
      />
      <ChangeStatusDialog
        person={statusTarget}
        onDismiss={() => setStatusTarget(null)}
        onChanged={(person) => {
          setStatusTarget(null);
          setOutcome(
            `${person.displayName} is now ${person.active ? 'active and can sign in' : 'deactivated and cannot sign in'}.`,
          );
        }}
      />
      {/* Administrators keep the records' integrity in view; the same check as `npm run audit:verify`. */}
      <AuditChainCheck />
    </>
  );
}
