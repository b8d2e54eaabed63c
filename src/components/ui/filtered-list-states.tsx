import type { UseQueryResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { describeError, isApiRequestError } from '../../lib/api-client';
import { Alert } from './alert';
import { Button } from './button';
import { AlertIcon, ReloadIcon } from './icons';
import { LoadingPanel, StatusPanel } from './status-panel';

/** The server's 400 for a list's filter, as the filter field each problem belongs to. */
export function filterProblems(error: unknown): Record<string, string> {
  if (!isApiRequestError(error) || error.status !== 400) return {};
  return Object.fromEntries(error.fields.map((f) => [f.path.split('.')[0] ?? f.path, f.message]));
}

interface FilteredListStatesProps<T extends { total: number }> {
  list: UseQueryResult<T>;
  /** Whether the server refused the filter itself (its fields are then marked on the form). */
  refused: boolean;
  words: { loading: string; failed: string; stale: string };
  empty: { icon: ReactNode; title: string; body: ReactNode };
  /** The table, once there is a page to show. */
  children: (data: T) => ReactNode;
}

/**
 * What a filtered, server-paged list shows before and around its table: loading, a failure (or
 * a refused filter) with a way to try again, nothing found, and a warning when a refresh failed
 * but the last page is still on screen.
 */
export function FilteredListStates<T extends { total: number }>({
  list,
  refused,
  words,
  empty,
  children,
}: FilteredListStatesProps<T>) {
  if (list.isPending) return <LoadingPanel label={words.loading} />;
  if (list.isError && !list.data) {
    return (
      <StatusPanel
        role="alert"
        icon={<AlertIcon className="size-6" />}
        title={refused ? 'The server refused this filter' : words.failed}
        actions={
          <Button
            variant="secondary"
            icon={<ReloadIcon />}
            busy={list.isFetching}
            onClick={() => void list.refetch()}
          >
            Try again
          </Button>
        }
      >
        <p>{refused ? 'Correct the filters marked above.' : describeError(list.error)}</p>
      </StatusPanel>
    );
  }
  if (!list.data) return null;
  if (list.data.total === 0) {
    return (
      <StatusPanel icon={empty.icon} title={empty.title}>
        <p>{empty.body}</p>
      </StatusPanel>
    );
  }
  return (
    <>
      {list.isError && (
        <Alert tone="error" title={words.stale} className="mb-4">
          {describeError(list.error)}
        </Alert>
      )}
      {children(list.data)}
    </>
  );
}
