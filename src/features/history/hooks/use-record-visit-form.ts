import type { QueryKey } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import { useFieldArray, useForm, useWatch, type Path, type UseFormSetError } from 'react-hook-form';
import type { RecordVisitResultDto, VisitEventKind, VisitSubmission } from '../../../../shared/schemas/history';
import { visitPlausibilityIssues } from '../../../../shared/schemas/visit-rules';
import { isApiError, type ApiError } from '../../../lib/api-client';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import { useUnsentInput } from '../../../lib/unsent-input';
import { useRecordVisit } from '../api/record-visit';
import { enqueueVisit } from '../api/visit-queue';
import { useUnitPrefs } from '../utils/unit-prefs';
import {
  emptyEntry,
  FIELDS_BY_KIND,
  toLocalInputValue,
  visitFormSchema,
  type VisitFormValues,
} from '../utils/visit-form-model';
import {
  useVisitResolver,
  type VisitFormInput,
  type VisitFormOutput,
  type VisitSchema,
  type VisitUnit,
} from './use-visit-resolver';

export type VisitOutcome =
  { state: 'editing' } | { state: 'saved'; result: RecordVisitResultDto } | { state: 'queued'; input: VisitSubmission };

export type VisitFormError = { title: string; message: string; canQueue: boolean };

const NOT_SAVED = 'The visit was not saved';

/** Puts the server's field errors on the fields shown; says what is left (or the message) in the form's alert. */
function placeServerErrors(
  error: ApiError,
  values: VisitFormOutput,
  setError: UseFormSetError<VisitFormInput>,
): VisitFormError | null {
  const unplaced: string[] = [];
  let placed = 0;
  for (const [path, message] of Object.entries(error.fields ?? {})) {
    const m = /^events\.(\d+)\.(\w+)$/.exec(path);
    const draft = m ? values.events[Number(m[1])] : undefined;
    if (path === 'occurredAt') {
      setError('occurredAt', { type: 'server', message });
      placed++;
    } else if (m && draft && (FIELDS_BY_KIND[draft.kind] as readonly string[]).includes(m[2])) {
      setError(path as Path<VisitFormInput>, { type: 'server', message }, { shouldFocus: placed === 0 });
      placed++;
    } else unplaced.push(message);
  }
  if (placed > 0 && unplaced.length === 0) return null;
  return { title: NOT_SAVED, message: unplaced.length > 0 ? unplaced.join(' ') : error.message, canQueue: false };
}

/** Live preview of the plausibility rules while typing (warnings until sent; the server refuses them). */
function usePlausibilityPreview(
  control: ReturnType<typeof useForm<VisitFormInput, unknown, VisitFormOutput>>['control'],
  schema: VisitSchema,
  unit: VisitUnit,
) {
  const watched = useWatch({ control }) as VisitFormValues;
  return useMemo(() => {
    const parsed = schema.safeParse(watched);
    if (!parsed.success || unit.qrToken) return {};
    return visitPlausibilityIssues(unit, parsed.data, new Date());
  }, [watched, schema, unit]);
}

/** A newly added entry scrolls into view. */
function useScrollToAdded(count: number) {
  const lastAdded = useRef<number | null>(null);
  useEffect(() => {
    if (lastAdded.current === null) return;
    const el = document.getElementById(`entry-${lastAdded.current}-title`);
    lastAdded.current = null;
    el?.closest('section')?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  }, [count]);
  return lastAdded;
}

/** A kind the form knows, from a link's `?entry=` (My day's rows); anything else opens the form empty. */
export function entryKindOf(raw: string | null | undefined): VisitEventKind | null {
  return raw && Object.hasOwn(FIELDS_BY_KIND, raw) ? (raw as VisitEventKind) : null;
}

/**
 * The visit form's state and submission: send the visit (a retry of the very same visit keeps its idempotency key),
 * keep it on the phone when there is no connection, and put the server's field errors on the fields.
 */
export function useRecordVisitForm({
  unit,
  userId,
  alsoInvalidate,
  initialEntry,
}: {
  unit: VisitUnit;
  userId: string;
  alsoInvalidate?: (unitId: number) => QueryKey[];
  /** The entry the form opens with (a link from My day says which). */
  initialEntry?: VisitEventKind | null;
}) {
  const [prefs, setPrefs] = useUnitPrefs(userId);
  const [outcome, setOutcome] = useState<VisitOutcome>({ state: 'editing' });
  const [formError, setFormError] = useState<VisitFormError | null>(null);
  const recordVisit = useRecordVisit({ alsoInvalidate });
  const lastAttempt = useRef<{ json: string; key: string } | null>(null);
  const currentInput = useRef<VisitSubmission | null>(null);
  // A unit known only by its label has no id here; the token replaces the placeholder when the visit is sent.
  const schema = useMemo(() => visitFormSchema(unit.qrToken ? 1 : unit.id), [unit.id, unit.qrToken]);
  const resolver = useVisitResolver(schema, unit);

  const form = useForm<VisitFormInput, unknown, VisitFormOutput>({
    resolver,
    defaultValues: {
      occurredAt: toLocalInputValue(new Date()),
      events: initialEntry ? [emptyEntry(initialEntry, prefs)] : [],
    },
    shouldFocusError: true,
  });
  const { control, handleSubmit, setError, reset, formState } = form;
  const entries = useFieldArray({ control, name: 'events' });
  // A new version of the app waits while this form holds something not yet sent.
  useUnsentInput(outcome.state === 'editing' && (formState.isDirty || entries.fields.length > 0));
  const preview = usePlausibilityPreview(control, schema, unit);
  const lastAdded = useScrollToAdded(entries.fields.length);

  const addEntry = (kind: VisitEventKind) => {
    lastAdded.current = entries.fields.length;
    entries.append(emptyEntry(kind, prefs), { shouldFocus: false });
  };

  const queue = async (input: VisitSubmission) => {
    try {
      await enqueueVisit(userId, input, unit.containerNumber);
    } catch {
      setFormError({
        title: 'The visit could not be kept on this phone',
        message:
          "The phone's storage is full or blocked. Keep this page open and try again when the connection is back.",
        canQueue: false,
      });
      return;
    }
    lastAttempt.current = null;
    setOutcome({ state: 'queued', input });
    window.scrollTo({ top: 0 });
  };

  const onError = (error: unknown, input: VisitSubmission, values: VisitFormOutput) => {
    if (!isApiError(error))
      setFormError({ title: NOT_SAVED, message: 'Something unexpected went wrong. Try again.', canQueue: false });
    else if (error.status === 0) void queue(input);
    else if (error.status >= 500) setFormError({ title: NOT_SAVED, message: error.message, canQueue: true });
    else setFormError(placeServerErrors(error, values, setError));
  };

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const json = JSON.stringify(values);
    // A retry of the very same visit keeps its key, so the server can tell it from a new one.
    const key = lastAttempt.current?.json === json ? lastAttempt.current.key : newIdempotencyKey();
    lastAttempt.current = { json, key };
    const { unitId, ...visit } = values;
    const input: VisitSubmission = unit.qrToken
      ? { ...visit, idempotencyKey: key, qrToken: unit.qrToken }
      : { ...visit, unitId, idempotencyKey: key };
    currentInput.current = input;
    recordVisit.mutate(input, {
      onSuccess: (result) => {
        lastAttempt.current = null;
        setOutcome({ state: 'saved', result });
        window.scrollTo({ top: 0 });
      },
      onError: (error) => onError(error, input, values),
    });
  });

  const startOver = () => {
    reset({ occurredAt: toLocalInputValue(new Date()), events: [] });
    setFormError(null);
    setOutcome({ state: 'editing' });
    window.scrollTo({ top: 0 });
  };

  return {
    form,
    entries,
    preview,
    outcome,
    formError,
    currentInput,
    saving: recordVisit.isPending,
    setPrefs,
    addEntry,
    queue,
    onSubmit,
    startOver,
  };
}
