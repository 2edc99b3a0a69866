import { formatContainerNumber } from '../../../../shared/domain';
import {
  IMPORT_COLUMNS,
  MAX_IMPORT_BYTES,
  MAX_IMPORT_ROWS,
  type ImportMapping,
  type ImportPreviewDto,
  type UnitImportDto,
} from '../../../../shared/schemas/imports';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink, buttonClasses } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { isApiError } from '../../../lib/api-client';
import { IMPORT_TEMPLATE_HREF } from '../api/fleet-import';
import { useFleetImport, type FleetImportState } from '../hooks/use-fleet-import';
import { fmtCount } from '../../../lib/format';
import { importButtonLabel } from '../utils/import-button';

function ProgressBar({ label, value, max }: { label: string; value: number; max: number }) {
  const pct = max > 0 ? Math.min(100, Math.round((value / max) * 100)) : 0;
  return (
    <div className="flex flex-col gap-1.5">
      <div className="flex justify-between text-base font-semibold">
        <span>{label}</span>
        <span className="tabular-nums">{pct} %</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
        className="h-4 overflow-hidden rounded-full bg-ink-100"
      >
        <div className="h-full bg-fjord-700 transition-[width] duration-300" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}

function MappingForm({
  preview,
  onChange,
  busy,
}: {
  preview: ImportPreviewDto;
  onChange: (m: ImportMapping) => void;
  busy: boolean;
}) {
  return (
    <fieldset className="flex flex-col gap-3" disabled={busy}>
      <legend className="mb-2 text-lg font-bold">Which column holds what</legend>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {IMPORT_COLUMNS.map((col) => (
          <label key={col.field} className="flex flex-col gap-1">
            <span className="text-base font-semibold">
              {col.header}
              {col.required ? (
                <span className="ml-1 text-alarm-700">*</span>
              ) : (
                <span className="ml-2 text-sm font-normal text-ink-600">(optional)</span>
              )}
            </span>
            <select
              className="min-h-touch-lg rounded-md border-2 border-ink-400 bg-white px-3 text-base"
              value={preview.mapping[col.field] ?? ''}
              onChange={(e) => onChange({ ...preview.mapping, [col.field]: e.target.value || undefined })}
            >
              <option value="">— not imported —</option>
              {preview.columns.map((c) => (
                <option key={c} value={c}>
                  {c}
                </option>
              ))}
            </select>
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function SampleTable({ preview }: { preview: ImportPreviewDto }) {
  const fields = IMPORT_COLUMNS.filter((c) => preview.mapping[c.field]);
  return (
    <div className="overflow-x-auto rounded-lg border-2 border-ink-200 bg-white">
      <table className="w-full min-w-max text-left text-base">
        <caption className="px-4 pt-3 text-left text-lg font-bold">First {preview.sample.length} rows</caption>
        <thead>
          <tr className="border-b-2 border-ink-200">
            <th scope="col" className="px-3 py-2 text-sm">
              Row
            </th>
            {fields.map((f) => (
              <th key={f.field} scope="col" className="px-3 py-2 text-sm">
                {f.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {preview.sample.map((r) => {
            const bad = new Set(r.errors.map((e) => e.field));
            return (
              <tr key={r.row} className={cx('border-b border-ink-100', r.errors.length > 0 && 'bg-alarm-50')}>
                <th scope="row" className="px-3 py-2 font-semibold tabular-nums">
                  {r.row}
                </th>
                {fields.map((f) => (
                  <td
                    key={f.field}
                    className={cx(
                      'px-3 py-2',
                      bad.has(f.field) && 'font-semibold text-alarm-700 underline decoration-2',
                    )}
                  >
                    {r.values[f.field] || <span className="text-ink-300">—</span>}
                  </td>
                ))}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

function Problems({ preview }: { preview: ImportPreviewDto }) {
  if (preview.errorCount === 0) return null;
  return (
    <section aria-labelledby="import-problems-title" className="flex flex-col gap-2">
      <h3 id="import-problems-title" className="text-lg font-bold text-alarm-700">
        {fmtCount(preview.rowsWithErrors)} row{preview.rowsWithErrors === 1 ? '' : 's'} to fix
      </h3>
      <ul
        className="flex max-h-96 flex-col gap-1 overflow-y-auto rounded-lg border-2 border-alarm-700 bg-white p-3"
        data-testid="import-errors"
      >
        {preview.errors.map((e, i) => (
          <li key={i} className="text-base">
            <span className="font-semibold tabular-nums">Row {e.row}</span>
            {e.column && <span className="text-ink-600"> · {e.column}</span>}: {e.message}
          </li>
        ))}
      </ul>
      {preview.errorCount > preview.errors.length && (
        <p className="text-sm text-ink-600">
          …and {fmtCount(preview.errorCount - preview.errors.length)} more. Fix these and check the file again.
        </p>
      )}
    </section>
  );
}

type StepProps = { s: FleetImportState };

function ImportDone({
  done,
  unitsHref,
  onStartOver,
}: {
  done: UnitImportDto;
  unitsHref: string;
  onStartOver: () => void;
}) {
  return (
    <Alert tone="okay" title={`${fmtCount(done.insertedRows)} units imported`}>
      <p>
        From {done.fileName}
        {done.totalRows > done.insertedRows
          ? `; ${fmtCount(done.totalRows - done.insertedRows)} already registered were skipped`
          : ''}
        .
      </p>
      <div className="mt-3 flex flex-wrap gap-3">
        <ButtonLink to={unitsHref}>See the units</ButtonLink>
        <Button variant="secondary" onClick={onStartOver}>
          Import another file
        </Button>
      </div>
    </Alert>
  );
}

/** 1 · Choose the file (checked at once) or download the template. */
function ChooseFileStep({ s }: StepProps) {
  return (
    <section
      className="flex flex-col gap-3 rounded-lg border-2 border-ink-950 bg-white p-4 md:p-6"
      aria-labelledby="import-file-title"
    >
      <h2 id="import-file-title" className="text-xl font-bold">
        1 · Choose the CSV file
      </h2>
      <p className="text-base text-ink-600">
        One unit per row, with a header row. Up to {fmtCount(MAX_IMPORT_ROWS)} rows and {MAX_IMPORT_BYTES / 1024 / 1024}{' '}
        MB. Spreadsheets: save as “CSV UTF-8” first.
      </p>
      <div className="flex flex-wrap gap-3">
        <label className={cx(buttonClasses({ variant: 'primary', size: 'lg' }), 'cursor-pointer')}>
          {s.file ? 'Choose another file' : 'Choose CSV file'}
          <input
            type="file"
            accept=".csv,text/csv"
            className="sr-only"
            onChange={(e) => {
              s.choose(e.target.files?.[0]);
              e.target.value = '';
            }}
          />
        </label>
        <a href={IMPORT_TEMPLATE_HREF} download className={buttonClasses({ variant: 'secondary', size: 'lg' })}>
          Download the template
        </a>
      </div>
      {s.file && <p className="text-base font-semibold">{s.file.name}</p>}
      {s.preview.isPending && s.upload && (
        <ProgressBar label="Uploading to check" value={s.upload.loaded} max={s.upload.total} />
      )}
      {s.preview.isPending && (!s.upload || s.upload.loaded >= s.upload.total) && (
        <p className="text-base text-ink-700">Checking every row…</p>
      )}
      {s.preview.isError && (
        <Alert tone="alarm" title="The file could not be checked">
          {s.preview.error.message}
          {isApiError(s.preview.error) && s.preview.error.fields && (
            <ul className="mt-2 list-disc pl-5">
              {Object.values(s.preview.error.fields).map((m) => (
                <li key={m}>{m}</li>
              ))}
            </ul>
          )}
        </Alert>
      )}
    </section>
  );
}

/** 2 · What the check found: counts, column mapping, sample rows, problems and units already registered. */
function CheckRowsStep({ s, p }: StepProps & { p: ImportPreviewDto }) {
  return (
    <section
      className="flex flex-col gap-5 rounded-lg border-2 border-ink-200 bg-white p-4 md:p-6"
      aria-labelledby="import-check-title"
    >
      <h2 id="import-check-title" className="text-xl font-bold">
        2 · Check the rows
      </h2>
      <dl className="grid grid-cols-2 gap-3 md:grid-cols-4" data-testid="import-summary">
        {[
          ['Rows', p.totalRows],
          ['Ready to import', p.readyCount],
          ['To fix', p.rowsWithErrors],
          ['Already registered', p.existingCount],
        ].map(([label, n]) => (
          <div key={label} className="rounded-md bg-ink-50 px-3 py-2">
            <dt className="text-sm font-semibold text-ink-600">{label}</dt>
            <dd className="text-figure font-bold tabular-nums">{fmtCount(Number(n))}</dd>
          </div>
        ))}
      </dl>
      <MappingForm preview={p} busy={s.preview.isPending} onChange={(m) => s.file && s.check(s.file, m)} />
      <SampleTable preview={p} />
      <Problems preview={p} />
      {p.existingCount > 0 && (
        <div className="flex flex-col gap-2 rounded-md border-2 border-heed-800 bg-heed-50 p-4">
          <p className="font-semibold">
            {fmtCount(p.existingCount)} unit{p.existingCount === 1 ? ' is' : 's are'} already registered:{' '}
            {p.existing
              .slice(0, 5)
              .map((e) => `${formatContainerNumber(e.containerNumber)} (row ${e.row})`)
              .join(', ')}
            {p.existingCount > 5 ? ', …' : ''}
          </p>
          <label className="flex min-h-touch cursor-pointer items-center gap-3 text-base font-semibold">
            <input
              type="checkbox"
              className="size-6 accent-fjord-700"
              checked={s.skipExisting}
              onChange={(e) => s.setSkipExisting(e.target.checked)}
            />
            Skip them and import the rest
          </label>
        </div>
      )}
    </section>
  );
}

/** 3 · Import every row or none, with the upload and the server's progress. */
function ImportStep({ s, p }: StepProps & { p: ImportPreviewDto }) {
  return (
    <section
      className="flex flex-col gap-4 rounded-lg border-2 border-ink-200 bg-white p-4 md:p-6"
      aria-labelledby="import-go-title"
    >
      <h2 id="import-go-title" className="text-xl font-bold">
        3 · Import
      </h2>
      <p className="text-base text-ink-600">
        Every row goes in, or none does: if anything fails, the registry stays as it was.
      </p>
      {s.commit.isPending && s.upload && s.upload.loaded < s.upload.total && (
        <ProgressBar label="Uploading" value={s.upload.loaded} max={s.upload.total} />
      )}
      {s.commit.isPending && (!s.upload || s.upload.loaded >= s.upload.total) && (
        <div aria-live="polite">
          {s.server && s.server.processedRows > 0 ? (
            <ProgressBar
              label={`Saving units: ${fmtCount(s.server.processedRows)} of ${fmtCount(s.server.totalRows)}`}
              value={s.server.processedRows}
              max={s.server.totalRows}
            />
          ) : (
            <p className="text-base font-semibold text-ink-700">Checking every row before saving…</p>
          )}
        </div>
      )}
      {s.commit.isError && (
        <Alert tone="alarm" title="Nothing was imported">
          {s.commit.error.message}
        </Alert>
      )}
      <Button
        size="lg"
        disabled={s.blocked || s.preview.isPending}
        pending={s.commit.isPending}
        pendingLabel="Importing…"
        onClick={s.startImport}
        className="self-start"
      >
        {importButtonLabel(p?.readyCount, Boolean(s.blocked))}
      </Button>
      {s.blocked && !s.commit.isPending && (
        <p className="text-base text-ink-600">
          {p.errorCount > 0
            ? 'Fix the rows listed above in the file, then choose it again.'
            : p.existingCount > 0 && !s.skipExisting
              ? 'Some units are already registered: skip them, or take them out of the file.'
              : 'There is nothing new to import.'}
        </p>
      )}
    </section>
  );
}

/** Upload a fleet CSV, match its columns, see what would go wrong, then import every row or none. */
export function FleetImport({ unitsHref }: { unitsHref: string }) {
  const s = useFleetImport();
  const p = s.preview.data;
  if (s.done) return <ImportDone done={s.done} unitsHref={unitsHref} onStartOver={s.startOver} />;
  return (
    <div className="flex flex-col gap-6">
      <ChooseFileStep s={s} />
      {p && <CheckRowsStep s={s} p={p} />}
      {p && <ImportStep s={s} p={p} />}
    </div>
  );
}
