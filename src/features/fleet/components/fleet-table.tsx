import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { FLEET_SORTS, type FleetRowDto, type FleetSort } from '../../../../shared/schemas/fleet';
import { cx } from '../../../components/ui/cx';
import { Flag, ScoreBadge } from './band-badge';
import { fmtContainer, fmtDay, fmtPct, fmtTonnes } from '../../../lib/format';
import { paths } from '../../../config/paths';
import { nextSort } from '../utils/first-sort';

const col = createColumnHelper<FleetRowDto>();

export const SORT_LABELS: Record<FleetSort, string> = {
  score: 'Repeat-leak score',
  rate: 'Rolling leak rate',
  forecast: 'Next top-up',
  leakCheck: 'Next leak check',
  pti: 'PTI valid until',
  containerNumber: 'Container number',
  co2e: 'Charge in t CO2e',
};

const columns = [
  col.accessor('containerNumber', {
    id: 'containerNumber',
    header: 'Unit',
    cell: (c) => (
      <span className="flex flex-col">
        <Link
          to={paths.unit.getHref(c.row.original.unitId)}
          className="inline-flex min-h-touch items-center self-start text-lg font-bold tracking-wide text-fjord-700 underline-offset-4 hover:underline md:text-base"
          data-testid="fleet-unit-link"
        >
          {fmtContainer(c.getValue())}
        </Link>
        <span className="text-sm text-ink-600">
          {c.row.original.site?.name ?? 'No site'} ·{' '}
          <span className="whitespace-nowrap">{c.row.original.refrigerant}</span>
          {c.row.original.status !== 'in_service' &&
            ` · ${c.row.original.status === 'retired' ? 'Retired' : 'Out of service'}`}
        </span>
      </span>
    ),
  }),
  col.accessor('score', {
    id: 'score',
    header: 'Score',
    cell: (c) => <ScoreBadge score={c.getValue()} band={c.row.original.scoreBand} className="self-start" />,
  }),
  col.accessor('rollingLeakRatePct', {
    id: 'rate',
    header: 'Leak rate (365 d)',
    cell: (c) => <span className="tabular-nums">{fmtPct(c.getValue())}</span>,
  }),
  col.accessor('forecastDate', {
    id: 'forecast',
    header: 'Next top-up',
    cell: (c) =>
      c.getValue() ? (
        <span className="flex flex-col">
          <span className="whitespace-nowrap tabular-nums">{fmtDay(c.getValue())}</span>
          {c.row.original.forecastOverdue && <Flag tone="alarm">overdue</Flag>}
        </span>
      ) : (
        <span className="text-ink-600">no leak evidence</span>
      ),
  }),
  col.accessor('nextLeakCheckDue', {
    id: 'leakCheck',
    header: 'Leak check due',
    cell: (c) =>
      c.getValue() ? (
        <span className="flex flex-col">
          <span className="whitespace-nowrap tabular-nums">{fmtDay(c.getValue())}</span>
          {c.row.original.leakCheckOverdue && <Flag tone="alarm">overdue</Flag>}
        </span>
      ) : (
        <span className="text-ink-600">none required</span>
      ),
  }),
  col.accessor('ptiValidUntil', {
    id: 'pti',
    header: 'PTI',
    cell: (c) =>
      c.row.original.ptiValid ? (
        <span className="flex flex-col">
          <Flag tone="okay">valid</Flag>
          <span className="text-sm whitespace-nowrap tabular-nums text-ink-700">to {fmtDay(c.getValue())}</span>
        </span>
      ) : (
        <span className="flex flex-col">
          <Flag tone="heed">{c.getValue() ? 'expired' : 'none valid'}</Flag>
          {c.getValue() && (
            <span className="text-sm whitespace-nowrap tabular-nums text-ink-700">{fmtDay(c.getValue())}</span>
          )}
        </span>
      ),
  }),
  col.accessor('co2eTonnes', {
    id: 'co2e',
    header: 'CO2e',
    cell: (c) => <span className="whitespace-nowrap tabular-nums">{fmtTonnes(c.getValue())}</span>,
  }),
];

const sortable = new Set<string>(FLEET_SORTS);

type Props = {
  rows: FleetRowDto[];
  sort: FleetSort;
  dir: 'asc' | 'desc';
  onSort: (sort: FleetSort, dir: 'asc' | 'desc') => void;
  busy?: boolean;
};

/**
 * The fleet table (server-side sorting and paging: TanStack Table in manual mode). One <table>, restyled as cards
 * below `md`, so tests and screen readers find one set of rows at every width.
 */
export function FleetTable({ rows, sort, dir, onSort, busy }: Props) {
  const sorting: SortingState = [{ id: sort, desc: dir === 'desc' }];
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
    getRowId: (r) => String(r.unitId),
  });

  return (
    <table
      role="table"
      aria-label="Fleet"
      aria-busy={busy || undefined}
      className={cx(
        'block w-full md:table md:rounded-lg md:border-2 md:border-ink-200 md:bg-white',
        busy && 'opacity-70',
      )}
    >
      <thead role="rowgroup" className="sr-only md:not-sr-only md:table-header-group md:bg-ink-50">
        {table.getHeaderGroups().map((hg) => (
          <tr role="row" key={hg.id}>
            {hg.headers.map((h) => {
              const id = h.column.id as FleetSort;
              const active = sort === id;
              const canSort = sortable.has(id);
              return (
                <th
                  key={h.id}
                  role="columnheader"
                  scope="col"
                  aria-sort={active ? (dir === 'asc' ? 'ascending' : 'descending') : undefined}
                  className="border-b-2 border-ink-200 px-3 py-2 text-left text-sm font-semibold text-ink-700"
                >
                  {canSort ? (
                    <button
                      type="button"
                      className={cx(
                        'inline-flex min-h-touch items-center gap-1 rounded-sm text-left',
                        active && 'text-fjord-900',
                      )}
                      onClick={() => onSort(id, nextSort(id, { sort, dir }))}
                    >
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      <span aria-hidden="true" className={cx('text-xs', !active && 'text-ink-300')}>
                        {active ? (dir === 'asc' ? '▲' : '▼') : '↕'}
                      </span>
                      <span className="sr-only">
                        {active ? `, sorted ${dir === 'asc' ? 'ascending' : 'descending'}` : ', sort'}
                      </span>
                    </button>
                  ) : (
                    flexRender(h.column.columnDef.header, h.getContext())
                  )}
                </th>
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody role="rowgroup" className="flex flex-col gap-3 md:table-row-group">
        {table.getRowModel().rows.map((row) => (
          <tr
            role="row"
            key={row.id}
            data-testid="fleet-row"
            data-unit-id={row.original.unitId}
            className="grid grid-cols-2 gap-x-4 gap-y-3 rounded-lg border-2 border-ink-200 bg-white p-4 shadow-raised md:table-row md:rounded-none md:border-0 md:p-0 md:shadow-none md:hover:bg-fjord-50/40"
          >
            {row.getVisibleCells().map((cell) => (
              <td
                role="cell"
                key={cell.id}
                className={cx(
                  'flex min-w-0 flex-col gap-1 md:table-cell md:border-b md:border-ink-200 md:px-3 md:py-2.5 md:align-middle',
                  cell.column.id === 'containerNumber' && 'col-span-2',
                )}
              >
                {cell.column.id !== 'containerNumber' && (
                  <span
                    aria-hidden="true"
                    className="text-xs font-semibold tracking-wide text-ink-600 uppercase md:hidden"
                  >
                    {String(cell.column.columnDef.header)}
                  </span>
                )}
                {flexRender(cell.column.columnDef.cell, cell.getContext())}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
