import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { describeError } from '../../../lib/api-client';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { useApproveVersion } from '../hooks/use-approve-version';
import { approvalsNeeded } from './approvals-text';

type ApproveDialogProps = {
  version: VersionDetail;
  open: boolean;
  onDismiss: () => void;
  onApproved: (saved: VersionDetail) => void;
};

/** Asks the clinician or pharmacist to confirm before their approval is recorded. */
export function ApproveDialog({ version, open, onDismiss, onApproved }: ApproveDialogProps) {
  const approve = useApproveVersion();
  const after = version.approvals.length + 1;
  const dismiss = () => {
    approve.reset();
    onDismiss();
  };
  return (
    <Dialog
      open={open}
      onDismiss={dismiss}
      dismissible={!approve.isPending}
      title={`Approve ${version.title}, version ${version.version}?`}
      description={
        <div className="space-y-2">
          <p>
            By approving you confirm that you have checked every figure and source in this version against the unit’s approved policy,
            the product labelling and the devices in use.
          </p>
          <p>
            {after >= approvalsNeeded
              ? `Yours is approval ${after} of ${approvalsNeeded}: the version becomes approved and can be used for orders. It can never be edited afterwards.`
              : `Yours is approval ${after} of ${approvalsNeeded}: a second, different person must approve it too before anyone can order with it.`}
          </p>
        </div>
      }
    >
      {open && (
        <>
          {approve.isError && (
            <Alert tone="error" title="Your approval was not recorded">
              {describeError(approve.error)}
            </Alert>
          )}
          <div className="flex flex-wrap justify-end gap-3">
            <Button variant="secondary" onClick={dismiss} disabled={approve.isPending}>
              Not now
            </Button>
            <Button
              busy={approve.isPending}
              onClick={() =>
                approve.mutate(
                  { key: version.key, version: version.version },
                  {
                    onSuccess: (saved) => {
                      approve.reset();
                      onApproved(saved);
                    },
                  },
                )
              }
            >
              Approve version {version.version}
            </Button>
          </div>
        </>
      )}
    </Dialog>
  );
}
