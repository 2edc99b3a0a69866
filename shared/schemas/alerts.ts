import { z } from 'zod';

/** What an engineer can subscribe to, per site. */
export const ALERT_KINDS = ['chronic', 'leak_rate', 'open_leak', 'recheck', 'digest'] as const;
export type AlertKind = (typeof ALERT_KINDS)[number];

export const ALERT_KIND_LABELS: Record<AlertKind, { title: string; description: string }> = {
  chronic: { title: 'Chronic leakers', description: 'A unit’s repeat-leak score enters the chronic band.' },
  leak_rate: {
    title: 'Leak rate over the threshold',
    description: 'A unit’s rolling leak rate reaches the policy threshold.',
  },
  open_leak: {
    title: 'Leaks left unrepaired',
    description: 'A leak was found and is still not repaired after the allowed days.',
  },
  recheck: {
    title: 'Re-checks due or missed',
    description: 'A re-check after a top-up or a repair falls due, or its day passes without one.',
  },
  digest: { title: 'Daily digest', description: 'Leak checks due, forecast top-ups and PTIs running out, once a day.' },
};

export const MAX_SUBSCRIPTIONS = 2000;

export const subscriptionSchema = z.object({
  siteId: z.number().int().positive(),
  kind: z.enum(ALERT_KINDS, { message: 'Unknown alert kind' }),
});

export const putSubscriptionsSchema = z.object({
  subscriptions: z.array(subscriptionSchema).max(MAX_SUBSCRIPTIONS),
});
export type PutSubscriptionsInput = z.infer<typeof putSubscriptionsSchema>;

export const subscriptionsDto = z.object({
  sites: z.array(z.object({ id: z.number(), code: z.string(), name: z.string() })),
  subscriptions: z.array(subscriptionSchema),
});
export type SubscriptionsDto = z.infer<typeof subscriptionsDto>;

/** The signed link's answer: which kind of alert stopped and how many sites' subscriptions went. */
export const unsubscribedDto = z.object({ kind: z.enum(ALERT_KINDS), removed: z.number() });
export type UnsubscribedDto = z.infer<typeof unsubscribedDto>;

/** The fields of the signed unsubscribe link in every alert mail. */
export const unsubscribeSchema = z.object({
  user: z.string().min(1).max(64),
  kind: z.enum(ALERT_KINDS, { message: 'Unknown alert kind' }),
  sig: z.string().min(1).max(128),
});
export type UnsubscribeInput = z.infer<typeof unsubscribeSchema>;
