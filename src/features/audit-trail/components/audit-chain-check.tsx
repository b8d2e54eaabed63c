import { useMutation } from '@tanstack/react-query';
import { useId } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { describeError } from '../../../lib/api-client';
import { getAuditChain } from '../api/get-audit-chain';

/**
 * Runs the same check as `npm run audit:verify`: every audit row's hash is recomputed from the row
 * before, and the first row that does not match is named.
 */
export function AuditChainCheck() {
  const check = useMutation({ mutationFn: getAuditChain });
  const headingId = useId();
  const report = check.data;
  return (
    <section
      aria-labelledby={headingId}
      className="mt-8 rounded-2xl border border-paper-200 bg-white px-5 py-4"
    >
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 id={headingId} className="text-lg font-semibold text-paper-900">
            Is the audit trail intact?
          </h2>
          <p className="text-sm text-paper-700">
            Each event carries a hash of the one before; a change made around Luxtempo breaks the
            chain at that event.
          </p>
        </div>
        <Button variant="secondary" busy={check.isPending} onClick={() => check.mutate()}>
          Check the chain now
        </Button>
      </div>
      <div className="mt-3" aria-live="polite">
        {check.isError && (
          <Alert tone="error" title="The check could not run">
            {describeError(check.error)}
          </Alert>
        )}
        {report?.ok && (
          <Alert tone="info" title="Intact">
            All {report.checked} events match their hashes, and the chain ends at the newest event.
          </Alert>
        )}
        {report && !report.ok && (
          <Alert
            tone="error"
            title={
              report.firstBrokenId
                ? `Broken at event ${report.firstBrokenId}`
                : 'The end of the chain does not match'
            }
          >
            {report.reason} {report.checked} events before it are intact. Tell the unit’s
            information governance lead and keep the latest backup.
          </Alert>
        )}
      </div>
    </section>
  );
}
