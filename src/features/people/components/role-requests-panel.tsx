import { useQuery } from '@tanstack/react-query';
import { roleLabels } from '../../../../shared/roles';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { describeError } from '../../../lib/api-client';
import { peopleQueries } from '../api/people-queries';
import { useDecideRoleRequest } from '../hooks/use-account-actions';

/**
 * Role changes that give a clinical role, waiting for a second administrator. The server refuses
 * a decision by the administrator who asked or by the person concerned; the buttons say so first.
 */
export function RoleRequestsPanel({
  currentUserId,
  onDecided,
}: {
  currentUserId: number;
  onDecided: (message: string) => void;
}) {
  const requests = useQuery(peopleQueries.roleRequests());
  const decide = useDecideRoleRequest();
  if (!requests.data || requests.data.length === 0) return null;
  return (
    <section
      aria-labelledby="role-requests-heading"
      className="mb-8 rounded-2xl border border-iris-200 bg-iris-50 p-5"
    >
      <h2 id="role-requests-heading" className="mb-1 text-lg font-semibold text-paper-950">
        Role changes waiting for approval
      </h2>
      <p className="mb-4 text-paper-800">
        A clinician or pharmacist role takes effect only when an administrator other than the one
        who asked approves it.
      </p>
      {decide.isError && (
        <Alert tone="error" title="The decision was not saved" className="mb-4">
          {describeError(decide.error)}
        </Alert>
      )}
      <ul className="flex flex-col gap-3">
        {requests.data.map((request) => {
          const ownRequest = request.requestedBy === currentUserId;
          const ownRoles = request.userId === currentUserId;
          const blocked = ownRequest || ownRoles;
          const roles = request.roles.map((r) => roleLabels[r]).join(', ');
          return (
            <li
              key={request.id}
              className="flex flex-wrap items-center justify-between gap-3 rounded-xl border border-paper-200 bg-white px-4 py-3"
            >
              <div>
                <p className="font-medium text-paper-950">
                  {request.personName}: {roles}
                </p>
                <p className="text-sm text-paper-700">
                  Now {request.currentRoles.map((r) => roleLabels[r]).join(', ') || 'no roles'} ·
                  asked by {request.requestedByName}
                  {blocked &&
                    ` · ${ownRequest ? 'you asked for this' : 'these are your own roles'}: another administrator decides`}
                </p>
              </div>
              <div className="flex gap-2">
                <Button
                  size="sm"
                  disabled={blocked || decide.isPending}
                  onClick={() =>
                    decide.mutate(
                      { requestId: request.id, decision: 'approval' },
                      {
                        onSuccess: (person) =>
                          onDecided(`${person.displayName} now holds ${roles}.`),
                      },
                    )
                  }
                  aria-label={`Approve ${roles} for ${request.personName}`}
                >
                  Approve
                </Button>
                <Button
                  size="sm"
                  variant="secondary"
                  disabled={blocked || decide.isPending}
                  onClick={() =>
                    decide.mutate(
                      { requestId: request.id, decision: 'rejection' },
                      {
                        onSuccess: (person) =>
                          onDecided(`The role change for ${person.displayName} was rejected.`),
                      },
                    )
                  }
                  aria-label={`Reject ${roles} for ${request.personName}`}
                >
                  Reject
                </Button>
              </div>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
