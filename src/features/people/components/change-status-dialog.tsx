import type { Person } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { describeError } from '../../../lib/api-client';
import { useUpdatePerson } from '../hooks/use-update-person';

type ChangeStatusDialogProps = {
  person: Person | null;
  onDismiss: () => void;
  onChanged: (person: Person) => void;
};

/** Asks before switching an account off or on; nothing changes until the person confirms. */
export function ChangeStatusDialog({ person, onDismiss, onChanged }: ChangeStatusDialogProps) {
  const updatePerson = useUpdatePerson();
  const deactivating = person?.active ?? true;
  const verb = deactivating ? 'Deactivate' : 'Reactivate';

  const dismiss = () => {
    updatePerson.reset();
    onDismiss();
  };

  return (
    <Dialog
      open={person !== null}
      onDismiss={dismiss}
      dismissible={!updatePerson.isPending}
      title={person ? `${verb} ${person.displayName}?` : `${verb} person?`}
      description={
        person &&
        (deactivating ? (
          <p>
            {person.displayName} will no longer be able to sign in. Everything they have recorded
            stays as it is, and you can reactivate the account later.
          </p>
        ) : (
          <p>
            {person.displayName} will be able to sign in again, with the roles shown in the list.
          </p>
        ))
      }
    >
      {person && (
        <>
          {updatePerson.isError && (
            <Alert
              tone="error"
              title={`${person.displayName} was not ${deactivating ? 'deactivated' : 'reactivated'}`}
            >
              {describeError(updatePerson.error)}
            </Alert>
          )}
          <div className="flex flex-wrap justify-end gap-3">
            <Button variant="secondary" onClick={dismiss} disabled={updatePerson.isPending}>
              {deactivating ? 'Keep active' : 'Keep deactivated'}
            </Button>
            <Button
              variant={deactivating ? 'danger' : 'primary'}
              busy={updatePerson.isPending}
              onClick={() =>
                updatePerson.mutate(
                  { id: person.id, changes: { active: !person.active } },
                  {
                    onSuccess: (saved) => {
                      updatePerson.reset();
                      onChanged(saved);
                    },
                  },
                )
              }
            >
              {verb} {person.displayName}
            </Button>
          </div>
        </>
      )}
    </Dialog>
  );
}
