import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { downloadHandover, type HandoverProgress } from '../api/download-handover';

/**
 * "Handover pack" on a unit's page: the whole record (or a date range) as a PDF for a buyer, lessee or inspector, and
 * the same data as JSON. Shows the progress while the pages are drawn.
 */
export function HandoverDownload({ unitId }: { unitId: number }) {
  const [open, setOpen] = useState(false);
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [progress, setProgress] = useState<HandoverProgress | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<{ message: string; fields: Record<string, string> } | null>(null);
  const [done, setDone] = useState<{ checksum: string; fileName: string } | null>(null);
  const qs = new URLSearchParams({ ...(from ? { from } : {}), ...(to ? { to } : {}) }).toString();
  const run = async () => {
    setBusy(true);
    setError(null);
    setDone(null);
    setProgress(null);
    try {
      setDone(await downloadHandover(unitId, { from: from || undefined, to: to || undefined }, setProgress));
    } catch (err) {
      setError({
        message: err instanceof Error ? err.message : 'The pack could not be made.',
        fields: isApiError(err) ? (err.fields ?? {}) : {},
      });
    } finally {
      setBusy(false);
    }
  };
  if (!open) {
    return (
      <Button variant="secondary" onClick={() => setOpen(true)}>
        Handover pack
      </Button>
    );
  }
  const pct = progress && progress.total ? Math.round((progress.done / progress.total) * 100) : 0;
  return (
    <section
      aria-labelledby="handover-title"
      className="flex flex-col gap-3 rounded-lg border-2 border-ink-200 bg-white p-4"
    >
      <h2 id="handover-title" className="text-lg font-bold">
        Handover pack
      </h2>
      <p className="text-base text-ink-700">
        The unit&apos;s record as one PDF: identity, figures with their reasons, the timeline, every entry with who,
        when and where, voids, cylinders, decisions and attachments. Leave the dates empty for the whole record.
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="From"
          type="date"
          value={from}
          onChange={(e) => setFrom(e.target.value)}
          error={error?.fields.from}
          optional
        />
        <TextField
          label="To"
          type="date"
          value={to}
          onChange={(e) => setTo(e.target.value)}
          error={error?.fields.to}
          optional
        />
      </div>
      {busy && (
        <div role="status" aria-live="polite" className="flex flex-col gap-1">
          <div className="h-3 w-full overflow-hidden rounded-full bg-ink-100">
            <div className="h-full bg-fjord-700 transition-[width]" style={{ width: `${pct}%` }} />
          </div>
          <p className="text-sm text-ink-700">{progress ? `Drawing the pages… ${pct} %` : 'Reading the record…'}</p>
        </div>
      )}
      {error && <Alert tone="alarm">{error.message}</Alert>}
      {done && (
        <Alert tone="okay" title="Handover pack ready">
          {done.fileName} · record checksum <code className="break-all text-sm">{done.checksum}</code>
        </Alert>
      )}
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => void run()} pending={busy}>
          Download PDF
        </Button>
        <a
          href={`/api/units/${unitId}/handover.json${qs ? `?${qs}` : ''}`}
          className="inline-flex min-h-12 items-center font-semibold text-fjord-700 underline underline-offset-4"
        >
          Same data as JSON
        </a>
        <Button variant="quiet" onClick={() => setOpen(false)}>
          Close
        </Button>
      </div>
    </section>
  );
}
