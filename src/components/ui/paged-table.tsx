import { useMemo, type ReactNode } from 'react';
import {
  functionalUpdate,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type ColumnDef,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { SortableHeader } from './sortable-header';
import { pageRange, TablePager, type PageRange, type PagerWords } from './table-pager';

/**
 * The table features a server-paged list uses. Only sorting: the server sorts and pages, and the
 * table shows the one page it was given, so TanStack's own paging would have nothing to do.
 * Columns for a PagedTable are made with `createColumnHelper<PagedTableFeatures, Row>()`.
 */
export const pagedTableFeatures = tableFeatures({ rowSortingFeature });
export type PagedTableFeatures = typeof pagedTableFeatures;

/** The part of a list's address that says which page, in which order. */
export type PageAndSort<TSort extends string> = {
  sort: TSort;
  direction: 'asc' | 'desc';
  page: number;
  pageSize: number;
};

type PagedTableProps<TRow extends RowData, TSort extends string> = {
  // Each column's value has its own type; TanStack Table's own examples type the list this way.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ReadonlyArray<ColumnDef<PagedTableFeatures, TRow, any>>;
  rows: TRow[];
  getRowId: (row: TRow) => string;
  total: number;
  paging: PageAndSort<TSort>;
  /** The columns the server can sort by; only these get a sort button. */
  sortKeys: readonly TSort[];
  onChange: (changes: Partial<PageAndSort<TSort>>) => void;
  busy: boolean;
  caption: (range: PageRange) => ReactNode;
  pagerWords: PagerWords;
  perPageClassName?: string;
  /** A click on the row (outside its links and buttons); the row's own link stays the keyboard's way in. */
  onRowClick?: (row: TRow) => void;
};

/**
 * One page of a list that the server sorts and pages: sortable column headers, the rows, and a
 * pager under them. The table only asks for another order or page through `onChange`.
 */
export function PagedTable<TRow extends RowData, TSort extends string>({
  columns,
  rows,
  getRowId,
  total,
  paging,
  sortKeys,
  onChange,
  busy,
  caption,
  pagerWords,
  perPageClassName,
  onRowClick,
}: PagedTableProps<TRow, TSort>) {
  const sorting = useMemo<SortingState>(
    () => [{ id: paging.sort, desc: paging.direction === 'desc' }],
    [paging.sort, paging.direction],
  );
  const isSortKey = (id: string): id is TSort => (sortKeys as readonly string[]).includes(id);

  const table = useTable({
    features: pagedTableFeatures,
    columns,
    data: rows,
    getRowId,
    manualSorting: true,
    enableSortingRemoval: false,
    state: { sorting },
    onSortingChange: (updater) => {
      const [next] = functionalUpdate(updater, sorting);
      if (next && isSortKey(next.id))
        onChange({ sort: next.id, direction: next.desc ? 'desc' : 'asc' });
    },
  });

  return (
    <div className="space-y-3">
      {/* aria-busy sits on the table's parent: tests and assistive technology read it there. */}
      <div
        className="relative overflow-x-auto rounded-2xl border border-paper-200 bg-white"
        aria-busy={busy || undefined}
      >
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">
            {caption(pageRange(paging.page, paging.pageSize, total))}
          </caption>
          <thead className="bg-paper-100 text-sm text-paper-700">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => (
                  <SortableHeader
                    key={header.id}
                    canSort={
                      !header.isPlaceholder &&
                      header.column.getCanSort() &&
                      isSortKey(header.column.id)
                    }
                    sorted={header.column.getIsSorted()}
                    onToggleSort={header.column.getToggleSortingHandler()}
                  >
                    {header.isPlaceholder ? null : <table.FlexRender header={header} />}
                  </SortableHeader>
                ))}
              </tr>
            ))}
          </thead>
          <tbody className={busy ? 'opacity-60' : ''}>
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                onClick={
                  onRowClick &&
                  ((event) => {
                    if ((event.target as HTMLElement).closest('a, button')) return;
                    onRowClick(row.original);
                  })
                }
                className={`border-t border-paper-200 align-top hover:bg-paper-50 ${onRowClick ? 'cursor-pointer' : ''}`}
              >
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-3 first:pl-4 last:pr-4">
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <TablePager
        words={pagerWords}
        page={paging.page}
        pageSize={paging.pageSize}
        total={total}
        perPageClassName={perPageClassName}
        onPage={(page) => onChange({ page })}
        onPageSize={(pageSize) => onChange({ pageSize })}
      />
    </div>
  );
}
