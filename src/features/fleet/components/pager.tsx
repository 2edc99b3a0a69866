import { FLEET_PAGE_SIZES, type FleetCountDto } from '../../../../shared/schemas/fleet';
import { Button } from '../../../components/ui/button';
import { fmtCount } from '../../../lib/format';

type Props = {
  page: number;
  pageSize: number;
  hasMore: boolean;
  count: FleetCountDto | undefined;
  onPage: (page: number) => void;
  onPageSize: (size: number) => void;
};

export function Pager({ page, pageSize, hasMore, count, onPage, onPageSize }: Props) {
  const pages = count ? Math.max(1, Math.ceil(count.total / pageSize)) : null;
  const from = (page - 1) * pageSize + 1;
  return (
    <nav aria-label="Pages" className="flex flex-wrap items-center justify-between gap-3">
      <p className="text-base text-ink-700" aria-live="polite">
        {count ? (
          count.total === 0 ? (
            'No units'
          ) : (
            <>
              Units {fmtCount(from)}–{fmtCount(Math.min(from + pageSize - 1, count.total))} of{' '}
              {count.capped ? `more than ${fmtCount(count.total)}` : fmtCount(count.total)}
            </>
          )
        ) : (
          `Page ${page}`
        )}
      </p>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <label className="flex items-center gap-2 text-sm font-semibold text-ink-700">
          Per page
          <select
            className="min-h-touch rounded-md border-2 border-ink-400 bg-white px-2 text-base"
            value={pageSize}
            onChange={(e) => onPageSize(Number(e.target.value))}
          >
            {FLEET_PAGE_SIZES.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </label>
        {/* Previous, page and Next stay on one line; on a phone they wrap below the page size as one group. */}
        <div className="flex items-center gap-2">
          <Button variant="secondary" disabled={page <= 1} onClick={() => onPage(page - 1)}>
            Previous
          </Button>
          <span className="min-w-16 text-center text-sm text-ink-700 tabular-nums">
            {page}
            {pages && !count?.capped ? ` / ${pages}` : ''}
          </span>
          <Button variant="secondary" disabled={!hasMore} onClick={() => onPage(page + 1)}>
            Next
          </Button>
        </div>
      </div>
    </nav>
  );
}
