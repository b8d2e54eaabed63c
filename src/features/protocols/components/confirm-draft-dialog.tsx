import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { CopyDraftIcon } from '../../../components/ui/icons';
import { describeError } from '../../../lib/api-client';

type ConfirmDraftDialogProps = {
  /** The version a draft would be made from; null keeps the dialog closed. */
  from: { key: string; version: number; title: string } | null;
  busy: boolean;
  error: unknown;
  onConfirm: () => void;
  onDismiss: () => void;
};

/** A draft is a new version number on record: it is made only after the person says so. */
export function ConfirmDraftDialog({
  from,
  busy,
  error,
  onConfirm,
  onDismiss,
}: ConfirmDraftDialogProps) {
  return (
    <Dialog
      open={from !== null}
      onDismiss={onDismiss}
      dismissible={!busy}
      title={from ? `Start a new draft from ${from.title}, version ${from.version}?` : ''}
      description={
        <p>
          The draft copies every figure and source of version {from?.version} under the next free
          version number. Nobody can order with it until two different people approve it; until then
          you can edit it, or discard it with a reason.
        </p>
      }
    >
      {from && (
        <div className="flex flex-col gap-4">
          {error != null && (
            <Alert tone="error" title="No draft was made">
              {describeError(error)}
            </Alert>
          )}
          <div className="flex flex-wrap justify-end gap-3">
            <Button variant="secondary" onClick={onDismiss} disabled={busy}>
              Cancel
            </Button>
            <Button icon={<CopyDraftIcon />} busy={busy} onClick={onConfirm}>
              Start the draft
            </Button>
          </div>
        </div>
      )}
    </Dialog>
  );
}
