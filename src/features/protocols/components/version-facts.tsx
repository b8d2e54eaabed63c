import type { ReactNode } from 'react';
import {
  protocolApprovalMeaning,
  protocolApprovalMeaningWords,
} from '../../../../shared/protocol/approval-signature';
import { roleLabels } from '../../../../shared/roles';
import { SignatureIcon } from '../../../components/ui/icons';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { approvalsNeeded } from './approvals-text';
import {
  formatDate,
  formatDateTime,
  kindLabels,
  originLabels,
  shortSha256,
} from './protocol-labels';
import { VersionStatusBadge } from './version-status-badge';

/** Identity and history of one version: what it is, where it came from, who stands behind it. */
export function VersionFacts({ version }: { version: VersionDetail }) {
  const facts: { label: string; value: ReactNode }[] = [
    { label: 'Protocol key', value: <code className="font-mono">{version.key}</code> },
    { label: 'Version', value: version.version },
    {
      label: 'Kind',
      value: `${kindLabels[version.kind].short} — ${kindLabels[version.kind].long}`,
    },
    {
      label: 'Status',
      value: (
        <span className="flex flex-col items-start gap-1">
          <VersionStatusBadge status={version.status} supersededBy={version.supersededBy} />
          {version.supersededBy !== null && (
            <span className="text-sm text-paper-700">
              Version {version.supersededBy} is approved too and is offered first; ordering with
              this one asks for a reason.
            </span>
          )}
        </span>
      ),
    },
    {
      label: 'Origin',
      value: version.sourceFile
        ? `${originLabels[version.origin]} (${version.sourceFile})`
        : originLabels[version.origin],
    },
    {
      label: 'SHA-256 of the definition',
      value: (
        <details className="group">
          <summary className="cursor-pointer rounded font-mono text-paper-950">
            {shortSha256(version.sha256)}{' '}
            <span className="font-sans text-sm text-iris-700 underline underline-offset-4">
              show all 64 digits
            </span>
          </summary>
          <code className="mt-1 block font-mono text-sm break-all text-paper-900 select-all">
            {version.sha256}
          </code>
        </details>
      ),
    },
    { label: 'Created', value: formatDateTime(version.createdAt) },
    ...(version.approvedAt
      ? [
          {
            label: 'Approved',
            // A shipped file records only the day of approval; a time of day would be invented.
            value:
              version.origin === 'shipped'
                ? formatDate(version.approvedAt.slice(0, 10))
                : formatDateTime(version.approvedAt),
          },
        ]
      : []),
    ...(version.retiredAt ? [{ label: 'Retired', value: formatDateTime(version.retiredAt) }] : []),
    ...(version.discardedAt
      ? [
          {
            label: 'Discarded',
            value: `${formatDateTime(version.discardedAt)}${version.discardReason ? ` — ${version.discardReason}` : ''}`,
          },
        ]
      : []),
  ];
  return (
    <dl className="grid gap-x-6 gap-y-3 rounded-2xl border border-paper-200 bg-white p-5 sm:grid-cols-2 lg:grid-cols-3">
      {facts.map(({ label, value }) => (
        <div key={label} className="min-w-0">
          <dt className="text-sm font-medium text-paper-700">{label}</dt>
          <dd className="mt-0.5 text-paper-950 [overflow-wrap:anywhere]">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** Who approved: the people in Luxtempo, or for a shipped version the names its file records. */
export function ApprovalRecord({ version }: { version: VersionDetail }) {
  const fileApproval = version.definition.approval;
  return (
    <section
      aria-labelledby="approval-record"
      className="rounded-2xl border border-paper-200 bg-white p-5"
    >
      <h2 id="approval-record" className="text-lg font-semibold text-paper-950">
        Approvals
      </h2>
      {version.approvals.length > 0 && (
        <ul className="mt-3 space-y-2">
          {version.approvals.map((approval) => (
            <li
              key={`${approval.userId}-${approval.approvedAt}`}
              className="flex items-start gap-2 text-paper-950"
            >
              <SignatureIcon className="mt-0.5 size-5 text-paper-700" />
              <span>
                <span className="font-medium">
                  {approval.displayName ?? `Person #${approval.userId}`}
                </span>
                , as {roleLabels[approval.approvedAs].toLowerCase()}, on{' '}
                {formatDateTime(approval.approvedAt)}
                {approval.meaning === protocolApprovalMeaning && (
                  <span className="block text-sm text-paper-700">
                    Signed with password: “{protocolApprovalMeaningWords}”
                  </span>
                )}
              </span>
            </li>
          ))}
        </ul>
      )}
      {version.origin !== 'shipped' && version.status === 'draft' && (
        <p className="mt-3 text-paper-800">
          {version.approvals.length} of {approvalsNeeded} approvals so far. Two different people,
          each a clinician or a pharmacist, must approve; editing the draft clears approvals already
          given.
        </p>
      )}
      {fileApproval && (
        <div className="mt-3 space-y-1 text-paper-900">
          <p>
            Recorded in the file: approved by {fileApproval.approvedBy.join(' and ')} on{' '}
            {formatDate(fileApproval.approvedOn)}.
          </p>
          <p className="text-sm text-paper-700">{fileApproval.note}</p>
        </div>
      )}
      {version.approvals.length === 0 && !fileApproval && version.status !== 'draft' && (
        <p className="mt-3 text-paper-700">No approvals are recorded.</p>
      )}
    </section>
  );
}
