import { toNestErrors } from '@hookform/resolvers';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import type { FieldError, Resolver } from 'react-hook-form';
import type { z } from 'zod';
import { visitPlausibilityIssues } from '../../../../shared/schemas/visit-rules';
import type { visitFormSchema } from '../utils/visit-form-model';

/** What the form needs to know about the unit; the route module gets it from the registry. */
export type VisitUnit = {
  id: number;
  containerNumber: string;
  refrigerant: string;
  nominalChargeKg: number;
  siteName?: string | null;
  /**
   * Set for a unit this phone knows only by its label (recorded offline, never opened here): `id`, `refrigerant` and
   * `nominalChargeKg` are then unknown, the plausibility rules wait for the server, and the visit goes by this token.
   */
  qrToken?: string;
};

export type VisitSchema = ReturnType<typeof visitFormSchema>;
export type VisitFormInput = z.input<VisitSchema>;
export type VisitFormOutput = z.output<VisitSchema>;

// Friendlier words where the shared schema has none of its own (a schema's own message always wins).
const MISSING: Record<string, string> = {
  passed: 'Choose passed or failed',
  leakFound: 'Say whether a leak was found',
  status: 'Choose the new status',
  sightGlass: 'Choose what the sight glass showed',
  verified: 'Say whether the repair was verified',
};

function issuesToErrors(issues: Record<string, string>) {
  const flat: Record<string, FieldError> = {};
  for (const [path, message] of Object.entries(issues)) flat[path] = { type: 'plausibility', message };
  return flat;
}

type EntryErrors = Record<string, Record<string, FieldError | undefined>>;

/** The shared messages name the SI unit; say the unit the person is typing in. */
function inTypedUnits(values: VisitFormInput, errors: object) {
  const list = (errors as { events?: EntryErrors }).events ?? {};
  values.events.forEach((d, i) => {
    const e = list[i];
    if (!e) return;
    if (d.massUnit === 'lb' && e.kg?.message) e.kg.message = e.kg.message.replace(' in kg', ' in lb');
    if (d.temperatureUnit === 'F') {
      for (const k of ['ambientC', 'supplyAirC', 'returnAirC'] as const) {
        const err = e[k];
        if (err?.message) err.message = err.message.replace('°C', '°F');
      }
    }
  });
}

/** The shared schema, then the same plausibility rules the server applies, with this unit's charge and refrigerant. */
export function useVisitResolver(schema: VisitSchema, unit: VisitUnit) {
  return useMemo<Resolver<VisitFormInput, unknown, VisitFormOutput>>(() => {
    const base = zodResolver(schema, {
      error: (iss) => {
        const last = iss.path?.at(-1);
        return iss.code === 'invalid_type' && typeof last === 'string' ? MISSING[last] : undefined;
      },
    });
    return async (values, context, options) => {
      const result = await base(values, context, options);
      if (Object.keys(result.errors).length > 0) {
        inTypedUnits(values, result.errors);
        return result;
      }
      if (unit.qrToken) return result;
      const issues = visitPlausibilityIssues(unit, result.values as VisitFormOutput, new Date());
      if (Object.keys(issues).length === 0) return result;
      return { values: {}, errors: toNestErrors(issuesToErrors(issues), options) };
    };
  }, [schema, unit]);
}
