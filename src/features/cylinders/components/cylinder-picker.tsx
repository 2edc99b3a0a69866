import { useState, type ReactNode } from 'react';
import type { CylinderDto } from '../../../../shared/schemas/cylinders';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { isApiError } from '../../../lib/api-client';
import { useCylinders } from '../api/get-cylinders';
import { cylinderCodeFrom, findCylinderByCode } from '../api/get-cylinder';
import { CylinderCaution } from './cylinder-caution';
import { FillGauge } from './fill-gauge';

export type PickedCylinder = Pick<CylinderDto, 'id' | 'code' | 'kind' | 'refrigerant'>;

/** Why a cylinder does not fit this entry, or null; the server checks the same again. */
export function cylinderMismatch(
  c: Pick<CylinderDto, 'kind' | 'refrigerant' | 'status' | 'code'>,
  want: { refrigerant: string; recovery: boolean; reusedRecovered?: boolean },
): string | null {
  if (c.status === 'quarantined') return `${c.code} is quarantined: do not use it.`;
  if (c.status === 'sent_for_reclaim') return `${c.code} was sent for reclaim.`;
  if (c.refrigerant !== want.refrigerant)
    return `${c.code} holds ${c.refrigerant}; this unit runs on ${want.refrigerant}.`;
  if (want.recovery && c.kind !== 'recovery')
    return `${c.code} is a supply cylinder; recover into a recovery cylinder.`;
  if (!want.recovery && c.kind === 'recovery' && !want.reusedRecovered) return `${c.code} is a recovery cylinder.`;
  return null;
}

/**
 * Chooses the cylinder of a charge or a recovery: the site's usable cylinders of the unit's refrigerant and the right
 * kind, or the number on its label typed or scanned. `scanner` lets the page bring the camera scanner (it lives with
 * the labels feature); it calls back with what the code said.
 */
export function CylinderPicker({
  refrigerant,
  recovery,
  siteId,
  value,
  onChange,
  scanner,
}: {
  refrigerant: string;
  recovery: boolean;
  siteId?: number | null;
  value: PickedCylinder | null;
  onChange: (c: PickedCylinder | null) => void;
  scanner?: (onCode: (text: string) => void) => ReactNode;
}) {
  const list = useCylinders({
    siteId: siteId ?? undefined,
    refrigerant,
    usable: true,
    kind: recovery ? 'recovery' : 'new',
  });
  const [typed, setTyped] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [finding, setFinding] = useState(false);
  const [scanning, setScanning] = useState(false);

  const choose = async (text: string) => {
    const code = cylinderCodeFrom(text);
    if (!code) return;
    setFinding(true);
    setProblem(null);
    try {
      const c = await findCylinderByCode(code);
      const why = cylinderMismatch(c, { refrigerant, recovery });
      if (why) setProblem(why);
      else {
        onChange({ id: c.id, code: c.code, kind: c.kind, refrigerant: c.refrigerant });
        setTyped('');
      }
    } catch (err) {
      setProblem(
        isApiError(err) && err.status === 404 ? `No cylinder ${code} in the register.` : 'Could not look it up.',
      );
    } finally {
      setFinding(false);
      setScanning(false);
    }
  };

  const options = list.data?.cylinders ?? [];
  const chosen = options.find((c) => c.id === value?.id);
  return (
    <fieldset className="flex flex-col gap-3 rounded-lg border-2 border-ink-200 p-3" data-testid="cylinder-picker">
      <legend className="px-1 text-base font-semibold">
        {recovery ? 'Recovery cylinder' : 'Cylinder charged from'}
      </legend>
      {value ? (
        <div className="flex flex-wrap items-center justify-between gap-2">
          <p className="text-lg font-bold" data-testid="picked-cylinder">
            {value.code}
          </p>
          <Button variant="quiet" type="button" onClick={() => onChange(null)}>
            Change
          </Button>
        </div>
      ) : (
        <>
          {options.length > 0 && (
            <ul className="flex flex-wrap gap-2" aria-label="Cylinders at this site">
              {options.map((c) => (
                <li key={c.id}>
                  <button
                    type="button"
                    onClick={() => onChange({ id: c.id, code: c.code, kind: c.kind, refrigerant: c.refrigerant })}
                    className={cx(
                      'min-h-12 rounded-md border-2 px-3 py-2 text-left text-base font-semibold',
                      c.ledger.nearFull ? 'border-alarm-700' : 'border-ink-300',
                    )}
                  >
                    {c.code}
                    {c.lot ? <span className="block text-sm font-normal text-ink-600">lot {c.lot}</span> : null}
                  </button>
                </li>
              ))}
            </ul>
          )}
          <div className="flex flex-wrap items-end gap-2">
            <label className="flex min-w-40 flex-1 flex-col gap-1 text-base font-semibold">
              Number on the cylinder label
              <input
                value={typed}
                onChange={(e) => setTyped(e.target.value)}
                onKeyDown={(e) => {
                  if (e.key === 'Enter') {
                    e.preventDefault();
                    void choose(typed);
                  }
                }}
                autoCapitalize="characters"
                className="min-h-12 rounded-md border-2 border-ink-400 px-3 text-lg font-normal"
              />
            </label>
            <Button type="button" variant="secondary" pending={finding} onClick={() => void choose(typed)}>
              Use
            </Button>
            {scanner && (
              <Button type="button" variant="secondary" onClick={() => setScanning((s) => !s)}>
                {scanning ? 'Stop scanning' : 'Scan label'}
              </Button>
            )}
          </div>
          {scanning && scanner?.((text) => void choose(text))}
        </>
      )}
      {problem && (
        <p role="alert" className="text-base font-semibold text-alarm-700">
          {problem}
        </p>
      )}
      {chosen && <FillGauge cylinder={chosen} />}
      {recovery && <CylinderCaution recovery />}
    </fieldset>
  );
}
