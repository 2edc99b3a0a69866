import { z } from 'zod';
import { blankToNull } from './common';

export const SITE_KINDS = ['depot', 'terminal', 'vessel', 'workshop'] as const;
export type SiteKind = (typeof SITE_KINDS)[number];

export const SITE_KIND_LABELS: Record<SiteKind, string> = {
  depot: 'Depot',
  terminal: 'Terminal',
  vessel: 'Vessel',
  workshop: 'Workshop',
};

/** Whose leak-check rule a site follows; a site without one follows the fleet's policy in settings. */
export const JURISDICTIONS = ['EU', 'US', 'custom'] as const;
export type Jurisdiction = (typeof JURISDICTIONS)[number];

export const MAX_SITE_CODE_LENGTH = 16;
export const MAX_SITE_NAME_LENGTH = 120;

const siteCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .min(2, 'Use at least 2 characters')
  .max(MAX_SITE_CODE_LENGTH, `Use at most ${MAX_SITE_CODE_LENGTH} characters`)
  .regex(/^[A-Z0-9][A-Z0-9-]*$/, 'Letters, digits and hyphens only');

const siteNameSchema = z.string().trim().min(1, 'Enter a name').max(MAX_SITE_NAME_LENGTH, 'Name is too long');

// ISO 3166-1 alpha-2; blank means "not given" (a vessel has no country of its own).
const countrySchema = z
  .string()
  .trim()
  .toUpperCase()
  .transform((v) => (v === '' ? null : v))
  .pipe(
    z
      .string()
      .regex(/^[A-Z]{2}$/, 'Use the 2-letter country code, e.g. NL')
      .nullable(),
  )
  .nullable();

/** A zone this runtime's Intl knows (IANA, e.g. Asia/Singapore). */
export function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

// Blank means "not set": the fleet's policy, times in UTC.
const jurisdictionSchema = z.preprocess(
  blankToNull,
  z.enum(JURISDICTIONS, { message: 'Choose EU, US reference or custom' }).nullable(),
);
const timeZoneSchema = z.preprocess(
  blankToNull,
  z
    .string()
    .trim()
    .max(64, 'Time zone name is too long')
    .refine(isKnownTimeZone, 'Use a time zone name such as Europe/Amsterdam or Asia/Singapore')
    .nullable(),
);

export const JURISDICTION_LABELS: Record<Jurisdiction, string> = {
  EU: 'EU (Regulation 2024/573)',
  US: 'US reference (40 CFR 82)',
  custom: 'Custom (settings bands)',
};

/** What each leak-check rule asks, in a sentence for the refrigerant log. */
export const JURISDICTION_RULE_WORDS: Record<Jurisdiction, string> = {
  // Source: Regulation (EU) 2024/573, Art. 5 (intervals by t CO2e of the full charge).
  EU: 'EU Regulation 2024/573: leak checks every 12, 6 or 3 months by the CO2e of the full charge',
  // Source: 40 CFR 82.157 (reference only; federal duties from 15 lb of HFC full charge).
  US: 'US reference (40 CFR 82.157): from 15 lb of HFC, yearly checks while the leak rate is over the threshold',
  custom: 'Custom rule: the leak-check bands set in settings',
};

export const createSiteSchema = z.object({
  code: siteCodeSchema,
  name: siteNameSchema,
  kind: z.enum(SITE_KINDS, { message: 'Choose what kind of site this is' }),
  country: countrySchema.optional(),
  jurisdiction: jurisdictionSchema.optional(),
  timeZone: timeZoneSchema.optional(),
});
export type CreateSiteInput = z.infer<typeof createSiteSchema>;

export const updateSiteSchema = createSiteSchema
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateSiteInput = z.infer<typeof updateSiteSchema>;

export const siteIdParamSchema = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) });

export const siteDto = z.object({
  id: z.number(),
  code: z.string(),
  name: z.string(),
  kind: z.enum(SITE_KINDS),
  country: z.string().nullable(),
  jurisdiction: z.enum(JURISDICTIONS).nullable(),
  timeZone: z.string().nullable(),
  unitCount: z.number(),
  createdAt: z.string(),
});
export type SiteDto = z.infer<typeof siteDto>;

export const sitesListDto = z.object({ sites: z.array(siteDto) });
export type SitesListDto = z.infer<typeof sitesListDto>;
