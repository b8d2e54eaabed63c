import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { protocolKinds } from '../../../../shared/protocol/protocol-schema';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import {
  AlertIcon,
  CheckCircleIcon,
  ProtocolBookIcon,
  ReloadIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import type { VersionDetail, VersionSummary } from '../api/protocol-response-schemas';
import { protocolQueries } from '../api/protocol-queries';
import { useCreateDraft } from '../hooks/use-create-draft';
import { ConfirmDraftDialog } from './confirm-draft-dialog';
import { ImportVersionForm } from './import-version-form';
import { ProtocolCard } from './protocol-card';
import { ProtocolCaution } from './protocol-caution';
import { kindLabels } from './protocol-labels';

type ProtocolsScreenProps = {
  /** Import a file, start drafts (administrators). */
  canManage: boolean;
};

type Outcome = { text: string; version: VersionDetail };

export function ProtocolsScreen({ canManage }: ProtocolsScreenProps) {
  const protocolsQuery = useQuery(protocolQueries.list());
  const createDraft = useCreateDraft();
  const [draftingFrom, setDraftingFrom] = useState<VersionSummary | null>(null);
  const [outcome, setOutcome] = useState<Outcome | null>(null);

  // Asked first: a draft takes the next version number for good.
  const askDraft = (from: VersionSummary) => {
    setOutcome(null);
    createDraft.reset();
    setDraftingFrom(from);
  };
  const startDraft = (from: VersionSummary) => {
    createDraft.mutate(
      { key: from.key, version: from.version },
      {
        onSuccess: (draft) => {
          setOutcome({
            text: `Draft version ${draft.version} of ${draft.title} was made from version ${from.version}.`,
            version: draft,
          });
          setDraftingFrom(null);
        },
      },
    );
  };

  return (
    <>
      <PageHeader
        title="Protocols"
        lead="Every protocol version the unit can order with, and the drafts on their way to approval. Open a version to see each figure and its source."
      />
      <ProtocolCaution className="mb-6" />

      {/* Kept in the page at all times so screen readers announce each outcome as it changes. */}
      <div role="status" className={outcome ? 'mb-6' : 'sr-only'}>
        {outcome && (
          <p className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-lg border border-iris-200 bg-iris-50 px-4 py-3 font-medium text-iris-900">
            <CheckCircleIcon className="size-5" />
            <span>{outcome.text}</span>
            <Link
              className="text-iris-800 underline underline-offset-4"
              to={paths.protocolVersion.getHref(outcome.version.key, outcome.version.version)}
            >
              Open draft version {outcome.version.version}
            </Link>
          </p>
        )}
      </div>
      <ConfirmDraftDialog
        from={draftingFrom}
        busy={createDraft.isPending}
        error={createDraft.error}
        onConfirm={() => draftingFrom && startDraft(draftingFrom)}
        onDismiss={() => {
          createDraft.reset();
          setDraftingFrom(null);
        }}
      />

      {protocolsQuery.isPending ? (
        <LoadingPanel label="Loading protocols…" />
      ) : protocolsQuery.isError && !protocolsQuery.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="The protocols could not be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={protocolsQuery.isFetching}
              onClick={() => void protocolsQuery.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(protocolsQuery.error)}</p>
        </StatusPanel>
      ) : protocolsQuery.data.length === 0 ? (
        <StatusPanel icon={<ProtocolBookIcon className="size-6" />} title="No protocols yet">
          <p>
            {canManage
              ? 'Import the first version with the form below.'
              : 'An administrator imports protocol versions.'}
          </p>
        </StatusPanel>
      ) : (
        <div className="space-y-10">
          {protocolsQuery.isError && (
            <Alert tone="error" title="The list may be out of date">
              {describeError(protocolsQuery.error)}
            </Alert>
          )}
          {protocolKinds.map((kind) => {
            const ofKind = protocolsQuery.data.filter((protocol) => protocol.kind === kind);
            if (ofKind.length === 0) return null;
            return (
              <section key={kind} aria-labelledby={`kind-${kind}`} className="space-y-4">
                <h2 id={`kind-${kind}`} className="text-xl font-semibold text-paper-900">
                  {kindLabels[kind].short}{' '}
                  <span className="font-normal text-paper-700">— {kindLabels[kind].long}</span>
                </h2>
                {ofKind.map((protocol) => (
                  <ProtocolCard
                    key={protocol.key}
                    protocol={protocol}
                    canDraft={canManage}
                    draftingFrom={createDraft.isPending ? draftingFrom : null}
                    onStartDraft={askDraft}
                  />
                ))}
              </section>
            );
          })}
        </div>
      )}

      {canManage && (
        <div className="mt-10">
          <ImportVersionForm
            onImported={(version) =>
              setOutcome({
                text: `${version.title}, version ${version.version}, was imported as a draft.`,
                version,
              })
            }
          />
        </div>
      )}
    </>
  );
}
