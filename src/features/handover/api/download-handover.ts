import { handoverLineDto, type HandoverFileLine, type HandoverProgressLine } from '../../../../shared/schemas/handover';
import { ApiError, unreachable } from '../../../lib/api-client';
import { errorFrom, handToBrowser } from '../../../lib/transfer';

export type HandoverProgress = HandoverProgressLine;

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
    throw unreachable();
  }
  if (!res.ok || !res.body) {
    const body: unknown = await res.json().catch(() => undefined);
    throw errorFrom(res.status, body, 'The pack could not be made.');
  }
  const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = '';
  let final: HandoverFileLine | null = null;
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buffer += value;
    let nl: number;
    while ((nl = buffer.indexOf('\n')) >= 0) {
      const line = buffer.slice(0, nl);
      buffer = buffer.slice(nl + 1);
      if (!line.trim()) continue;
      const msg = handoverLineDto.parse(JSON.parse(line));
      if ('pdf' in msg) final = msg;
      else onProgress(msg);
    }
    if (done) break;
  }
  if (!final) throw new ApiError(0, 'incomplete', 'The pack was cut off. Try again.');
  const bytes = Uint8Array.from(atob(final.pdf), (c) => c.charCodeAt(0));
  handToBrowser(new Blob([bytes], { type: 'application/pdf' }), final.fileName);
  return { checksum: final.checksum, fileName: final.fileName };
}
