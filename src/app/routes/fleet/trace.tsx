import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { traceQuerySchema, type TraceQuery } from '../../../../shared/schemas/trace';
import { Alert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { TextField, SelectField } from '../../../components/ui/field';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { useSites } from '../../../features/sites/api/get-sites';
import { QuarantineUnitsButton } from '../../../features/quarantine/components/quarantine-units-button';
import { traceExportHref, useTrace } from '../../../features/trace/api/trace';
import { FleetTabs } from '../../../features/fleet/components/fleet-tabs';
import { toSearch } from '../../../lib/query-string';
import { Can } from '../../../lib/can';
import { fmtContainer, fmtCount, fmtDay, fmtKg } from '../../../lib/format';
import { paths } from '../../../config/paths';

function readTrace(sp: URLSearchParams): { query: TraceQuery | null; errors: Record<string, string> } {
  if (![...sp.keys()].length) return { query: null, errors: {} };
  const parsed = traceQuerySchema.safeParse(Object.fromEntries(sp.entries()));
  if (parsed.success) return { query: parsed.data, errors: {} };
  return {
    query: null,
    errors: Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? 'cylinder'), i.message])),
  };
}

export default function TracePage() {
  const [sp, setSp] = useSearchParams();
  const { query, errors } = readTrace(sp);
  const [mode, setMode] = useState<'cylinder' | 'site'>(sp.get('siteId') && !sp.get('cylinder') ? 'site' : 'cylinder');
  const sites = useSites();
  const trace = useTrace(query);

  const submit = (form: FormData) => {
    const v = Object.fromEntries(form.entries()) as Record<string, string>;
    setSp(
      mode === 'cylinder'
        ? toSearch({ cylinder: v.cylinder?.trim() })
        : toSearch({ siteId: v.siteId, from: v.from, to: v.to }),
      { preventScrollReset: true },
    );
  };

  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Cylinder trace"
        description="Every unit charged from a cylinder or lot, or at a site in a date range — for quarantine when refrigerant is suspect."
      />
      <FleetTabs />
      <Panel aria-labelledby="trace-search">
        <h2 id="trace-search" className="sr-only">
          Search
        </h2>
        <fieldset className="mb-4 flex gap-2">
          <legend className="mb-2 text-base font-semibold">Search by</legend>
          {(['cylinder', 'site'] as const).map((m) => (
            <label
              key={m}
              className="flex min-h-touch cursor-pointer items-center gap-2 rounded-md border-2 border-ink-300 px-4 has-checked:border-fjord-700 has-checked:bg-fjord-50"
            >
              <input
                type="radio"
                name="mode"
                className="size-5 accent-fjord-700"
                checked={mode === m}
                onChange={() => setMode(m)}
              />
              {m === 'cylinder' ? 'Cylinder or lot' : 'Site and dates'}
            </label>
          ))}
        </fieldset>
        <form
          key={mode}
          className="grid gap-4 md:grid-cols-[repeat(3,minmax(0,1fr))_auto] md:items-end"
          onSubmit={(e) => {
            e.preventDefault();
            submit(new FormData(e.currentTarget));
          }}
        >
          {mode === 'cylinder' ? (
            <TextField
              name="cylinder"
              label="Cylinder or lot number"
              hint="The start is enough: a lot number finds every cylinder of the lot."
              defaultValue={sp.get('cylinder') ?? ''}
              error={errors.cylinder}
              className="md:col-span-3"
              autoCapitalize="characters"
            />
          ) : (
            <>
              <SelectField name="siteId" label="Site" defaultValue={sp.get('siteId') ?? ''} error={errors.siteId}>
                <option value="">Choose a site</option>
                {(sites.data ?? []).map((s) => (
                  <option key={s.id} value={s.id}>
                    {s.name}
                  </option>
                ))}
              </SelectField>
              <TextField
                name="from"
                type="date"
                label="First day"
                defaultValue={sp.get('from') ?? ''}
                error={errors.from}
              />
              <TextField name="to" type="date" label="Last day" defaultValue={sp.get('to') ?? ''} error={errors.to} />
            </>
          )}
          <Button type="submit" size="lg">
            Search
          </Button>
        </form>
      </Panel>

      {query === null ? (
        Object.keys(errors).length === 0 && (
          <EmptyState title="Search to see the units charged">
            Results list every top-up and recharge that matches, newest first.
          </EmptyState>
        )
      ) : trace.isPending ? (
        <div className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-ink-700">
          <Spinner /> Searching…
        </div>
      ) : trace.isError ? (
        <Alert tone="alarm" title="The search failed">
          {trace.error.message}
        </Alert>
      ) : trace.data.totalCharges === 0 ? (
        <EmptyState title="No unit was charged in this search">
          {trace.data.voidedExcluded > 0 && `${trace.data.voidedExcluded} voided charge(s) matched and are left out.`}
        </EmptyState>
      ) : (
        <TraceResults query={query} data={trace.data} />
      )}
    </div>
  );
}

function TraceResults({ query, data }: { query: TraceQuery; data: NonNullable<ReturnType<typeof useTrace>['data']> }) {
  return (
    <section aria-labelledby="trace-results" className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 id="trace-results" className="text-xl font-bold">
            {fmtCount(data.units.length)} unit{data.units.length === 1 ? '' : 's'} charged
          </h2>
          <p className="text-base text-ink-700">
            {fmtCount(data.totalCharges)} charge(s), {fmtKg(data.totalKg)} in all. Voided charges are left out
            {data.voidedExcluded ? ` (${data.voidedExcluded} matched)` : ''}.
          </p>
        </div>
        <a className={buttonClasses({ variant: 'secondary' })} href={traceExportHref(query)} download>
          Export CSV
        </a>
      </div>

      <Can permission="manage:units">
        <Panel as="div" className="flex flex-col gap-3 border-heed-800">
          <p className="text-base">
            Quarantine these units: each gets a mark in its history with the reason, and none can be released until an
            engineer lifts its quarantine with a recorded result.
          </p>
          <QuarantineUnitsButton
            unitIds={data.units.map((u) => u.unitId)}
            source="trace"
            search={
              query.cylinder
                ? `cylinder or lot ${query.cylinder}`
                : `site ${query.siteId ?? ''} ${query.from ?? ''} to ${query.to ?? ''}`.trim()
            }
          />
        </Panel>
      </Can>

      <div className="flex flex-col gap-4">
        <Panel aria-labelledby="trace-units">
          <h3 id="trace-units" className="text-lg font-bold">
            Units
          </h3>
          <ul className="mt-2 grid gap-x-6 sm:grid-cols-2 lg:grid-cols-3">
            {data.units.map((u) => (
              <li
                key={u.unitId}
                className="flex min-h-touch flex-wrap items-center justify-between gap-2 border-b border-ink-100 py-1"
              >
                <Link
                  to={paths.unit.getHref(u.unitId)}
                  className="inline-flex min-h-touch items-center font-semibold text-fjord-700 underline-offset-4 hover:underline"
                >
                  {fmtContainer(u.containerNumber)}
                </Link>
                <span className="text-sm text-ink-700 tabular-nums">
                  {u.charges} × · {fmtKg(u.kg)}
                </span>
                {u.markedAt && (
                  <span className="w-full text-sm font-semibold text-heed-800">
                    Marked for inspection {fmtDay(u.markedAt)}
                  </span>
                )}
              </li>
            ))}
          </ul>
        </Panel>
        <Panel aria-labelledby="trace-charges">
          <h3 id="trace-charges" className="text-lg font-bold">
            Charges{data.charges.length < data.totalCharges && ` (newest ${data.charges.length}; the CSV has all)`}
          </h3>
          <div className="mt-2 overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead className="text-ink-700">
                <tr>
                  <th className="py-2 pr-3">Date</th>
                  <th className="py-2 pr-3">Unit</th>
                  <th className="py-2 pr-3 text-right">kg</th>
                  <th className="py-2 pr-3">Cylinder</th>
                  <th className="py-2">Site · by</th>
                </tr>
              </thead>
              <tbody>
                {data.charges.map((c) => (
                  <tr key={c.eventId} className="border-t border-ink-100 align-top">
                    <td className="py-2 pr-3 whitespace-nowrap tabular-nums">{fmtDay(c.occurredAt)}</td>
                    <td className="py-2 pr-3 whitespace-nowrap">
                      {fmtContainer(c.containerNumber)}
                      <span className="block text-sm text-ink-600">{c.kind === 'top_up' ? 'top-up' : 'recharge'}</span>
                    </td>
                    <td className="py-2 pr-3 text-right tabular-nums">{c.kg}</td>
                    <td className="py-2 pr-3 whitespace-nowrap">{c.cylinder}</td>
                    <td className="py-2">
                      {c.site?.name ?? '—'} <span className="text-ink-600">· {c.technician.name}</span>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </Panel>
      </div>
    </section>
  );
}
