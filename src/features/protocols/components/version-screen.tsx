import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { SessionUser } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button, LinkButton } from '../../../components/ui/button';
import {
  AlertIcon,
  ArchiveBoxIcon,
  ArrowLeftIcon,
  CheckCircleIcon,
  CopyDraftIcon,
  MinusIcon,
  ReloadIcon,
  SignatureIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { protocolQueries } from '../api/protocol-queries';
import { useCreateDraft } from '../hooks/use-create-draft';
import { ApproveDialog } from './approve-dialog';
import { ConfirmDraftDialog } from './confirm-draft-dialog';
import { approvalsNeeded } from './approvals-text';
import { ComparePicker } from './compare-picker';
import { DefinitionSections } from './definition-sections';
import { DraftEditor } from './draft-editor';
import { ProtocolCaution } from './protocol-caution';
import { RetireDialog } from './retire-dialog';
import { SourcesList } from './sources-list';
import { ApprovalRecord, VersionFacts } from './version-facts';

/** Anchors of the sections below (DefinitionSections and SourcesList give their headings these ids). */
const sectionLinks: [id: string, label: string][] = [
  ['params-drug', 'Drug'],
  ['params-light', 'Light'],
  ['params-timing', 'Timing'],
  ['params-cxl', 'Cross-linking'],
  ['params-rounding', 'Rounding'],
  ['params-limits', 'Input limits'],
  ['params-tolerances', 'Tolerances'],
  ['params-steps', 'Steps'],
  ['params-contraindications', 'Contraindications'],
  ['params-cautions', 'Cautions'],
  ['params-sources', 'Sources'],
];

type Permissions = { approve: boolean; retire: boolean; manage: boolean };

type VersionScreenProps = {
  protocolKey: string;
  version: number;
  user: SessionUser;
  can: Permissions;
};

export function VersionScreen({ protocolKey, version, user, can }: VersionScreenProps) {
  const versionQuery = useQuery(protocolQueries.version({ key: protocolKey, version }));

  const back = (
    <Link
      to={paths.protocols.getHref()}
      className="mb-4 inline-flex items-center gap-2 rounded font-medium text-iris-700 underline-offset-4 hover:underline"
    >
      <ArrowLeftIcon className="size-4" />
      All protocols
    </Link>
  );

  if (versionQuery.isPending) {
    return (
      <>
        {back}
        <LoadingPanel label={`Loading ${protocolKey} version ${version}…`} />
      </>
    );
  }
  if (versionQuery.isError && !versionQuery.data) {
    const missing = isApiRequestError(versionQuery.error) && versionQuery.error.status === 404;
    return (
      <>
        {back}
        <StatusPanel
          role="alert"
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title={
            missing
              ? `There is no ${protocolKey} version ${version}`
              : 'This protocol version could not be loaded'
          }
          actions={
            missing ? (
              <LinkButton to={paths.protocols.getHref()}>See all protocols</LinkButton>
            ) : (
              <Button
                variant="secondary"
                icon={<ReloadIcon />}
                busy={versionQuery.isFetching}
                onClick={() => void versionQuery.refetch()}
              >
                Try again
              </Button>
            )
          }
        >
          <p>{describeError(versionQuery.error)}</p>
        </StatusPanel>
      </>
    );
  }

  return (
    <>
      {back}
      <VersionDetailView detail={versionQuery.data} user={user} can={can} />
      {versionQuery.isError && (
        <Alert tone="error" title="What you see may be out of date" className="mt-4">
          {describeError(versionQuery.error)}
        </Alert>
      )}
    </>
  );
}

function VersionDetailView({
  detail,
  user,
  can,
}: {
  detail: VersionDetail;
  user: SessionUser;
  can: Permissions;
}) {
  const [dialog, setDialog] = useState<'approve' | 'retire' | 'discard' | 'draft' | null>(null);
  const [outcome, setOutcome] = useState<{
    text: string;
    link?: { to: string; label: string };
  } | null>(null);
  const createDraft = useCreateDraft();
  const { definition } = detail;
  const myApproval = detail.approvals.find((a) => a.userId === user.id);
  const isDraft = detail.status === 'draft';

  return (
    <>
      <PageHeader
        title={`${definition.title} · version ${detail.version}`}
        lead={definition.summary}
      />
      <ProtocolCaution className="mb-5" />

      <div role="status" className={outcome ? 'mb-5' : 'sr-only'}>
        {outcome && (
          <p className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-lg border border-iris-200 bg-iris-50 px-4 py-3 font-medium text-iris-900">
            <CheckCircleIcon className="size-5" />
            <span>{outcome.text}</span>
            {outcome.link && (
              <Link className="text-iris-800 underline underline-offset-4" to={outcome.link.to}>
                {outcome.link.label}
              </Link>
            )}
          </p>
        )}
      </div>

      <div className="space-y-5">
        <VersionFacts version={detail} />
        <ApprovalRecord version={detail} />

        <section
          aria-labelledby="version-actions"
          className="space-y-4 rounded-2xl border border-paper-200 bg-white p-5"
        >
          <h2 id="version-actions" className="text-lg font-semibold text-paper-950">
            What you can do
          </h2>
          {isDraft && can.approve && (
            <div className="space-y-2">
              {myApproval ? (
                <p className="flex items-start gap-2 text-paper-900">
                  <SignatureIcon className="mt-0.5 size-5" />
                  You approved this draft; a second, different clinician or pharmacist must approve
                  it too.
                </p>
              ) : (
                <>
                  <p className="max-w-prose text-paper-800">
                    A draft needs approval by two different people, each a clinician or a
                    pharmacist. Approve only after checking every figure and source below.
                  </p>
                  <Button icon={<SignatureIcon />} onClick={() => setDialog('approve')}>
                    Approve version {detail.version}
                  </Button>
                </>
              )}
            </div>
          )}
          {isDraft && !can.approve && (
            <p className="max-w-prose text-paper-800">
              This is a draft. Two different people, each a clinician or a pharmacist, approve it
              before it can be used.
            </p>
          )}
          {detail.status === 'approved' && can.retire && (
            <div className="space-y-2">
              <p className="max-w-prose text-paper-800">
                Retire this version when the unit stops using it; new orders then cannot choose it.
              </p>
              <Button
                variant="secondary"
                icon={<ArchiveBoxIcon />}
                onClick={() => setDialog('retire')}
              >
                Retire version {detail.version}…
              </Button>
            </div>
          )}
          {isDraft && can.manage && (
            <div className="space-y-2">
              <p className="max-w-prose text-paper-800">
                A draft made by mistake or no longer wanted can be discarded, with a reason. It
                stays on record and can never be approved.
              </p>
              <Button variant="secondary" icon={<MinusIcon />} onClick={() => setDialog('discard')}>
                Discard draft {detail.version}…
              </Button>
            </div>
          )}
          {can.manage && detail.status !== 'discarded' && (
            <div className="space-y-2">
              <Button
                variant="secondary"
                icon={<CopyDraftIcon />}
                onClick={() => {
                  setOutcome(null);
                  createDraft.reset();
                  setDialog('draft');
                }}
              >
                Start a new draft from this…
              </Button>
            </div>
          )}
          <ComparePicker protocolKey={detail.key} version={detail.version} />
        </section>

        {isDraft && can.manage && <DraftEditor draft={detail} />}

        <nav
          aria-label="Parts of this version"
          className="rounded-2xl border border-paper-200 bg-paper-100 px-5 py-3"
        >
          <p className="mb-1 text-sm font-medium text-paper-700">Jump to</p>
          <ul className="flex flex-wrap gap-x-1 gap-y-1">
            {sectionLinks.map(([id, label]) => (
              <li key={id}>
                <a
                  href={`#${id}`}
                  className="inline-flex min-h-10 items-center rounded-md px-2 font-medium text-iris-700 underline underline-offset-4 hover:bg-paper-200"
                >
                  {label}
                </a>
              </li>
            ))}
          </ul>
        </nav>

        <DefinitionSections definition={definition} />
        <SourcesList sources={definition.sources} />
      </div>

      <ApproveDialog
        version={detail}
        open={dialog === 'approve'}
        onDismiss={() => setDialog(null)}
        onApproved={(saved) => {
          setDialog(null);
          setOutcome({
            text:
              saved.status === 'approved'
                ? `Your approval was recorded. Version ${saved.version} is now approved and can be used for orders.`
                : `Your approval was recorded (${saved.approvals.length} of ${approvalsNeeded}). A second, different person must approve too.`,
          });
        }}
      />
      <ConfirmDraftDialog
        from={
          dialog === 'draft'
            ? { key: detail.key, version: detail.version, title: definition.title }
            : null
        }
        busy={createDraft.isPending}
        error={createDraft.error}
        onDismiss={() => setDialog(null)}
        onConfirm={() =>
          createDraft.mutate(
            { key: detail.key, version: detail.version },
            {
              onSuccess: (draft) => {
                setDialog(null);
                setOutcome({
                  text: `Draft version ${draft.version} was made from version ${detail.version}.`,
                  link: {
                    to: paths.protocolVersion.getHref(draft.key, draft.version),
                    label: `Open draft version ${draft.version}`,
                  },
                });
              },
            },
          )
        }
      />
      <RetireDialog
        kind="discard"
        version={detail}
        open={dialog === 'discard'}
        onDismiss={() => setDialog(null)}
        onRetired={(saved) => {
          setDialog(null);
          setOutcome({
            text: `Draft ${saved.version} was discarded. It stays on record and can never be approved.`,
          });
        }}
      />
      <RetireDialog
        version={detail}
        open={dialog === 'retire'}
        onDismiss={() => setDialog(null)}
        onRetired={(saved) => {
          setDialog(null);
          setOutcome({
            text: `Version ${saved.version} is retired. New orders can no longer choose it.`,
          });
        }}
      />
    </>
  );
}
