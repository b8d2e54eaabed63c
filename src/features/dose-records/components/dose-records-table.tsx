import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { PrinterIcon } from '../../../components/ui/icons';
import { PagedTable, type PagedTableFeatures } from '../../../components/ui/paged-table';
import { paths } from '../../../config/paths';
import type { DoseRecordRow } from '../api/dose-record-schemas';
import { eyeWords, kindWords } from './dose-record-words';
import { DeviationCount, OutcomeLabel } from './outcome-label';
import {
  formatDurationS,
  formatFigure,
  formatUnitClock,
  formatUnitDate,
} from '../../../lib/unit-times';

const helper = createColumnHelper<PagedTableFeatures, DoseRecordRow>();
const sortKeys: readonly DoseRecordFilter['sort'][] = ['endedAt', 'fluence'];

function columnsFor(protocolTitle: (key: string) => string) {
  return helper.columns([
    helper.accessor('endedAt', {
      header: 'Ended',
      sortDescFirst: true,
      cell: ({ getValue }) => (
        <span className="numerals-steady whitespace-nowrap">
          {formatUnitDate(getValue())}
          <span className="block text-sm text-paper-700">{formatUnitClock(getValue())}</span>
        </span>
      ),
    }),
    helper.accessor('orderId', {
      header: 'Session',
      enableSorting: false,
      cell: ({ row }) => (
        <>
          <Link
            to={paths.order.getHref(row.original.orderId)}
            className="font-semibold whitespace-nowrap text-iris-700 underline underline-offset-4 hover:text-iris-900"
          >
            Order {row.original.orderId}
          </Link>
          <span className="block">{protocolTitle(row.original.protocolKey)}</span>
          <span className="block text-sm text-paper-600">
            {kindWords[row.original.kind]} v{row.original.protocolVersion} ·{' '}
            {row.original.recordNumber} · {eyeWords[row.original.eye]}
          </span>
        </>
      ),
    }),
    helper.accessor('outcome', {
      header: 'Outcome',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="flex flex-col gap-1">
          <OutcomeLabel outcome={row.original.outcome} />
          <DeviationCount count={row.original.deviationCount} />
        </span>
      ),
    }),
    helper.accessor('onTimeS', {
      header: 'Given',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="numerals-steady block text-sm whitespace-nowrap">
          {row.original.kind === 'pdt' ? (
            <>
              {formatFigure(row.original.doseMg, 'mg')} dose planned
              <span className="block">
                {formatFigure(row.original.volumeGivenMl, 'mL')} infused
              </span>
              <span className="block">light on {formatDurationS(row.original.onTimeS)}</span>
            </>
          ) : (
            <>
              riboflavin drops
              <span className="block">UV on {formatDurationS(row.original.onTimeS)}</span>
            </>
          )}
        </span>
      ),
    }),
    helper.accessor('deliveredFluenceJPerCm2', {
      id: 'fluence',
      header: 'Fluence',
      cell: ({ row }) => (
        <span className="numerals-steady block text-sm whitespace-nowrap">
          {formatFigure(row.original.plannedFluenceJPerCm2, 'J/cm²')} planned
          <strong className="block text-base font-semibold">
            {formatFigure(row.original.deliveredFluenceJPerCm2, 'J/cm²')} delivered
          </strong>
        </span>
      ),
    }),
    helper.display({
      id: 'print',
      header: () => <span className="sr-only">Print</span>,
      cell: ({ row }) => (
        <Link
          to={paths.doseRecordPrint.getHref(row.original.orderId)}
          className="inline-flex min-h-10 items-center gap-1.5 whitespace-nowrap text-iris-700 underline underline-offset-4 hover:text-iris-900"
        >
          <PrinterIcon className="size-4" />
          Print<span className="sr-only"> the dose record of order {row.original.orderId}</span>
        </Link>
      ),
    }),
  ]);
}

type DoseRecordsTableProps = {
  rows: DoseRecordRow[];
  total: number;
  filter: DoseRecordFilter;
  protocolTitle: (key: string) => string;
  onChange: (changes: Partial<DoseRecordFilter>) => void;
  busy: boolean;
};

/** One page of dose records. Sorting and paging are done by the server. */
export function DoseRecordsTable({
  rows,
  total,
  filter,
  protocolTitle,
  onChange,
  busy,
}: DoseRecordsTableProps) {
  const columns = useMemo(() => columnsFor(protocolTitle), [protocolTitle]);
  return (
    <PagedTable
      columns={columns}
      rows={rows}
      getRowId={(r) => String(r.orderId)}
      total={total}
      paging={filter}
      sortKeys={sortKeys}
      onChange={onChange}
      busy={busy}
      caption={({ first, last }) =>
        `Dose records ${first} to ${last} of ${total}. Column headers with a button sort the list.`
      }
      pagerWords={{
        navLabel: 'Pages of dose records',
        items: 'Records',
        none: 'No records',
        perPage: 'Records per page',
      }}
    />
  );
}
