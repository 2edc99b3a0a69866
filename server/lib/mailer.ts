import nodemailer from 'nodemailer';
import type { Env } from '../env';

export type MailMessage = {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Stable per logical message, so a receiver can spot a repeat delivery. */
  messageId?: string;
  headers?: Record<string, string>;
};

export interface Mailer {
  /** Resolves once the SMTP server has accepted the message; rejects otherwise. */
  send(msg: MailMessage): Promise<void>;
}

export type SmtpSettings = { host: string; port: number; user?: string; password?: string; from: string };

export const smtpSettingsFrom = (env: Env): SmtpSettings => ({
  host: env.SMTP_HOST,
  port: env.SMTP_PORT,
  user: env.SMTP_USER,
  password: env.SMTP_PASSWORD,
  from: env.SMTP_FROM,
});

export function createSmtpMailer(s: SmtpSettings): Mailer {
  const transport = nodemailer.createTransport({
    host: s.host,
    port: s.port,
    // Port 465 speaks TLS from the first byte; others upgrade with STARTTLS when the server offers it.
    secure: s.port === 465,
    auth: s.user ? { user: s.user, pass: s.password ?? '' } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return {
    async send(msg) {
      await transport.sendMail({
        from: s.from,
        to: msg.to,
        subject: msg.subject,
        text: msg.text,
        html: msg.html,
        messageId: msg.messageId,
        headers: msg.headers,
      });
    },
  };
}
