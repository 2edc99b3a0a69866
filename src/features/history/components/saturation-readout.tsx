import {
  convertPressure,
  convertTemperature,
  isDomainError,
  saturationRange,
  saturationTemperatureC,
} from '../../../../shared/domain';
import { cx } from '../../../components/ui/cx';
import { temperatureSymbol, type UnitPrefs } from '../utils/unit-prefs';
import { parseTyped } from '../utils/visit-form-model';
import { fmtNumber } from '../../../lib/format';

type Reading = { state: 'empty' } | { state: 'ok'; tempC: number } | { state: 'out'; message: string };

/** The saturation (dew) temperature of a typed gauge pressure, for the unit's refrigerant. */
function readSaturation(refrigerant: string, typed: string, unit: UnitPrefs['pressure']): Reading {
  const value = parseTyped(typed);
  if (value === undefined || Number.isNaN(value)) return { state: 'empty' };
  let kPaAbs: number;
  try {
    kPaAbs = convertPressure(value, { unit, ref: 'gauge' }, { unit: 'kPa', ref: 'absolute' });
  } catch (e) {
    if (isDomainError(e)) return { state: 'out', message: 'Below a perfect vacuum: check the reading.' };
    throw e;
  }
  try {
    return { state: 'ok', tempC: saturationTemperatureC(refrigerant, kPaAbs, 'dew') };
  } catch (e) {
    if (!isDomainError(e)) throw e;
    try {
      const range = saturationRange(refrigerant, 'dew');
      const g = (kPa: number) => convertPressure(kPa, { unit: 'kPa', ref: 'absolute' }, { unit, ref: 'gauge' });
      const digits = unit === 'kPa' ? 0 : 1;
      const f = (kPa: number) => `${fmtNumber(g(kPa), digits)} ${unit} gauge`;
      if (kPaAbs >= range.maxKPaAbs && range.endsAtCritical) {
        return {
          state: 'out',
          message: `Above ${refrigerant}'s critical point (${f(range.maxKPaAbs)})${refrigerant === 'R-744' ? ': supercritical' : ''}. No saturation temperature exists here.`,
        };
      }
      return {
        state: 'out',
        message:
          kPaAbs < range.minKPaAbs
            ? `Below ${refrigerant}'s saturation data (it starts at ${f(range.minKPaAbs)}); no temperature shown.`
            : `Above ${refrigerant}'s saturation data (it ends at ${f(range.maxKPaAbs)}); no temperature shown.`,
      };
    } catch {
      return { state: 'out', message: `No saturation data for ${refrigerant}.` };
    }
  }
}

const signed = (v: number) => `${v < 0 ? '−' : ''}${fmtNumber(Math.abs(v), 1)}`;

/** "Evaporating at −6.2 °C · dew point; site elevation ignored", live beside the pressure being typed. */
export function SaturationReadout({
  refrigerant,
  typed,
  pressureUnit,
  temperatureUnit,
  side,
}: {
  refrigerant: string;
  typed: string;
  pressureUnit: UnitPrefs['pressure'];
  temperatureUnit: UnitPrefs['temperature'];
  side: 'suction' | 'discharge';
}) {
  // A unit known only by its label: its refrigerant, and so its saturation table, is not known on the phone.
  if (!refrigerant) return null;
  const r = readSaturation(refrigerant, typed, pressureUnit);
  const word = side === 'suction' ? 'Evaporating' : 'Condensing';
  return (
    <p
      aria-live="polite"
      className={cx(
        'rounded-sm px-2 py-1 text-sm',
        r.state === 'out' ? 'bg-heed-50 font-semibold text-heed-800' : 'bg-fjord-50 text-fjord-900',
        r.state === 'empty' && 'text-ink-600',
      )}
    >
      {r.state === 'empty' && (
        <>
          {word} temperature appears as you type ({refrigerant}).
        </>
      )}
      {r.state === 'ok' && (
        <>
          <span className="font-semibold tabular-nums">
            {word} at {signed(convertTemperature(r.tempC, 'C', temperatureUnit))} {temperatureSymbol(temperatureUnit)}
          </span>{' '}
          <span className="text-fjord-900/80">· {refrigerant} dew point; site elevation ignored</span>
        </>
      )}
      {r.state === 'out' && r.message}
    </p>
  );
}
