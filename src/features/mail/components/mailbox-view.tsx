import { Fragment, useState } from 'react';
import type { ReceivedMailDto } from '../../../../shared/schemas/mail';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { fmtDateTime } from '../../../lib/format';

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;

/** The text part with its web addresses made clickable. */
function LinkedText({ text }: { text: string }) {
  return (
    <pre className="overflow-x-auto font-sans text-base break-words whitespace-pre-wrap">
      {text.split(URL_PATTERN).map((part, i) =>
        i % 2 === 1 ? (
          <a key={i} href={part} className="font-semibold text-fjord-700 underline underline-offset-2">
            {part}
          </a>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </pre>
  );
}

function MailItem({ mail }: { mail: ReceivedMailDto }) {
  const [open, setOpen] = useState(false);
  const [asHtml, setAsHtml] = useState(false);
  return (
    <li className="rounded-lg border-2 border-ink-200 bg-white" data-testid="mailbox-item">
      <button
        type="button"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
        className="flex min-h-touch w-full flex-col items-start gap-0.5 px-4 py-3 text-left hover:bg-ink-50"
      >
        <span className="font-semibold">{mail.subject || '(no subject)'}</span>
        <span className="text-sm text-ink-600">
          To {mail.to} · <time dateTime={mail.receivedAt}>{fmtDateTime(mail.receivedAt)}</time>
        </span>
      </button>
      {open && (
        <div className="flex flex-col gap-3 border-t-2 border-ink-100 px-4 py-4">
          {mail.html && (
            <div>
              <Button variant="quiet" onClick={() => setAsHtml((h) => !h)} className="px-2">
                {asHtml ? 'Show as plain text' : 'Show as the recipient sees it'}
              </Button>
            </div>
          )}
          {asHtml && mail.html ? (
            // Sandboxed: the mail's HTML cannot run scripts or reach this page.
            <iframe
              title={`Mail: ${mail.subject}`}
              sandbox=""
              srcDoc={mail.html}
              className={cx('h-[32rem] w-full rounded-md border-2 border-ink-200')}
            />
          ) : (
            <LinkedText text={mail.text} />
          )}
        </div>
      )}
    </li>
  );
}

export function MailboxView({ messages }: { messages: ReceivedMailDto[] }) {
  return (
    <ul className="flex flex-col gap-3">
      {messages.map((m) => (
        <MailItem key={m.id} mail={m} />
      ))}
    </ul>
  );
}
