import { useState } from 'react';
import type { UnitDto } from '../../../../shared/schemas/units';
import { Alert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { singleLabelHref } from '../api/print-labels';
import { useReissueQrToken } from '../api/reissue-qr-token';
import { fmtDateTime } from '../../../lib/format';

/** Print the unit's QR label, or replace a lost one (the old label stops opening the unit). */
export function UnitLabelActions({ unit }: { unit: UnitDto }) {
  const reissue = useReissueQrToken();
  const [confirming, setConfirming] = useState(false);
  const [reissued, setReissued] = useState(false);

  return (
    <section
      aria-labelledby="label-actions-title"
      className="flex flex-col gap-4 rounded-lg border-2 border-ink-200 bg-white p-4 md:p-6"
    >
      <div>
        <h2 id="label-actions-title" className="text-xl font-bold">
          QR label
        </h2>
        <p className="text-base text-ink-600">Label issued {fmtDateTime(unit.qrIssuedAt)}.</p>
      </div>
      {reissued && (
        <Alert tone="okay" title="A new label code was issued">
          Print the new label and stick it on the unit. The old label no longer opens this unit.
        </Alert>
      )}
      {reissue.isError && (
        <Alert tone="alarm" title="The label was not replaced">
          {reissue.error.message}
        </Alert>
      )}
      <div className="flex flex-wrap gap-3">
        <a
          href={singleLabelHref(unit.id)}
          target="_blank"
          rel="noreferrer"
          className={buttonClasses({ variant: 'primary' })}
        >
          Print label
        </a>
        <a
          href={singleLabelHref(unit.id, 'sheet')}
          target="_blank"
          rel="noreferrer"
          className={buttonClasses({ variant: 'secondary' })}
        >
          On an A4 label sheet
        </a>
        {!confirming && (
          <Button variant="quiet" onClick={() => setConfirming(true)}>
            Replace a lost label…
          </Button>
        )}
      </div>
      {confirming && (
        <div
          role="group"
          aria-labelledby="reissue-title"
          className="flex flex-col gap-3 rounded-md border-2 border-heed-800 bg-heed-50 p-4"
        >
          <p id="reissue-title" className="text-base font-semibold">
            Issue a new label code? The label on the unit now will stop working.
          </p>
          <div className="flex flex-wrap gap-3">
            <Button
              variant="danger"
              pending={reissue.isPending}
              pendingLabel="Issuing…"
              onClick={() =>
                reissue.mutate(unit.id, {
                  onSuccess: () => {
                    setConfirming(false);
                    setReissued(true);
                  },
                })
              }
            >
              Issue a new code
            </Button>
            <Button variant="secondary" onClick={() => setConfirming(false)}>
              Keep the current label
            </Button>
          </div>
        </div>
      )}
    </section>
  );
}
