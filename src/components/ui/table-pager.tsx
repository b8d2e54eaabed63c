import { Button } from './button';
import { PageBackIcon, PageForwardIcon } from './icons';
import { SelectField } from './select-field';

/** Which rows of the whole list one page shows, counted from 1, and how many pages there are. */
export type PageRange = { first: number; last: number; total: number; pageCount: number };

export function pageRange(page: number, pageSize: number, total: number): PageRange {
  return {
    first: total === 0 ? 0 : (page - 1) * pageSize + 1,
    last: Math.min(total, page * pageSize),
    total,
    pageCount: Math.max(1, Math.ceil(total / pageSize)),
  };
}

/** What the pager calls the things it pages through, e.g. "Orders", "No orders", "Pages of orders". */
export type PagerWords = { navLabel: string; items: string; none: string; perPage: string };

type TablePagerProps = {
  words: PagerWords;
  page: number;
  pageSize: number;
  total: number;
  pageSizes?: readonly number[];
  /** Width of the page-size select, so its label stays on one line. */
  perPageClassName?: string;
  onPage: (page: number) => void;
  onPageSize: (pageSize: number) => void;
};

/** The row count, a page-size select and previous/next buttons under a server-paged table. */
export function TablePager({
  words,
  page,
  pageSize,
  total,
  pageSizes = [10, 25, 50, 100],
  perPageClassName = 'w-44',
  onPage,
  onPageSize,
}: TablePagerProps) {
  const { first, last, pageCount } = pageRange(page, pageSize, total);
  return (
    <nav aria-label={words.navLabel} className="flex flex-wrap items-end justify-between gap-4">
      <p role="status" className="text-paper-800">
        {total === 0 ? words.none : `${words.items} ${first}–${last} of ${total}`} · page {page} of{' '}
        {pageCount}
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <SelectField
          label={words.perPage}
          value={String(pageSize)}
          className={perPageClassName}
          onChange={(e) => onPageSize(Number(e.target.value))}
        >
          {pageSizes.map((size) => (
            <option key={size} value={size}>
              {size}
            </option>
          ))}
        </SelectField>
        <Button
          variant="secondary"
          icon={<PageBackIcon />}
          disabled={page <= 1}
          onClick={() => onPage(page - 1)}
        >
          Previous page
        </Button>
        <Button variant="secondary" disabled={page >= pageCount} onClick={() => onPage(page + 1)}>
          Next page
          <PageForwardIcon />
        </Button>
      </div>
    </nav>
  );
}
