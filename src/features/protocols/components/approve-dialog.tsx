import { useState, type FormEvent } from 'react';
import { protocolApprovalMeaningWords } from '../../../../shared/protocol/approval-signature';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { SignatureIcon } from '../../../components/ui/icons';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { useApproveVersion } from '../hooks/use-approve-version';
import { approvalsNeeded } from './approvals-text';

type ApproveDialogProps = {
  version: VersionDetail;
  open: boolean;
  onDismiss: () => void;
  onApproved: (saved: VersionDetail) => void;
};

/**
 * An approval is an electronic signature, like signing an order: it states what the signature
 * means and asks for the approver's password again. The server checks both and stores the meaning.
 */
export function ApproveDialog({ version, open, onDismiss, onApproved }: ApproveDialogProps) {
  const approve = useApproveVersion();
  const [password, setPassword] = useState('');
  const [passwordError, setPasswordError] = useState<string | undefined>();
  const after = version.approvals.length + 1;
  const dismiss = () => {
    approve.reset();
    setPassword('');
    setPasswordError(undefined);
    onDismiss();
  };
  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (password === '') {
      setPasswordError('Type your sign-in password to approve');
      return;
    }
    setPasswordError(undefined);
    approve.mutate(
      { key: version.key, version: version.version, password },
      {
        onSuccess: (saved) => {
          approve.reset();
          setPassword('');
          onApproved(saved);
        },
        onError: (error) => {
          if (isApiRequestError(error) && error.fields.some((f) => f.path === 'password'))
            setPasswordError('The password is not right; type your sign-in password again');
          setPassword('');
        },
      },
    );
  };
  const passwordRefused =
    isApiRequestError(approve.error) && approve.error.fields.some((f) => f.path === 'password');
  return (
    <Dialog
      open={open}
      onDismiss={dismiss}
      dismissible={!approve.isPending}
      title={`Approve ${version.title}, version ${version.version}?`}
      description={
        <div className="space-y-2">
          <p>
            Your approval is an electronic signature. It means:{' '}
            <strong className="font-semibold text-paper-950">
              “{protocolApprovalMeaningWords}”
            </strong>{' '}
            It is recorded with your name, your role and the time, for exactly the content shown
            (its SHA-256).
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
        <form onSubmit={submit} noValidate className="flex flex-col gap-4">
          {approve.isError && !passwordRefused && (
            <Alert tone="error" title="Your approval was not recorded">
              {describeError(approve.error)}
            </Alert>
          )}
          <TextField
            label="Your password"
            type="password"
            autoComplete="current-password"
            hint="The password you sign in with, asked again for this signature"
            value={password}
            error={passwordError}
            onChange={(e) => setPassword(e.target.value)}
          />
          <div className="flex flex-wrap justify-end gap-3">
            <Button variant="secondary" onClick={dismiss} disabled={approve.isPending}>
              Not now
            </Button>
            <Button type="submit" busy={approve.isPending} icon={<SignatureIcon />}>
              Sign: approve version {version.version}
            </Button>
          </div>
        </form>
      )}
    </Dialog>
  );
}
