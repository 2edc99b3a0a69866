import type { ComponentProps } from 'react';
import { REFRIGERANT_CODES } from '../../../shared/domain';

/** A filter's site choices: "All sites" (the empty value) then each site, by name or by code. */
export function SiteOptions({
  sites,
  show = 'name',
}: {
  sites: readonly { id: number; name: string; code?: string }[] | undefined;
  show?: 'name' | 'code';
}) {
  return (
    <>
      <option value="">All sites</option>
      {(sites ?? []).map((s) => (
        <option key={s.id} value={s.id}>
          {show === 'code' ? (s.code ?? s.name) : s.name}
        </option>
      ))}
    </>
  );
}

/** A filter's refrigerant choices: "All refrigerants" (the empty value) then every refrigerant Tightloop knows. */
export function RefrigerantOptions() {
  return (
    <>
      <option value="">All refrigerants</option>
      {REFRIGERANT_CODES.map((r) => (
        <option key={r}>{r}</option>
      ))}
    </>
  );
}

/** A filter's choice with its label above it, as the filter rows of the overview and the refrigerant log show it. */
export function FilterSelect({ label, ...props }: ComponentProps<'select'> & { label: string }) {
  return (
    <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
      {label}
      <select {...props} />
    </label>
  );
}
