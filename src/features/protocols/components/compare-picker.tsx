import { useQuery } from '@tanstack/react-query';
import { useId, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { SideBySideIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import { protocolQueries } from '../api/protocol-queries';

const statusWords = {
  draft: 'draft',
  approved: 'approved',
  retired: 'retired',
  discarded: 'discarded',
} as const;

/** Chooses another version of the same protocol and opens the two side by side. */
export function ComparePicker({ protocolKey, version }: { protocolKey: string; version: number }) {
  const protocols = useQuery(protocolQueries.list());
  const navigate = useNavigate();
  const id = useId();
  const others =
    protocols.data
      ?.find((p) => p.key === protocolKey)
      ?.versions.filter((v) => v.version !== version) ?? [];
  const [chosen, setChosen] = useState<string>('');
  const selected = chosen || (others.at(-1) ? String(others.at(-1)?.version) : '');

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    const other = Number(selected);
    if (!Number.isInteger(other)) return;
    navigate(
      paths.protocolCompare.getHref(
        protocolKey,
        Math.min(version, other),
        Math.max(version, other),
      ),
    );
  };

  if (protocols.isPending)
    return <p className="text-sm text-paper-700">Loading the other versions…</p>;
  if (protocols.isError)
    return (
      <p className="text-sm text-paper-800">
        The other versions could not be loaded: {describeError(protocols.error)}
      </p>
    );
  if (others.length === 0)
    return (
      <p className="text-sm text-paper-700">
        This is the only version of this protocol, so there is nothing to compare it with yet.
      </p>
    );

  return (
    <form onSubmit={onSubmit} className="flex flex-wrap items-end gap-3">
      <div className="flex flex-col gap-1.5">
        <label htmlFor={id} className="font-medium text-paper-900">
          Compare with…
        </label>
        <select
          id={id}
          value={selected}
          onChange={(event) => setChosen(event.target.value)}
          className="min-h-tap rounded-lg border border-paper-500 bg-white px-3 py-2 text-paper-950"
        >
          {others.map((other) => (
            <option key={other.version} value={other.version}>
              Version {other.version} ({statusWords[other.status]})
            </option>
          ))}
        </select>
      </div>
      <Button type="submit" variant="secondary" icon={<SideBySideIcon />}>
        Compare side by side
      </Button>
    </form>
  );
}
