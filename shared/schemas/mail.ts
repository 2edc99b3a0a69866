import { z } from 'zod';

export const MAILBOX_PAGE_SIZE = 100;

export const mailboxQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(MAILBOX_PAGE_SIZE).default(50),
});

export const receivedMailDto = z.object({
  id: z.number(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
});
export type ReceivedMailDto = z.infer<typeof receivedMailDto>;

export const mailboxDto = z.object({ messages: z.array(receivedMailDto) });
export type MailboxDto = z.infer<typeof mailboxDto>;

/** Client pages that mails link to (the server builds the links, the client router serves them). */
export const MAIL_PAGE_PATHS = {
  invitation: '/invite',
  passwordReset: '/reset',
  unsubscribe: '/unsubscribe',
  alertSettings: '/settings/alerts',
  mailbox: '/admin/mailbox',
} as const;
