import type { QueryKey } from '@tanstack/react-query';
import { differenceInMinutes, parseISO } from 'date-fns';
import { lazy, Suspense, useState, type ReactNode } from 'react';
import {
  convertMass,
  convertPressure,
  convertTemperature,
  LEAK_CHECK_METHODS,
  LEAK_LOCATIONS,
  REPAIR_ACTIONS,
  SIGHT_GLASS_STATES,
  termLabel,
  type MassUnit,
} from '../../../../shared/domain';
import { can } from '../../../../shared/permissions';
import type { UserDto } from '../../../../shared/schemas/account';
import { VOID_WINDOW_HOURS, type EventDto } from '../../../../shared/schemas/history';
import { Button, ButtonLink } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { EmptyState } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { useHistory } from '../api/get-history';
import { entryKindLabel } from '../utils/labels';
import { UNIT_STATUS_LABELS } from '../../../../shared/schemas/units';
import { temperatureSymbol, type UnitPrefs } from '../utils/unit-prefs';
import { AttachPhotos } from './attach-photos';
import { decisionRows } from './decision-rows';
import { EntryGlyph } from './entry-glyph';
import { LoadError } from '../../../components/ui/query-state';
import { fmtDateTime, fmtDateTimeInZone, fmtKg, fmtNumber } from '../../../lib/format';

// The void form (react-hook-form + its resolver) loads when someone voids an entry, not with the unit page.
const VoidEventDialog = lazy(() => import('./void-event-dialog').then((m) => ({ default: m.VoidEventDialog })));

type EnteredPressure = { pressureUnit?: UnitPrefs['pressure'] | 'MPa'; temperatureUnit?: 'C' | 'F' | 'K' };

function enteredAs(e: EventDto): unknown {
  return (e.details as { enteredAs?: unknown } | null)?.enteredAs;
}

/** Shows a pressure in the unit it was typed in, with kPa beside it when that differs. */
function pressure(kPaG: number | null, unit: EnteredPressure['pressureUnit']): string | null {
  if (kPaG === null) return null;
  const u = unit ?? 'kPa';
  if (u === 'kPa') return `${fmtNumber(kPaG, 0)} kPa`;
  const v = convertPressure(kPaG, { unit: 'kPa', ref: 'gauge' }, { unit: u, ref: 'gauge' });
  return `${fmtNumber(v, u === 'psi' ? 0 : 2)} ${u} (${fmtNumber(kPaG, 0)} kPa)`;
}

function temperature(c: number | null, unit: EnteredPressure['temperatureUnit']): string | null {
  if (c === null) return null;
  const u = unit === 'F' ? 'F' : 'C';
  const v = u === 'C' ? c : convertTemperature(c, 'C', 'F');
  return `${v < 0 ? '−' : ''}${fmtNumber(Math.abs(v), 1)} ${temperatureSymbol(u)}`;
}

function Detail({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex gap-2">
      <dt className="shrink-0 text-ink-600">{label}</dt>
      <dd className="min-w-0 font-semibold">{children}</dd>
    </div>
  );
}

type Rows = ReactNode[];
type Details = Record<string, unknown>;
const otherOf = (d: Details) => (k: string) => (typeof d[k] === 'string' && d[k] ? ` (${String(d[k])})` : '');

function refrigerantRows(e: EventDto): Rows {
  const rows: Rows = [];
  const typed = enteredAs(e) as { value: number; unit: MassUnit } | undefined;
  if (e.kg !== null) {
    rows.push(
      <Detail key="kg" label={e.kind === 'recovery' ? 'Recovered' : e.kind === 'recharge' ? 'Charged' : 'Added'}>
        {typed && typed.unit === 'lb'
          ? `${fmtNumber(typed.value, 2)} lb (${fmtKg(convertMass(typed.value, 'lb', 'kg'))})`
          : fmtKg(e.kg)}
      </Detail>,
    );
  }
  if (e.cylinder)
    rows.push(
      <Detail key="cyl" label="Cylinder">
        {e.cylinder}
      </Detail>,
    );
  if (e.reusedRecovered)
    rows.push(
      <Detail key="reused" label="Gas">
        Recovered refrigerant put back
      </Detail>,
    );
  if (e.excludedFromLeakRate)
    rows.push(
      <Detail key="excl" label="Counted">
        First fill or retrofit: not counted as leaked
      </Detail>,
    );
  return rows;
}

function leakCheckRows(e: EventDto, d: Details): Rows {
  const rows: Rows = [];
  if (e.method)
    rows.push(
      <Detail key="m" label="Method">
        {termLabel(LEAK_CHECK_METHODS, e.method)}
      </Detail>,
    );
  rows.push(
    <Detail key="r" label="Result">
      {e.leakFound ? (
        <span className="text-alarm-700">
          Leak found
          {e.location
            ? ` at the ${termLabel(LEAK_LOCATIONS, e.location).toLowerCase()}${otherOf(d)('locationOther')}`
            : ''}
        </span>
      ) : (
        'No leak found'
      )}
    </Detail>,
  );
  return rows;
}

function repairRows(e: EventDto, d: Details): Rows {
  const rows: Rows = [];
  const other = otherOf(d);
  if (e.location)
    rows.push(
      <Detail key="l" label="Where">
        {termLabel(LEAK_LOCATIONS, e.location)}
        {other('locationOther')}
      </Detail>,
    );
  if (e.action)
    rows.push(
      <Detail key="a" label="Done">
        {termLabel(REPAIR_ACTIONS, e.action)}
        {other('actionOther')}
      </Detail>,
    );
  rows.push(
    <Detail key="v" label="Verified">
      {e.verified ? 'Yes, tested tight' : 'No'}
    </Detail>,
  );
  return rows;
}

/** Pressures and temperatures in the units they were typed in (with kPa beside another pressure unit). */
function pressureRows(e: EventDto): Rows {
  const rows: Rows = [];
  const as = (enteredAs(e) ?? {}) as EnteredPressure;
  const t = (v: number | null) => temperature(v, as.temperatureUnit);
  const pair = (a: string | null, b: string | null) => [a, b].filter(Boolean).join(' · ');
  const add = (key: string, label: string, value: string | null) =>
    value &&
    rows.push(
      <Detail key={key} label={label}>
        {value}
      </Detail>,
    );
  if (e.suctionKPaG !== null) add('s', 'Suction', pressure(e.suctionKPaG, as.pressureUnit));
  if (e.dischargeKPaG !== null) add('d', 'Discharge', pressure(e.dischargeKPaG, as.pressureUnit));
  add(
    'a',
    'Temps',
    pair(
      e.ambientC !== null ? `ambient ${t(e.ambientC)}` : null,
      e.setPointC !== null ? `set point ${t(e.setPointC)}` : null,
    ),
  );
  add(
    'sr',
    'Air',
    pair(
      e.supplyAirC !== null ? `supply ${t(e.supplyAirC)}` : null,
      e.returnAirC !== null ? `return ${t(e.returnAirC)}` : null,
    ),
  );
  if (e.sightGlass) add('g', 'Sight glass', termLabel(SIGHT_GLASS_STATES, e.sightGlass));
  return rows;
}

function detailRows(e: EventDto, d: Details): Rows {
  switch (e.kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge':
      return refrigerantRows(e);
    case 'leak_check':
      return leakCheckRows(e, d);
    case 'repair':
      return repairRows(e, d);
    case 'pressure':
      return pressureRows(e);
    case 'pti':
      return [
        <Detail key="p" label="Result">
          <span className={e.passed ? 'text-okay-700' : 'text-alarm-700'}>{e.passed ? 'Passed' : 'Failed'}</span>
        </Detail>,
      ];
    case 'component_replacement':
      return typeof d.component === 'string'
        ? [
            <Detail key="c" label="Part">
              {d.component}
            </Detail>,
          ]
        : [];
    case 'decision':
      return decisionRows(d, Detail);
    case 'status_change':
      return typeof d.status === 'string'
        ? [
            <Detail key="s" label="Now">
              {(UNIT_STATUS_LABELS as Record<string, string>)[d.status] ?? d.status}
            </Detail>,
          ]
        : [];
    default:
      return [];
  }
}

/** The facts of one entry, in the trade's words, from the fixed vocabularies. */
function EntryDetails({ e }: { e: EventDto }) {
  const rows = detailRows(e, (e.details ?? {}) as Details);
  return (
    <>
      {rows.length > 0 && <dl className="flex flex-col gap-0.5 text-base">{rows}</dl>}
      {e.note && <p className="text-base whitespace-pre-line text-ink-800">{e.note}</p>}
    </>
  );
}

function canVoid(user: UserDto, e: EventDto, now: number): boolean {
  if (e.voided || e.kind === 'void') return false;
  if (can(user, 'void:event:any')) return true;
  return (
    can(user, 'void:event:own') &&
    e.recordedBy.id === user.id &&
    now - parseISO(e.enteredAt).getTime() < VOID_WINDOW_HOURS * 3_600_000
  );
}

function EntryItem({
  e,
  user,
  unitId,
  onVoid,
}: {
  e: EventDto;
  user: UserDto;
  unitId: number;
  onVoid: (e: EventDto) => void;
}) {
  const [adding, setAdding] = useState(false);
  const [now] = useState(() => Date.now());
  const voided = e.voided;
  // Photos are added to one's own entries (the API lets any recorder; the list keeps it to the author's).
  const canAttach = can(user, 'record:event') && e.recordedBy.id === user.id;
  return (
    <li
      className={cx('flex flex-col gap-2 py-3', voided && 'opacity-75')}
      data-testid="history-entry"
      data-kind={e.kind}
      data-voided={voided ? 'true' : undefined}
    >
      <div className="flex items-start gap-3">
        <EntryGlyph kind={e.kind} className={cx('size-8', voided && 'opacity-50')} />
        <div className="flex min-w-0 flex-1 flex-col gap-1">
          <p className={cx('text-lg font-bold', voided && 'line-through decoration-2')}>
            {entryKindLabel(e.kind)}
            {voided && <span className="sr-only"> (voided)</span>}
          </p>
          <div className={cx(voided && 'line-through decoration-ink-400')}>
            <EntryDetails e={e} />
          </div>
          {voided && (
            <p className="rounded-sm border-l-4 border-alarm-700 bg-alarm-50 px-2 py-1 text-sm">
              <span className="font-bold">Voided</span> by {voided.by.name}, {fmtDateTime(voided.at)}: “{voided.reason}”
            </p>
          )}
          {e.attachments.length > 0 && (
            <ul className="mt-1 flex flex-wrap gap-2" aria-label="Photos and documents">
              {e.attachments.map((a) => (
                <li key={a.id}>
                  <a
                    href={a.url}
                    target="_blank"
                    rel="noreferrer"
                    className="block rounded-md border-2 border-ink-200 hover:border-ink-950"
                    title={`Open ${a.originalName}`}
                  >
                    {a.thumbnailUrl ? (
                      <img
                        src={a.thumbnailUrl}
                        alt={`Photo: ${a.originalName}`}
                        loading="lazy"
                        className="size-20 rounded-sm object-cover"
                      />
                    ) : (
                      <span className="flex size-20 flex-col items-center justify-center p-1 text-center text-xs font-semibold break-all">
                        PDF
                        <span className="line-clamp-2 font-normal">{a.originalName}</span>
                      </span>
                    )}
                  </a>
                </li>
              ))}
            </ul>
          )}
        </div>
      </div>
      {!voided && (canVoid(user, e, now) || canAttach) && (
        <div className="flex flex-wrap justify-end gap-2">
          {canAttach && !adding && (
            <Button variant="quiet" className="px-2" onClick={() => setAdding(true)}>
              Add photos<span className="sr-only"> to the {entryKindLabel(e.kind).toLowerCase()}</span>
            </Button>
          )}
          {canVoid(user, e, now) && (
            <button
              type="button"
              onClick={() => onVoid(e)}
              className="min-h-touch rounded-md px-3 font-semibold text-alarm-700 underline-offset-4 hover:bg-alarm-50 hover:underline"
            >
              Void…<span className="sr-only"> the {entryKindLabel(e.kind).toLowerCase()}</span>
            </button>
          )}
        </div>
      )}
      {adding && (
        <div className="pl-11">
          <AttachPhotos
            unitId={unitId}
            eventId={e.id}
            label={entryKindLabel(e.kind).toLowerCase()}
            existing={e.attachments.length}
          />
        </div>
      )}
    </li>
  );
}

type VisitGroup = { key: string; events: EventDto[] };

/** Consecutive entries of one visit share a card: they share who, when and where. */
function groupByVisit(events: EventDto[]): VisitGroup[] {
  const groups: VisitGroup[] = [];
  for (const e of events) {
    const last = groups[groups.length - 1];
    if (last && e.visitId !== null && last.events[0].visitId === e.visitId) last.events.push(e);
    else groups.push({ key: e.visitId !== null ? `v${e.visitId}` : `e${e.id}`, events: [e] });
  }
  // Inside a visit, in the order the entries were made.
  for (const g of groups) g.events.sort((a, b) => a.id - b.id);
  return groups;
}

/** The unit's service history, newest first, a page at a time, with voiding for those allowed. */
export function EventList({
  unitId,
  user,
  recordHref,
  alsoInvalidate,
}: {
  unitId: number;
  user: UserDto;
  recordHref: string;
  alsoInvalidate?: QueryKey[];
}) {
  const history = useHistory(unitId);
  const [voiding, setVoiding] = useState<EventDto | null>(null);

  if (history.isPending) {
    return (
      <div
        className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-ink-700"
        role="status"
      >
        <Spinner />
        Loading the history…
      </div>
    );
  }
  if (history.isError) {
    return (
      <LoadError
        title="The history could not be loaded"
        error={history.error}
        onRetry={() => void history.refetch()}
        retrying={history.isFetching}
      />
    );
  }
  const events = history.data.pages.flatMap((p) => p.events);
  if (events.length === 0) {
    return (
      <EmptyState title="No service history yet">
        <p>Nothing has been recorded for this unit.</p>
        {can(user, 'record:event') && (
          <ButtonLink to={recordHref} size="lg" className="mt-4">
            Record a visit
          </ButtonLink>
        )}
      </EmptyState>
    );
  }
  return (
    <div className="flex flex-col gap-3">
      <ol className="flex flex-col gap-3" data-testid="history-list">
        {groupByVisit(events).map((g) => {
          const first = g.events[0];
          const late = Math.abs(differenceInMinutes(parseISO(first.enteredAt), parseISO(first.occurredAt))) > 30;
          return (
            <li key={g.key} className="rounded-lg border-2 border-ink-200 bg-white px-4 py-2 shadow-raised">
              <div className="border-b border-ink-100 pb-2">
                <p className="text-base font-bold tabular-nums">
                  {/* At a site with a zone, its wall clock and offset: what the technician's watch said. */}
                  {first.site?.timeZone
                    ? fmtDateTimeInZone(first.occurredAt, first.site.timeZone)
                    : fmtDateTime(first.occurredAt)}
                </p>
                <p className="text-sm text-ink-700">
                  {first.recordedBy.name}
                  {first.site ? ` · ${first.site.name}` : ''}
                  {late ? ` · entered ${fmtDateTime(first.enteredAt)}` : ''}
                </p>
              </div>
              <ul className="divide-y divide-ink-100">
                {g.events.map((e) => (
                  <EntryItem key={e.id} e={e} user={user} unitId={unitId} onVoid={setVoiding} />
                ))}
              </ul>
            </li>
          );
        })}
      </ol>
      {history.hasNextPage && (
        <Button
          variant="secondary"
          size="lg"
          onClick={() => void history.fetchNextPage()}
          pending={history.isFetchingNextPage}
          pendingLabel="Loading…"
        >
          Load more
        </Button>
      )}
      {history.isFetchNextPageError && (
        <p role="alert" className="text-sm font-semibold text-alarm-700">
          The next page could not be loaded. Try again.
        </p>
      )}
      {voiding && (
        <Suspense fallback={null}>
          <VoidEventDialog
            unitId={unitId}
            event={voiding}
            onClose={() => setVoiding(null)}
            alsoInvalidate={alsoInvalidate}
          />
        </Suspense>
      )}
    </div>
  );
}
