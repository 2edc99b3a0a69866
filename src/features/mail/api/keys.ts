export const mailKeys = {
  all: ['mail'] as const,
  mailbox: () => [...mailKeys.all, 'mailbox'] as const,
  subscriptions: () => [...mailKeys.all, 'subscriptions'] as const,
  link: (purpose: AccountLinkPurpose, token: string) => [...mailKeys.all, 'link', purpose, token] as const,
};

export type AccountLinkPurpose = 'invitation' | 'password_reset';
