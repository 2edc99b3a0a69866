import { z } from 'zod';
import { ROLES, type Role } from '../permissions';

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

/** How far a role's default reaches when the person never chose for a kind: every site, or the sites they work at. */
export const DEFAULT_REACHES = ['all_sites', 'my_sites'] as const;
export type DefaultReach = (typeof DEFAULT_REACHES)[number];

/** "My sites": where the person recorded a visit within this many days. */
export const MY_SITES_DAYS = 90;

/**
 * What a person follows until they choose for themselves. Engineers look after the units at the sites they work at;
 * the owner decides about repeat leakers (retirement) across the fleet; the administrator sets the leak-rate policy
 * and hears when a unit crosses it anywhere. Technicians get no alert mails: the alert settings and most alert links
 * are fleet views they cannot open, and their re-checks due already stand on My day.
 */
export const ROLE_ALERT_DEFAULTS: Record<Role, Partial<Record<AlertKind, DefaultReach>>> = {
  technician: {},
  engineer: {
    chronic: 'my_sites',
    leak_rate: 'my_sites',
    open_leak: 'my_sites',
    recheck: 'my_sites',
    digest: 'my_sites',
  },
  owner: { chronic: 'all_sites' },
  admin: { leak_rate: 'all_sites' },
};

/** How a person follows one kind: their role's default, every site (also sites added later), or the sites ticked. */
export const ALERT_SCOPES = ['default', 'all_sites', 'sites'] as const;
export type AlertScope = (typeof ALERT_SCOPES)[number];

export const subscriptionSchema = z.object({
  siteId: z.number().int().positive(),
  kind: z.enum(ALERT_KINDS, { message: 'Unknown alert kind' }),
});

const kindListSchema = z.array(z.enum(ALERT_KINDS, { message: 'Unknown alert kind' })).max(ALERT_KINDS.length);

/**
 * The whole set at once. Kinds in `allSites` follow every site, kinds in `useDefaults` go back to the role's default;
 * every other kind follows exactly the sites listed for it in `subscriptions` (none listed: no mails of that kind).
 */
export const putSubscriptionsSchema = z
  .object({
    subscriptions: z.array(subscriptionSchema).max(MAX_SUBSCRIPTIONS),
    allSites: kindListSchema.default([]),
    useDefaults: kindListSchema.default([]),
  })
  .superRefine((input, ctx) => {
    input.useDefaults.forEach((kind, i) => {
      if (input.allSites.includes(kind)) {
        ctx.addIssue({
          code: 'custom',
          path: ['useDefaults', i],
          message: 'Choose either all sites or the default for this alert, not both',
        });
      }
    });
  });
export type PutSubscriptionsInput = z.input<typeof putSubscriptionsSchema>;
export type PutSubscriptionsParsed = z.output<typeof putSubscriptionsSchema>;

export const subscriptionsDto = z.object({
  sites: z.array(z.object({ id: z.number(), code: z.string(), name: z.string() })),
  /** Every site each kind reaches today, defaults and "all sites" included. */
  subscriptions: z.array(subscriptionSchema),
  kinds: z.array(
    z.object({
      kind: z.enum(ALERT_KINDS),
      scope: z.enum(ALERT_SCOPES),
      /** What the role's default would be for this kind; null = nothing by default. */
      defaultReach: z.enum(DEFAULT_REACHES).nullable(),
    }),
  ),
  role: z.enum(ROLES),
  /** The sites the person recorded visits at in the last MY_SITES_DAYS days. */
  mySiteIds: z.array(z.number()),
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
