import type { ReactNode } from 'react';
import { SortIcon } from './icons';

type SortableHeaderProps = {
  /** Whether this column can be sorted; a column that cannot gets no button and no aria-sort. */
  canSort: boolean;
  sorted: 'asc' | 'desc' | false;
  onToggleSort?: (event: unknown) => void;
  className?: string;
  children: ReactNode;
};

/**
 * One column header. A sortable one is a real button (reachable by keyboard, with the page's
 * focus ring) and tells assistive technology its order through aria-sort on the header cell.
 */
export function SortableHeader({
  canSort,
  sorted,
  onToggleSort,
  className = '',
  children,
}: SortableHeaderProps) {
  return (
    <th
      scope="col"
      aria-sort={
        canSort
          ? sorted === 'asc'
            ? 'ascending'
            : sorted === 'desc'
              ? 'descending'
              : 'none'
          : undefined
      }
      className={`px-3 py-2 font-semibold first:pl-4 last:pr-4 ${className}`}
    >
      {canSort ? (
        <button
          type="button"
          onClick={onToggleSort}
          className="-mx-2 inline-flex min-h-10 items-center gap-1 rounded-md px-2 text-left hover:bg-paper-200"
        >
          {children}
          <SortIcon sortOrder={sorted} className="size-4" />
        </button>
      ) : (
        children
      )}
    </th>
  );
}
