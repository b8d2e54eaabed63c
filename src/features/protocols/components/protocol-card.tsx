import { LinkButton, Button } from '../../../components/ui/button';
import { CopyDraftIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import type { ProtocolSummary, VersionSummary } from '../api/protocol-response-schemas';
import { approvalsText } from './approvals-text';
import { formatDateTime, originLabels } from './protocol-labels';
import { VersionStatusBadge } from './version-status-badge';

type ProtocolCardProps = {
  protocol: ProtocolSummary;
  canDraft: boolean;
  /** The version a draft is being made from right now, if any. */
  draftingFrom: VersionSummary | null;
  onStartDraft: (from: VersionSummary) => void;
};

/** One protocol and every version of it, oldest first. */
export function ProtocolCard({
  protocol,
  canDraft,
  draftingFrom,
  onStartDraft,
}: ProtocolCardProps) {
  const headingId = `protocol-${protocol.key}`;
  return (
    <section
      aria-labelledby={headingId}
      className="overflow-hidden rounded-2xl border border-paper-200 bg-white"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-5 pt-4 pb-3">
        <h3 id={headingId} className="text-lg font-semibold text-paper-950">
          {protocol.title}
        </h3>
        <p className="text-sm text-paper-700">
          Key <code className="font-mono text-paper-900">{protocol.key}</code>
        </p>
      </div>
      <div className="overflow-x-auto">
        {/* Fixed columns, so the versions of every protocol line up down the page. */}
        <table className="w-full min-w-[44rem] table-fixed border-collapse text-left">
          <caption className="sr-only">Versions of {protocol.title}</caption>
          <colgroup>
            <col className="w-24" />
            <col className="w-44" />
            <col className="w-44" />
            <col />
            <col className={canDraft ? 'w-[22rem]' : 'w-28'} />
          </colgroup>
          <thead className="bg-paper-100 text-sm text-paper-700">
            <tr>
              <th scope="col" className="px-3 py-2 pl-5 font-semibold">
                Version
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Status
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Approvals
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Where it came from
              </th>
              <th scope="col" className="px-3 py-2 pr-5 text-right font-semibold">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {protocol.versions.map((version) => (
              <tr key={version.version} className="border-t border-paper-200 align-middle">
                <th scope="row" className="px-3 py-3 pl-5 font-semibold text-paper-950">
                  v{version.version}
                </th>
                <td className="px-3 py-3">
                  <VersionStatusBadge status={version.status} supersededBy={version.supersededBy} />
                </td>
                <td className="px-3 py-3 text-paper-800">{approvalsText(version)}</td>
                <td className="px-3 py-3 text-sm text-paper-700">
                  {originLabels[version.origin]}
                  <br />
                  <span className="text-paper-600">{formatDateTime(version.createdAt)}</span>
                </td>
                <td className="px-3 py-3 pr-5">
                  <div className="flex flex-wrap justify-end gap-2">
                    <LinkButton
                      size="sm"
                      to={paths.protocolVersion.getHref(version.key, version.version)}
                      aria-label={`Open ${protocol.title}, version ${version.version}`}
                    >
                      Open
                    </LinkButton>
                    {canDraft && (
                      <Button
                        variant="secondary"
                        size="sm"
                        icon={<CopyDraftIcon className="size-4" />}
                        busy={
                          draftingFrom?.key === version.key &&
                          draftingFrom.version === version.version
                        }
                        disabled={draftingFrom !== null}
                        // The accessible name starts with the visible words, so speech input finds the button by them.
                        aria-label={`Start a new draft from this: ${protocol.title}, version ${version.version}`}
                        onClick={() => onStartDraft(version)}
                      >
                        Start a new draft from this
                      </Button>
                    )}
                  </div>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
