import { useMemo } from 'react';
import {
  createColumnHelper,
  createSortedRowModel,
  rowSortingFeature,
  sortFn_basic,
  sortFn_text,
  tableFeatures,
  useTable,
} from '@tanstack/react-table';
import { roleLabels } from '../../../../shared/roles';
import type { Person } from '../../../../shared/schemas/people';
import { Button } from '../../../components/ui/button';
import { PencilIcon } from '../../../components/ui/icons';
import { SortableHeader } from '../../../components/ui/sortable-header';
import { PersonStatus } from './person-status';

const features = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { text: sortFn_text, basic: sortFn_basic },
});

const helper = createColumnHelper<typeof features, Person>();

type PeopleTableProps = {
  people: Person[];
  currentUserId: number;
  onEdit: (person: Person) => void;
  onChangeStatus: (person: Person) => void;
  onSendLink: (person: Person) => void;
  onEndSessions: (person: Person) => void;
};

export function PeopleTable({
  people,
  currentUserId,
  onEdit,
  onChangeStatus,
  onSendLink,
  onEndSessions,
}: PeopleTableProps) {
  // Columns close over the action callbacks; the parent passes state setters, so this stays stable.
  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('displayName', {
          header: 'Name',
          sortFn: 'text',
          cell: ({ row }) => (
            <span className="font-medium text-paper-950">
              {row.original.displayName}
              {row.original.id === currentUserId && (
                <span className="ml-2 text-sm font-normal text-paper-600">(you)</span>
              )}
            </span>
          ),
        }),
        helper.accessor('email', {
          header: 'E-mail',
          sortFn: 'text',
          cell: ({ getValue }) => <span className="[overflow-wrap:anywhere]">{getValue()}</span>,
        }),
        helper.accessor((person) => person.roles.map((role) => roleLabels[role]).join(', '), {
          id: 'roles',
          header: 'Roles',
          enableSorting: false,
          cell: ({ row }) => (
            <>
              <ul className="flex flex-wrap gap-1.5">
                {row.original.roles.map((role) => (
                  <li
                    key={role}
                    className="rounded-md bg-paper-100 px-2 py-0.5 text-sm text-paper-800"
                  >
                    {roleLabels[role]}
                  </li>
                ))}
              </ul>
              {row.original.pendingRoleRequest && (
                <p className="mt-1 text-sm text-paper-700">
                  Waiting for approval:{' '}
                  {row.original.pendingRoleRequest.roles.map((role) => roleLabels[role]).join(', ')}
                </p>
              )}
            </>
          ),
        }),
        helper.accessor('active', {
          header: 'Status',
          sortFn: 'basic',
          cell: ({ row }) => (
            <>
              <PersonStatus active={row.original.active} />
              {!row.original.accountReady && (
                <p className="mt-1 text-sm text-paper-700">Password not set yet</p>
              )}
            </>
          ),
        }),
        helper.display({
          id: 'actions',
          header: () => <span className="sr-only sm:not-sr-only">Actions</span>,
          cell: ({ row }) => {
            const person = row.original;
            return (
              <div className="grid grid-cols-[auto_auto] justify-end gap-2">
                <Button
                  variant="secondary"
                  size="sm"
                  icon={<PencilIcon className="size-4" />}
                  aria-label={`Edit ${person.displayName}`}
                  onClick={() => onEdit(person)}
                >
                  Edit
                </Button>
                <Button
                  variant="secondary"
                  size="sm"
                  aria-label={`${person.active ? 'Deactivate' : 'Reactivate'} ${person.displayName}`}
                  onClick={() => onChangeStatus(person)}
                >
                  {person.active ? 'Deactivate' : 'Reactivate'}
                </Button>
                {person.active && (
                  <Button
                    variant="secondary"
                    size="sm"
                    aria-label={`Send password link to ${person.displayName}`}
                    onClick={() => onSendLink(person)}
                  >
                    Send password link
                  </Button>
                )}
                <Button
                  variant="secondary"
                  size="sm"
                  aria-label={`Sign out everywhere: ${person.displayName}`}
                  onClick={() => onEndSessions(person)}
                >
                  Sign out everywhere
                </Button>
              </div>
            );
          },
        }),
      ]),
    [currentUserId, onEdit, onChangeStatus, onSendLink, onEndSessions],
  );

  const table = useTable({
    features,
    columns,
    data: people,
    getRowId: (person) => String(person.id),
    initialState: { sorting: [{ id: 'displayName', desc: false }] },
    enableSortingRemoval: false,
  });

  return (
    <div className="overflow-x-auto rounded-2xl border border-paper-200 bg-white">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">
          Staff accounts, {people.length} in all. Column headers with a button sort the list.
        </caption>
        <thead className="bg-paper-100 text-sm text-paper-700">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <SortableHeader
                  key={header.id}
                  canSort={!header.isPlaceholder && header.column.getCanSort()}
                  sorted={header.column.getIsSorted()}
                  onToggleSort={header.column.getToggleSortingHandler()}
                  className={header.column.id === 'actions' ? 'text-right print:hidden' : ''}
                >
                  {header.isPlaceholder ? null : <table.FlexRender header={header} />}
                </SortableHeader>
              ))}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr
              key={row.id}
              className={`border-t border-paper-200 align-middle ${row.original.active ? '' : 'bg-paper-50 text-paper-700'}`}
            >
              {row.getAllCells().map((cell) => (
                <td
                  key={cell.id}
                  className={`px-3 py-3 first:pl-4 last:pr-4 ${cell.column.id === 'actions' ? 'print:hidden' : ''}`}
                >
                  <table.FlexRender cell={cell} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
