import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import type { ApiError } from './api-client';

/**
 * Puts the server's messages for a form's own fields on those fields and focuses the first; says whether any found
 * its field and which messages name no field of this form (for the form's own message).
 */
export function placeFieldErrors<T extends FieldValues>(
  error: ApiError,
  fields: readonly Path<T>[],
  form: Pick<UseFormReturn<T>, 'setError' | 'setFocus'>,
): { placed: boolean; unplaced: string[] } {
  let first: Path<T> | null = null;
  const unplaced: string[] = [];
  for (const [field, message] of Object.entries(error.fields ?? {})) {
    const own = fields.find((f) => f === field);
    if (own) {
      form.setError(own, { type: 'server', message });
      first ??= own;
    } else unplaced.push(message);
  }
  if (first) form.setFocus(first);
  return { placed: first !== null, unplaced };
}
