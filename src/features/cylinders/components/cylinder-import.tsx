import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { isApiError } from '../../../lib/api-client';
import { useImportCylinders } from '../api/cylinder-writes';

/** Existing cylinders from a CSV: all or nothing, every bad row listed. */
export function CylinderImport({ onDone }: { onDone: () => void }) {
  const run = useImportCylinders();
  const [file, setFile] = useState<File | null>(null);
  const rows =
    run.error && isApiError(run.error)
      ? Object.entries(run.error.fields ?? {}).map(([k, msg]) => {
          const [, row, field] = k.split('.');
          return { key: k, row, field, msg };
        })
      : [];
  return (
    <div className="flex flex-col gap-3">
      <p className="text-base text-ink-700">
        One cylinder per row; columns as in the{' '}
        <a href="/api/cylinder-imports/template" className="font-semibold text-fjord-700 underline">
          template
        </a>
        . If any row is wrong nothing is imported, and every wrong row is listed.
      </p>
      <input
        type="file"
        accept=".csv,text/csv"
        aria-label="CSV file"
        onChange={(e) => setFile(e.target.files?.[0] ?? null)}
        className="text-base"
      />
      {run.isError && (
        <Alert tone="alarm" title={run.error.message}>
          {rows.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {rows.slice(0, 30).map((r) => (
                <li key={r.key}>
                  Row {r.row}
                  {r.field && r.field !== 'row' ? `, ${r.field}` : ''}: {r.msg}
                </li>
              ))}
            </ul>
          )}
        </Alert>
      )}
      {run.isSuccess && <Alert tone="okay">{run.data.imported} cylinders imported.</Alert>}
      <div className="flex gap-3">
        <Button disabled={!file} pending={run.isPending} onClick={() => file && run.mutate({ file })}>
          Import cylinders
        </Button>
        <Button variant="quiet" onClick={onDone}>
          Close
        </Button>
      </div>
    </div>
  );
}
