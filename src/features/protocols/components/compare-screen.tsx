import { useQuery } from '@tanstack/react-query';
import { useId, useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import {
  compareProtocolVersions,
  type JsonLeaf,
  type ProtocolComparisonRow,
} from '../../../../shared/protocol/diff-versions';
import { roleLabels } from '../../../../shared/roles';
import { Button } from '../../../components/ui/button';
import { Checkbox } from '../../../components/ui/checkbox';
import {
  AlertIcon,
  ArrowLeftIcon,
  EqualsIcon,
  ReloadIcon,
  SideBySideIcon,
} from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { protocolQueries } from '../api/protocol-queries';
import { ChangeBadge } from './change-badge';
import {
  describeProtocolPath,
  formatProtocolValue,
  type DescribedPath,
} from './protocol-field-labels';
import { formatDate, formatDateTime } from './protocol-labels';
import { ProtocolCaution } from './protocol-caution';
import { VersionStatusBadge } from './version-status-badge';

type CompareScreenProps = { protocolKey: string; from: number; to: number };

export function CompareScreen({ protocolKey, from, to }: CompareScreenProps) {
  const before = useQuery(protocolQueries.version({ key: protocolKey, version: from }));
  const after = useQuery(protocolQueries.version({ key: protocolKey, version: to }));

  const back = (
    <Link
      to={paths.protocolVersion.getHref(protocolKey, to)}
      className="mb-4 inline-flex items-center gap-2 rounded font-medium text-iris-700 underline-offset-4 hover:underline"
    >
      <ArrowLeftIcon className="size-4" />
      Back to version {to}
    </Link>
  );

  if (before.isPending || after.isPending) {
    return (
      <>
        {back}
        <LoadingPanel label={`Loading versions ${from} and ${to} of ${protocolKey}…`} />
      </>
    );
  }
  const failed = [before, after].find((q) => q.isError && !q.data);
  if (failed || !before.data || !after.data) {
    return (
      <>
        {back}
        <StatusPanel
          role="alert"
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title="The two versions could not both be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={before.isFetching || after.isFetching}
              onClick={() => {
                void before.refetch();
                void after.refetch();
              }}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(failed?.error)}</p>
        </StatusPanel>
      </>
    );
  }
  return (
    <>
      {back}
      <Comparison before={before.data} after={after.data} />
    </>
  );
}

function Comparison({ before, after }: { before: VersionDetail; after: VersionDetail }) {
  const [showAll, setShowAll] = useState(false);
  // Who approved is not content: it is listed by name below each side, never diffed as values
  // (a version approved here has no approval block in its file, which read as "Removed").
  const rows = useMemo(
    () =>
      compareProtocolVersions(before.definition, after.definition).filter(
        (row) => !/^approval(?:\.|$)/.test(row.path),
      ),
    [before.definition, after.definition],
  );
  const differing = rows.filter((row) => row.change !== 'unchanged');
  const shown = showAll ? rows : differing;
  const count = (change: ProtocolComparisonRow['change']) =>
    rows.filter((row) => row.change === change).length;

  return (
    <>
      <PageHeader
        title={`Compare ${after.definition.title}: version ${before.version} with version ${after.version}`}
        lead="Every value of the two definitions, named as on the version page. Lists are compared item by item, so a step added in the middle shows every later step as changed."
      />
      <ProtocolCaution className="mb-5" />
      <div className="mb-5 flex flex-wrap items-end justify-between gap-4 rounded-2xl border border-paper-200 bg-white p-5">
        <dl className="flex flex-wrap gap-x-8 gap-y-2">
          <SideFact label="Before" version={before} />
          <SideFact label="After" version={after} />
        </dl>
        <div className="grid w-full gap-4 sm:grid-cols-2">
          <Approvers version={before} />
          <Approvers version={after} />
        </div>
        <VersionChooser protocolKey={after.key} from={before.version} to={after.version} />
      </div>

      <p role="status" className="mb-3 text-paper-900">
        {differing.length === 0
          ? 'The two definitions are identical, value for value.'
          : `${differing.length} ${differing.length === 1 ? 'value differs' : 'values differ'}: ${count('changed')} changed, ${count('added')} added, ${count('removed')} removed. ${count('unchanged')} are the same.`}
      </p>
      <Checkbox
        label="Show the values that are the same too"
        checked={showAll}
        onChange={(event) => setShowAll(event.target.checked)}
        className="mb-3 max-w-md"
      />

      {shown.length === 0 ? (
        <StatusPanel icon={<EqualsIcon className="size-6" />} title="No differences">
          <p>Tick the box above to see every value of both versions.</p>
        </StatusPanel>
      ) : (
        <DifferenceTable rows={shown} before={before.version} after={after.version} />
      )}
    </>
  );
}

function SideFact({ label, version }: { label: string; version: VersionDetail }) {
  return (
    <div>
      <dt className="text-sm font-medium text-paper-700">{label}</dt>
      <dd className="flex items-center gap-2 font-semibold text-paper-950">
        <Link
          className="text-iris-700 underline underline-offset-4"
          to={paths.protocolVersion.getHref(version.key, version.version)}
        >
          Version {version.version}
        </Link>
        <VersionStatusBadge status={version.status} supersededBy={version.supersededBy} />
      </dd>
    </div>
  );
}

/** The people who approved a version: in Luxtempo by name, or for a shipped file the names it records. */
function Approvers({ version }: { version: VersionDetail }) {
  const fileApproval = version.definition.approval;
  return (
    <section
      aria-label={`Approvals of version ${version.version}`}
      className="text-sm text-paper-900"
    >
      <h2 className="font-medium text-paper-700">Approved by (version {version.version})</h2>
      {version.approvals.length > 0 ? (
        <ul className="mt-1 space-y-0.5">
          {version.approvals.map((approval) => (
            <li key={`${approval.userId}-${approval.approvedAt}`}>
              <span className="font-medium text-paper-950">
                {approval.displayName ?? `Person #${approval.userId}`}
              </span>
              , as {roleLabels[approval.approvedAs].toLowerCase()},{' '}
              {formatDateTime(approval.approvedAt)}
            </li>
          ))}
        </ul>
      ) : fileApproval ? (
        <p className="mt-1">
          <span className="font-medium text-paper-950">
            {fileApproval.approvedBy.join(' and ')}
          </span>
          , {formatDate(fileApproval.approvedOn)} (recorded in the shipped file)
        </p>
      ) : (
        <p className="mt-1 text-paper-700">
          {version.status === 'draft' ? 'Not approved yet.' : 'No approvals are recorded.'}
        </p>
      )}
    </section>
  );
}

function VersionChooser({
  protocolKey,
  from,
  to,
}: {
  protocolKey: string;
  from: number;
  to: number;
}) {
  const protocols = useQuery(protocolQueries.list());
  const navigate = useNavigate();
  const fromId = useId();
  const toId = useId();
  const [pick, setPick] = useState({ from: String(from), to: String(to) });
  const versions = protocols.data?.find((p) => p.key === protocolKey)?.versions ?? [];
  if (versions.length < 2) return null;
  const select = (id: string, label: string, value: string, onChange: (value: string) => void) => (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="text-sm font-medium text-paper-900">
        {label}
      </label>
      <select
        id={id}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="min-h-tap rounded-lg border border-paper-500 bg-white px-3 py-2 text-paper-950"
      >
        {versions.map((v) => (
          <option key={v.version} value={v.version}>
            Version {v.version}
          </option>
        ))}
      </select>
    </div>
  );
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        navigate(paths.protocolCompare.getHref(protocolKey, pick.from, pick.to));
      }}
    >
      {select(fromId, 'Before', pick.from, (value) => setPick((p) => ({ ...p, from: value })))}
      {select(toId, 'After', pick.to, (value) => setPick((p) => ({ ...p, to: value })))}
      <Button type="submit" variant="secondary" icon={<SideBySideIcon />}>
        Compare these
      </Button>
    </form>
  );
}

function Leaf({ value, shown }: { value: JsonLeaf | undefined; shown: DescribedPath['shown'] }) {
  if (value === undefined) return <span className="text-paper-600 italic">not present</span>;
  if (value === null)
    return <span className="text-paper-600 italic">{formatProtocolValue(value)}</span>;
  if (typeof value === 'number')
    return <span className="numerals-steady">{formatProtocolValue(value, shown)}</span>;
  return <span>{formatProtocolValue(value, shown)}</span>;
}

function DifferenceTable({
  rows,
  before,
  after,
}: {
  rows: ProtocolComparisonRow[];
  before: number;
  after: number;
}) {
  return (
    <div className="overflow-x-auto rounded-2xl border border-paper-200 bg-white">
      <table className="w-full table-fixed border-collapse text-left">
        <caption className="sr-only">
          Values of version {before} and version {after}, one row per field
        </caption>
        <colgroup>
          <col className="w-32" />
          <col className="w-[28%]" />
          <col />
          <col />
        </colgroup>
        <thead className="bg-paper-100 text-sm text-paper-700">
          <tr>
            <th scope="col" className="px-3 py-2 pl-4 font-semibold">
              Change
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Field
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Version {before} (before)
            </th>
            <th scope="col" className="px-3 py-2 pr-4 font-semibold">
              Version {after} (after)
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => {
            const field = describeProtocolPath(row.path);
            return (
              <tr
                key={row.path}
                className={`border-t border-paper-200 align-top ${row.change === 'unchanged' ? 'text-paper-700' : 'bg-paper-50'}`}
              >
                <td className="px-3 py-2 pl-4">
                  <ChangeBadge change={row.change} />
                </td>
                <th
                  scope="row"
                  className="px-3 py-2 font-normal [overflow-wrap:anywhere] text-paper-900"
                >
                  <span className="block text-sm text-paper-700">{field.section}</span>
                  <span className="block font-medium">{field.label}</span>
                </th>
                <td className="px-3 py-2 [overflow-wrap:anywhere]">
                  <Leaf value={row.before} shown={field.shown} />
                </td>
                <td
                  className={`px-3 py-2 pr-4 [overflow-wrap:anywhere] ${row.change !== 'unchanged' ? 'font-medium text-paper-950' : ''}`}
                >
                  <Leaf value={row.after} shown={field.shown} />
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
