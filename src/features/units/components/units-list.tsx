import { Link } from 'react-router-dom';
import { formatContainerNumber } from '../../../../shared/domain';
import type { UnitDto } from '../../../../shared/schemas/units';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { UnitStatusBadge } from './unit-status-badge';
import { fmtKg } from '../../../lib/format';

type Selection = {
  selected: ReadonlySet<number>;
  onToggle: (id: number) => void;
  onTogglePage: (ids: number[], on: boolean) => void;
};

/** The units found, as cards on phones and rows on wide screens; with a selection box each when labels can be printed. */
export function UnitsList({
  units,
  hrefOf,
  selection,
}: {
  units: UnitDto[];
  hrefOf: (id: number) => string;
  selection?: Selection;
}) {
  const pageIds = units.map((u) => u.id);
  const allOnPage = selection ? pageIds.every((id) => selection.selected.has(id)) : false;
  return (
    <div className="flex flex-col gap-2">
      {selection && (
        <label className="flex min-h-touch cursor-pointer items-center gap-3 self-start rounded-md px-2 text-base font-semibold">
          <input
            type="checkbox"
            className="size-6 accent-fjord-700"
            checked={allOnPage}
            onChange={(e) => selection.onTogglePage(pageIds, e.target.checked)}
          />
          Select all on this page
        </label>
      )}
      <ul className="flex flex-col gap-2" aria-label="Units">
        {units.map((u) => (
          <li
            key={u.id}
            data-testid="unit-row"
            data-container-number={u.containerNumber}
            className={cx(
              'flex items-stretch rounded-lg border-2 bg-white',
              selection?.selected.has(u.id) ? 'border-fjord-700' : 'border-ink-200',
            )}
          >
            {selection && (
              <label className="flex w-14 shrink-0 cursor-pointer items-center justify-center border-r-2 border-ink-100">
                <input
                  type="checkbox"
                  className="size-6 accent-fjord-700"
                  checked={selection.selected.has(u.id)}
                  onChange={() => selection.onToggle(u.id)}
                />
                <span className="sr-only">Select {formatContainerNumber(u.containerNumber)} for labels</span>
              </label>
            )}
            <Link
              to={hrefOf(u.id)}
              className="flex min-h-touch-lg flex-1 flex-col justify-center gap-1 rounded-r-md px-4 py-3 hover:bg-ink-50 md:flex-row md:items-center md:gap-4"
            >
              <span className="text-xl font-bold whitespace-nowrap tabular-nums tracking-wide md:w-52">
                {formatContainerNumber(u.containerNumber)}
              </span>
              <span className="flex flex-wrap items-center justify-between gap-x-4 gap-y-1 md:contents">
                <span className="text-base whitespace-nowrap text-ink-700 md:w-36">
                  {u.refrigerant} · {fmtKg(u.nominalChargeKg)}
                </span>
                <span className="md:order-last md:ml-auto">
                  <UnitStatusBadge status={u.status} />
                </span>
                <span className="w-full truncate text-base text-ink-600 md:w-auto md:flex-1">
                  {u.site ? `${u.site.code} · ${u.site.name}` : 'No site'}
                </span>
              </span>
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}

export function Pager({
  page,
  pageSize,
  total,
  onPage,
  busy,
}: {
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
  busy?: boolean;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  if (pages <= 1) return null;
  return (
    <nav aria-label="Pages" className="flex items-center justify-between gap-3">
      <Button variant="secondary" disabled={page <= 1 || busy} onClick={() => onPage(page - 1)}>
        Previous
      </Button>
      <p className="text-base text-ink-700" aria-live="polite">
        Page {page} of {pages}
      </p>
      <Button variant="secondary" disabled={page >= pages || busy} onClick={() => onPage(page + 1)}>
        Next
      </Button>
    </nav>
  );
}
