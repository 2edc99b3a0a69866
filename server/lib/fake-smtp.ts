// A local stand-in for a real SMTP server: accepts every message on loopback and keeps it for people and tests to
// read. Development and tests only; it has no authentication and no TLS.
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';

export type ReceivedMail = {
  receivedAt: Date;
  envelopeFrom: string;
  envelopeTo: string[];
  messageId: string | null;
  from: string;
  to: string;
  subject: string;
  headers: Record<string, string>;
  text: string;
  html: string | null;
  raw: string;
};

export type FakeSmtp = {
  port: number;
  messages: ReceivedMail[];
  clear(): void;
  /** Resolves with the first message (already received or still to come) that matches. */
  waitFor(match: (m: ReceivedMail) => boolean, timeoutMs?: number): Promise<ReceivedMail>;
  stop(): Promise<void>;
};

const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

export async function startFakeSmtp(
  opts: { port?: number; host?: string; onMessage?: (m: ReceivedMail) => Promise<void> | void } = {},
): Promise<FakeSmtp> {
  const messages: ReceivedMail[] = [];
  const waiters = new Set<{ match: (m: ReceivedMail) => boolean; resolve: (m: ReceivedMail) => void }>();

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    logger: false,
    size: MAX_MESSAGE_BYTES,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        const raw = Buffer.concat(chunks).toString('utf8');
        const mail: ReceivedMail = {
          ...parseMessage(raw),
          receivedAt: new Date(),
          envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
          raw,
        };
        Promise.resolve(opts.onMessage?.(mail)).then(
          () => {
            messages.push(mail);
            for (const w of waiters) {
              if (w.match(mail)) {
                waiters.delete(w);
                w.resolve(mail);
              }
            }
            callback();
          },
          (err: Error) => callback(err),
        );
      });
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 2525, opts.host ?? '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  // smtp-server reports client errors (a dropped connection) here; they must not crash the process.
  server.on('error', () => {});
  const port = (server.server.address() as AddressInfo).port;

  return {
    port,
    messages,
    clear: () => void messages.splice(0),
    waitFor(match, timeoutMs = 10_000) {
      const found = messages.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const w = { match, resolve: (m: ReceivedMail) => (clearTimeout(timer), resolve(m)) };
        const timer = setTimeout(() => {
          waiters.delete(w);
          reject(new Error(`No matching mail arrived within ${timeoutMs} ms`));
        }, timeoutMs);
        waiters.add(w);
      });
    },
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

// A minimal RFC 5322 / MIME reader: enough for what nodemailer sends (headers, multipart, base64 and
// quoted-printable, UTF-8 encoded words). Not a general-purpose parser.

type Part = { headers: Record<string, string>; body: string };

function splitHead(raw: string): Part {
  const at = raw.search(/\r?\n\r?\n/);
  const head = at < 0 ? raw : raw.slice(0, at);
  const body = at < 0 ? '' : raw.slice(at).replace(/^\r?\n\r?\n/, '');
  const headers: Record<string, string> = {};
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = decodeWords(line.slice(colon + 1).trim());
  }
  return { headers, body };
}

function decodeWords(value: string): string {
  return value
    .replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?)/g, '$1')
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_m, _charset: string, enc: string, text: string) =>
      enc.toUpperCase() === 'B'
        ? Buffer.from(text, 'base64').toString('utf8')
        : decodeQuotedPrintable(text.replace(/_/g, ' ')),
    );
}

function decodeQuotedPrintable(s: string): string {
  const bytes: number[] = [];
  const src = s.replace(/=\r?\n/g, '');
  for (let i = 0; i < src.length; i++) {
    if (src[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(src.slice(i + 1, i + 3))) {
      bytes.push(parseInt(src.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      bytes.push(...Buffer.from(src[i], 'utf8'));
    }
  }
  return Buffer.from(bytes).toString('utf8');
}

function decodeBody(part: Part): string {
  const enc = (part.headers['content-transfer-encoding'] ?? '').toLowerCase();
  if (enc === 'base64') return Buffer.from(part.body.replace(/\s+/g, ''), 'base64').toString('utf8');
  if (enc === 'quoted-printable') return decodeQuotedPrintable(part.body);
  return part.body;
}

function leaves(part: Part): Part[] {
  const type = part.headers['content-type'] ?? 'text/plain';
  const boundary = /boundary="?([^";]+)"?/i.exec(type)?.[1];
  if (!/^multipart\//i.test(type) || !boundary) return [part];
  const pieces = part.body.split(`--${boundary}`).slice(1);
  return pieces.filter((p) => !p.startsWith('--')).flatMap((p) => leaves(splitHead(p.replace(/^\r?\n/, ''))));
}

export function parseMessage(raw: string) {
  const top = splitHead(raw);
  const parts = leaves(top);
  const find = (mime: string) =>
    parts.find((p) => (p.headers['content-type'] ?? 'text/plain').toLowerCase().startsWith(mime));
  const text = find('text/plain');
  const html = find('text/html');
  return {
    headers: top.headers,
    messageId: top.headers['message-id'] ?? null,
    from: top.headers.from ?? '',
    to: top.headers.to ?? '',
    subject: top.headers.subject ?? '',
    text: text ? decodeBody(text).replace(/\r\n/g, '\n').trimEnd() : '',
    html: html ? decodeBody(html).replace(/\r?\n$/, '') : null,
  };
}
