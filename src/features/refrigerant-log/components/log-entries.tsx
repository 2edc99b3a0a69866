import { Link } from 'react-router-dom';
import { LEAK_CHECK_METHODS, LEAK_LOCATIONS, termLabel } from '../../../../shared/domain';
import type { RefrigerantLogEntryDto } from '../../../../shared/schemas/refrigerant-log';
import { paths } from '../../../config/paths';
import { fmtContainer, fmtDay, fmtKg, fmtNumber, fmtTonnes } from '../../../lib/format';

const KIND_LABELS = { top_up: 'Top-up', recharge: 'Recharge', recovery: 'Recovery', leak_check: 'Leak check' } as const;

/** The cylinder and what else there is to know of a movement; the method and result of a leak check. */
export function detailOf(e: RefrigerantLogEntryDto): string {
  if (e.kind === 'leak_check') {
    const how = e.method ? termLabel(LEAK_CHECK_METHODS, e.method) : '';
    return `${how}: ${e.leakFound ? `leak at ${e.location ? termLabel(LEAK_LOCATIONS, e.location).toLowerCase() : 'unknown location'}` : 'no leak'}`;
  }
  const extras = [
    e.reusedRecovered ? 'recycled/reclaimed gas' : null,
    e.excludedFromLeakRate ? 'first fill or retrofit' : null,
  ].filter(Boolean);
  return [e.cylinder, ...extras].filter(Boolean).join(' · ');
}

function EntryCard({ e }: { e: RefrigerantLogEntryDto }) {
  return (
    <li className="rounded-lg border-2 border-ink-200 bg-white p-4" data-testid="log-card">
      <div className="flex items-baseline justify-between gap-2">
        <span className="font-bold">{KIND_LABELS[e.kind]}</span>
        <span className="tabular-nums text-ink-700">{fmtDay(e.occurredAt)}</span>
      </div>
      <Link
        to={paths.unit.getHref(e.unit.id)}
        className="inline-flex min-h-touch items-center font-semibold text-fjord-700"
      >
        {fmtContainer(e.unit.containerNumber)}
      </Link>{' '}
      <span className="text-sm text-ink-600">{e.refrigerant}</span>
      {e.kg !== null && (
        <p className="text-figure tabular-nums">
          {fmtKg(e.kg)} <span className="text-base text-ink-700">{fmtTonnes(e.co2eTonnes ?? 0)} CO2e</span>
        </p>
      )}
      <p className="text-sm text-ink-800">{detailOf(e)}</p>
      <p className="text-sm text-ink-600">
        {e.site?.name ?? 'No site'} · {e.technician.name} · cert. {e.technician.certificateNumber ?? 'none on file'}
      </p>
    </li>
  );
}

/** On phones: one card per entry. */
export function LogCards({ entries }: { entries: RefrigerantLogEntryDto[] }) {
  return (
    <ul className="flex flex-col gap-2 md:hidden">
      {entries.map((e) => (
        <EntryCard key={e.eventId} e={e} />
      ))}
    </ul>
  );
}

/** From tablets up: the log as a table, as an inspector reads it. */
export function LogTable({ entries }: { entries: RefrigerantLogEntryDto[] }) {
  return (
    <div className="hidden overflow-x-auto rounded-lg border-2 border-ink-200 bg-white md:block">
      <table className="w-full text-left text-sm" aria-label="Refrigerant log entries">
        <thead className="bg-ink-50 text-sm text-ink-700">
          <tr>
            {['Date', 'Entry', 'Unit', 'kg', 't CO2e', 'Cylinder / result', 'Site', 'Technician · certificate'].map(
              (h) => (
                <th key={h} className="border-b-2 border-ink-200 px-3 py-2">
                  {h}
                </th>
              ),
            )}
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => (
            <tr key={e.eventId} className="border-b border-ink-100 align-top" data-testid="log-row">
              <td className="px-3 py-2 whitespace-nowrap tabular-nums">{fmtDay(e.occurredAt)}</td>
              <td className="px-3 py-2 whitespace-nowrap">{KIND_LABELS[e.kind]}</td>
              <td className="px-3 py-2 whitespace-nowrap">
                <Link
                  to={paths.unit.getHref(e.unit.id)}
                  className="font-semibold text-fjord-700 underline-offset-4 hover:underline"
                >
                  {fmtContainer(e.unit.containerNumber)}
                </Link>
                <span className="block text-sm text-ink-600">{e.refrigerant}</span>
              </td>
              <td className="px-3 py-2 text-right tabular-nums">{e.kg == null ? '' : fmtNumber(e.kg, 2)}</td>
              <td className="px-3 py-2 text-right tabular-nums">
                {e.co2eTonnes == null ? '' : fmtNumber(e.co2eTonnes, 2)}
              </td>
              <td className="px-3 py-2">{detailOf(e)}</td>
              <td className="px-3 py-2">{e.site?.name ?? '—'}</td>
              <td className="px-3 py-2">
                {e.technician.name}
                <span className="block tabular-nums text-ink-600">
                  {e.technician.certificateNumber ?? <span className="text-alarm-700">no certificate on file</span>}
                </span>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
