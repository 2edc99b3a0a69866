import { useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { formatContainerNumber, parseContainerNumber } from '../../../../shared/domain';
import type { UnitDto } from '../../../../shared/schemas/units';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { isApiError } from '../../../lib/api-client';
import { Can } from '../../../lib/can';
import { unitByTokenQuery } from '../api/get-unit-by-token';
import { ContainerNumberField } from '../../../components/ui/container-number-field';

/** The label code in a scanned text: the last path segment of a `…/u/<code>` address, from any host. */
export function labelTokenFrom(text: string): string | null {
  try {
    const m = /^\/u\/([A-Za-z0-9_-]{16,64})\/?$/.exec(new URL(text.trim()).pathname);
    return m ? m[1] : null;
  } catch {
    return null;
  }
}

export type LookupState =
  | { kind: 'idle' }
  | { kind: 'looking'; what: string }
  | { kind: 'unknown-label' }
  | { kind: 'unknown-number'; containerNumber: string }
  | { kind: 'not-a-label'; text: string }
  | { kind: 'failed'; message: string };

/**
 * Finds the unit behind a scanned text or a typed number and hands it to `onFound`; says why when there is none.
 * `findByNumber` comes from the units feature (the route composes the two).
 */
export function useUnitLookup(
  onFound: (unit: UnitDto) => void,
  findByNumber: (containerNumber: string) => Promise<UnitDto>,
) {
  const queryClient = useQueryClient();
  const [state, setState] = useState<LookupState>({ kind: 'idle' });

  const run = async (what: string, load: () => Promise<UnitDto>, notFound: LookupState) => {
    setState({ kind: 'looking', what });
    try {
      onFound(await load());
      setState({ kind: 'idle' });
    } catch (error) {
      if (isApiError(error) && error.status === 404) setState(notFound);
      else setState({ kind: 'failed', message: error instanceof Error ? error.message : 'The lookup failed.' });
    }
  };

  const byNumber = (containerNumber: string) =>
    run(formatContainerNumber(containerNumber), () => findByNumber(containerNumber), {
      kind: 'unknown-number',
      containerNumber,
    });

  const byScan = (text: string) => {
    const token = labelTokenFrom(text);
    if (token) return run('label', () => queryClient.fetchQuery(unitByTokenQuery(token)), { kind: 'unknown-label' });
    // Some fleets' own labels carry just the container number.
    const number = parseContainerNumber(text);
    if (number.ok) return byNumber(number.value);
    setState({ kind: 'not-a-label', text: text.length > 80 ? `${text.slice(0, 80)}…` : text });
  };

  return { state, byScan, byNumber, reset: () => setState({ kind: 'idle' }) };
}

/** What the last lookup found out, with a way on: register the unit (for those who may) or try again. */
export function LookupMessage({
  state,
  registerHref,
}: {
  state: LookupState;
  registerHref: (containerNumber?: string) => string;
}) {
  switch (state.kind) {
    case 'idle':
      return null;
    case 'looking':
      return (
        <div
          role="status"
          className="flex items-center gap-3 rounded-md border-2 border-fjord-700 bg-fjord-50 px-4 py-3 text-lg font-semibold"
        >
          <Spinner /> Opening {state.what}…
        </div>
      );
    case 'unknown-label':
      return (
        <Alert tone="heed" title="This label is not linked to any unit">
          <p>It may be an old label that was replaced. Type the container number painted on the unit instead.</p>
          <Can permission="manage:units">
            <ButtonLink to={registerHref()} variant="secondary" className="mt-3">
              Register a unit
            </ButtonLink>
          </Can>
        </Alert>
      );
    case 'unknown-number':
      return (
        <Alert tone="heed" title={`No unit is registered as ${formatContainerNumber(state.containerNumber)}`}>
          <Can permission="manage:units" fallback={<p>Ask a fleet engineer to register it.</p>}>
            <p>It is a valid container number; register the unit to start its record.</p>
            <ButtonLink to={registerHref(state.containerNumber)} variant="primary" className="mt-3">
              Register {formatContainerNumber(state.containerNumber)}
            </ButtonLink>
          </Can>
        </Alert>
      );
    case 'not-a-label':
      return (
        <Alert tone="heed" title="That QR code is not a Tightloop label">
          {/* A link's address has no spaces to wrap at: it may break anywhere rather than run past the box. */}
          It reads “<span className="wrap-anywhere">{state.text}</span>”. Point the camera at the unit’s Tightloop
          label, or type the container number.
        </Alert>
      );
    case 'failed':
      return (
        <Alert tone="alarm" title="The unit could not be opened">
          {state.message}
        </Alert>
      );
  }
}

/** Type the number painted on the unit; the check digit is checked while typing, before anything is sent. */
export function ManualLookup({ onLookup, busy }: { onLookup: (containerNumber: string) => void; busy: boolean }) {
  const [value, setValue] = useState('');
  const [error, setError] = useState<string | undefined>(undefined);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const r = parseContainerNumber(value);
    if (!r.ok) return setError(r.error);
    setError(undefined);
    onLookup(r.value);
  };
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3" aria-label="Open a unit by container number">
      <ContainerNumberField
        label="Container number"
        scale="xl"
        value={value}
        error={error}
        placeholder="HRLU 100001 6"
        enterKeyHint="go"
        onChange={(e) => {
          setValue(e.target.value);
          setError(undefined);
        }}
      />
      <Button type="submit" size="lg" pending={busy} pendingLabel="Opening…" className="min-h-16 text-xl">
        Open unit
      </Button>
    </form>
  );
}
