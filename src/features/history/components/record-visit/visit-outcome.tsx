import type { ReactNode } from 'react';
import type { RecordVisitResultDto, VisitEventKind, VisitSubmission } from '../../../../../shared/schemas/history';
import { Alert } from '../../../../components/ui/alert';
import { Button, ButtonLink } from '../../../../components/ui/button';
import { ENTRY_KIND_LABELS } from '../../utils/labels';
import { AttachPhotos } from '../attach-photos';
import { EntryGlyph } from '../entry-glyph';
import { QueuedPhotos } from '../queued-photos';
import { fmtDateTime, fmtKg } from '../../../../lib/format';

/** Back to the unit, or start the next visit. */
export function OutcomeActions({
  unitHref,
  containerNumber,
  onStartOver,
}: {
  unitHref: string;
  containerNumber: string;
  onStartOver: () => void;
}) {
  return (
    <div className="flex flex-col gap-3 sm:flex-row">
      <ButtonLink to={unitHref} size="lg">
        Back to {containerNumber}
      </ButtonLink>
      <Button variant="secondary" size="lg" onClick={onStartOver}>
        Record another visit
      </Button>
    </div>
  );
}

/** No connection: the visit waits on the phone, and so do photos added to it. */
export function VisitQueued({ userId, input, banner }: { userId: string; input: VisitSubmission; banner: ReactNode }) {
  return (
    <>
      <Alert tone="info" title="Kept on this phone: no connection right now">
        The visit of {fmtDateTime(input.occurredAt)} ({input.events.length}{' '}
        {input.events.length === 1 ? 'entry' : 'entries'}) is saved here, also if the browser is closed, and goes out by
        itself once the phone is back online. Sending it twice is not possible: the server knows it by its key. Photos
        added below wait with it and go up right after it.
      </Alert>
      {banner}
      <h2 className="text-xl font-bold">Photos</h2>
      <QueuedPhotos userId={userId} input={input} />
    </>
  );
}

/** After saving: what went in, and a place to add photos to each entry. */
export function VisitSaved({ unitId, result }: { unitId: number; result: RecordVisitResultDto }) {
  return (
    <div className="flex flex-col gap-4">
      <Alert tone="okay" title={result.replayed ? 'This visit was already saved' : 'Visit saved'}>
        {result.replayed
          ? 'It had reached Tightloop before; nothing was saved twice.'
          : `${result.events.length} ${result.events.length === 1 ? 'entry' : 'entries'} recorded. The unit's figures are up to date.`}
      </Alert>
      <h2 className="text-xl font-bold">Photos</h2>
      <p className="-mt-2 text-ink-600">
        Optional: a photo of the leak, the gauge or the cylinder label. Photos and PDF documents.
      </p>
      <ul className="flex flex-col gap-3">
        {[...result.events]
          .sort((a, b) => a.id - b.id)
          .map((e) => (
            <li key={e.id} className="flex flex-col gap-3 rounded-lg border-2 border-ink-200 bg-white p-4">
              <div className="flex items-center gap-3">
                <EntryGlyph kind={e.kind} className="size-8" />
                <p className="font-semibold">
                  {ENTRY_KIND_LABELS[e.kind as VisitEventKind] ?? e.kind}
                  {e.kg != null && <span className="font-normal text-ink-600"> · {fmtKg(e.kg)}</span>}
                </p>
              </div>
              <AttachPhotos
                unitId={unitId}
                eventId={e.id}
                label={ENTRY_KIND_LABELS[e.kind as VisitEventKind] ?? e.kind}
                existing={e.attachments.length}
              />
            </li>
          ))}
      </ul>
    </div>
  );
}
