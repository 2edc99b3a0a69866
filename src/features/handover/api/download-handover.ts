import { ApiError } from '../../../lib/api-client';

export type HandoverProgress = { done: number; total: number };
type Final = { fileName: string; checksum: string; events: number; pdf: string };

/**
 * Produces a unit's handover PDF, following its progress line by line (the server writes NDJSON while it draws the
 * pages), then hands the file to the browser. Resolves with the record's checksum.
 */
export async function downloadHandover(
  unitId: number,
  range: { from?: string; to?: string },
  onProgress: (p: HandoverProgress) => void,
): Promise<{ checksum: string; fileName: string }> {
  const q = new URLSearchParams();
  if (range.from) q.set('from', range.from);
  if (range.to) q.set('to', range.to);
  const qs = q.toString();
  let res: Response;
  try {
    res = await fetch(`/api/units/${unitId}/handover/progress${qs ? `?${qs}` : ''}`, { credentials: 'include' });
  } catch {
    throw new ApiError(0, 'network_error', 'Could not reach Tightloop. Check the connection and try again.');
  }
  if (!res.ok || !res.body) {
    const body = (await res.json().catch(() => null)) as {
      error?: { code: string; message: string; fields?: Record<string, string> };
    } | null;
    throw new ApiError(
      res.status,
      body?.error?.code ?? 'http_error',
      body?.error?.message ?? 'The pack could not be made.',
      body?.error?.fields,
    );
  }
  const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = '';
  let final: Final | null = null;
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buffer += value;
    let nl: number;
    while ((nl = buffer.indexOf('\n')) >= 0) {
      const line = buffer.slice(0, nl);
      buffer = buffer.slice(nl + 1);
      if (!line.trim()) continue;
      const msg = JSON.parse(line) as HandoverProgress | Final;
      if ('pdf' in msg) final = msg;
      else onProgress(msg);
    }
    if (done) break;
  }
  if (!final) throw new ApiError(0, 'incomplete', 'The pack was cut off. Try again.');
  const bytes = Uint8Array.from(atob(final.pdf), (c) => c.charCodeAt(0));
  const href = URL.createObjectURL(new Blob([bytes], { type: 'application/pdf' }));
  const a = document.createElement('a');
  a.href = href;
  a.download = final.fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(href), 60_000);
  return { checksum: final.checksum, fileName: final.fileName };
}
