import type { ReactNode } from 'react';
import { useController, useWatch } from 'react-hook-form';
import { LEAK_CHECK_METHODS, LEAK_LOCATIONS, REPAIR_ACTIONS, SIGHT_GLASS_STATES } from '../../../../shared/domain';
import { UNIT_STATUS_VALUES, type VisitEventKind } from '../../../../shared/schemas/history';
import { Button } from '../../../components/ui/button';
import { ENTRY_KIND_LABELS } from '../utils/labels';
import { UNIT_STATUS_LABELS } from '../../../../shared/schemas/units';
import { cautionsFor } from '../utils/safety';
import {
  MASS_CHOICES,
  PRESSURE_CHOICES,
  TEMPERATURE_CHOICES,
  temperatureSymbol,
  type UnitPrefs,
} from '../utils/unit-prefs';
import type { VisitControl } from '../utils/visit-form-model';
import { ChoiceChips, DecimalField, TextInput, Toggle, UnitSwitch, type Choice } from './form-controls';
import { EntryGlyph } from './entry-glyph';
import { SafetyCautions } from './safety-cautions';
import { SaturationReadout } from './saturation-readout';

/** A register cylinder picked for a charge or recovery. */
export type PickedCylinderRef = { id: number; code: string };
/**
 * The cylinder picker the page brings (the cylinders feature): the entry only keeps what it picks — the cylinder's id,
 * and its number as the entry's cylinder text.
 */
export type CylinderSlot = (args: {
  recovery: boolean;
  refrigerant: string;
  value: PickedCylinderRef | null;
  onPick: (c: PickedCylinderRef | null) => void;
}) => ReactNode;

type Props = {
  control: VisitControl;
  index: number;
  kind: VisitEventKind;
  refrigerant: string;
  cylinderSlot?: CylinderSlot;
  onUnitsChange: (change: Partial<UnitPrefs>) => void;
  onRemove: () => void;
};

const terms = (list: readonly { id: string; label: string }[]): Choice[] =>
  list.map((t) => ({ value: t.id, label: t.label }));

function CylinderChoice({ control, index, kind, refrigerant, cylinderSlot }: Props & { cylinderSlot: CylinderSlot }) {
  const id = useController({ control, name: `events.${index}.cylinderId` });
  const text = useController({ control, name: `events.${index}.cylinder` });
  const value = id.field.value != null ? { id: id.field.value as number, code: text.field.value as string } : null;
  return cylinderSlot({
    recovery: kind === 'recovery',
    refrigerant,
    value,
    onPick: (c) => {
      id.field.onChange(c?.id ?? null);
      text.field.onChange(c?.code ?? '');
    },
  });
}

function MassFields(props: Props) {
  const { control, index, kind, onUnitsChange, cylinderSlot } = props;
  const unit = useController({ control, name: `events.${index}.massUnit` });
  const isLb = unit.field.value === 'lb';
  return (
    <>
      <div className="sm:max-w-sm">
        <DecimalField
          control={control}
          name={`events.${index}.kg`}
          label={kind === 'recovery' ? 'Mass recovered' : kind === 'recharge' ? 'Mass charged' : 'Mass added'}
          unit={isLb ? 'lb' : 'kg'}
          step={isLb ? 0.25 : 0.1}
          big
          labelAside={
            <UnitSwitch
              label="Mass unit"
              value={unit.field.value as UnitPrefs['mass']}
              units={MASS_CHOICES}
              onChange={(u) => {
                unit.field.onChange(u);
                onUnitsChange({ mass: u });
              }}
            />
          }
        />
      </div>
      {cylinderSlot && <CylinderChoice {...props} cylinderSlot={cylinderSlot} />}
      <TextInput
        control={control}
        name={`events.${index}.cylinder`}
        label={kind === 'recovery' ? 'Recovery cylinder' : 'Cylinder or lot'}
        hint={
          kind === 'recovery'
            ? 'The number on the recovery cylinder.'
            : 'As printed on the cylinder: traces the gas if a batch is ever suspect.'
        }
        autoCapitalize="characters"
        placeholder={kind === 'recovery' ? 'REC-07' : 'CYL-2231'}
      />
      {kind !== 'recovery' && (
        <Toggle
          control={control}
          name={`events.${index}.reusedRecovered`}
          label="Recovered refrigerant put back"
          hint="Recycled or reclaimed gas: the refrigerant log records it."
        />
      )}
      {kind === 'recharge' && (
        <Toggle
          control={control}
          name={`events.${index}.excludedFromLeakRate`}
          label="First fill or retrofit"
          hint="A new installation or a change of refrigerant: not counted as leaked refrigerant."
        />
      )}
    </>
  );
}

function LeakCheckFields({ control, index }: Props) {
  const found = useWatch({ control, name: `events.${index}.leakFound` });
  const location = useWatch({ control, name: `events.${index}.location` });
  return (
    <>
      <ChoiceChips
        control={control}
        name={`events.${index}.method`}
        legend="Method"
        choices={terms(LEAK_CHECK_METHODS)}
      />
      <ChoiceChips
        control={control}
        name={`events.${index}.leakFound`}
        legend="Result"
        choices={[
          { value: 'no', label: 'No leak found' },
          { value: 'yes', label: 'Leak found' },
        ]}
      />
      {found === 'yes' && (
        <ChoiceChips
          control={control}
          name={`events.${index}.location`}
          legend="Where is the leak?"
          choices={terms(LEAK_LOCATIONS)}
        />
      )}
      {found === 'yes' && location === 'other' && (
        <TextInput control={control} name={`events.${index}.locationOther`} label="Describe the location" />
      )}
    </>
  );
}

function RepairFields({ control, index }: Props) {
  const location = useWatch({ control, name: `events.${index}.location` });
  const action = useWatch({ control, name: `events.${index}.action` });
  return (
    <>
      <ChoiceChips control={control} name={`events.${index}.location`} legend="Where" choices={terms(LEAK_LOCATIONS)} />
      {location === 'other' && (
        <TextInput control={control} name={`events.${index}.locationOther`} label="Describe the location" />
      )}
      <ChoiceChips
        control={control}
        name={`events.${index}.action`}
        legend="What was done"
        choices={terms(REPAIR_ACTIONS)}
      />
      {action === 'other' && (
        <TextInput control={control} name={`events.${index}.actionOther`} label="Describe what was done" />
      )}
      <Toggle
        control={control}
        name={`events.${index}.verified`}
        label="Repair verified"
        hint="Pressure- or leak-tested after the repair and found tight."
      />
    </>
  );
}

function PressureFields({ control, index, refrigerant, onUnitsChange }: Props) {
  const pUnit = useController({ control, name: `events.${index}.pressureUnit` });
  const tUnit = useController({ control, name: `events.${index}.temperatureUnit` });
  const suction = useWatch({ control, name: `events.${index}.suctionKPaG` });
  const discharge = useWatch({ control, name: `events.${index}.dischargeKPaG` });
  const p = pUnit.field.value as UnitPrefs['pressure'];
  const t = tUnit.field.value as UnitPrefs['temperature'];
  const deg = temperatureSymbol(t);
  return (
    <>
      <div className="flex flex-wrap items-center gap-3">
        <UnitSwitch
          label="Pressure unit (gauge)"
          value={p}
          units={PRESSURE_CHOICES}
          onChange={(u) => {
            pUnit.field.onChange(u);
            onUnitsChange({ pressure: u });
          }}
        />
        <UnitSwitch
          label="Temperature unit"
          value={t}
          units={TEMPERATURE_CHOICES}
          display={temperatureSymbol}
          onChange={(u) => {
            tUnit.field.onChange(u);
            onUnitsChange({ temperature: u });
          }}
        />
      </div>
      <div className="grid gap-4 sm:grid-cols-2">
        <DecimalField
          control={control}
          name={`events.${index}.suctionKPaG`}
          label={`Suction (${p} gauge)`}
          unit={p}
          allowNegative
          aside={
            <SaturationReadout
              refrigerant={refrigerant}
              typed={suction}
              pressureUnit={p}
              temperatureUnit={t}
              side="suction"
            />
          }
        />
        <DecimalField
          control={control}
          name={`events.${index}.dischargeKPaG`}
          label={`Discharge (${p} gauge)`}
          unit={p}
          aside={
            <SaturationReadout
              refrigerant={refrigerant}
              typed={discharge}
              pressureUnit={p}
              temperatureUnit={t}
              side="discharge"
            />
          }
        />
      </div>
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-base font-semibold">
          Temperatures <span className="text-sm font-normal text-ink-600">(optional)</span>
        </legend>
        {/* Two boxes side by side leave a 390 px phone ~50 px of text beside the sign key: "−17.5" was cut off. */}
        <div className="grid grid-cols-1 gap-3 min-[440px]:grid-cols-2">
          <DecimalField control={control} name={`events.${index}.ambientC`} label="Ambient" unit={deg} allowNegative />
          <DecimalField
            control={control}
            name={`events.${index}.setPointC`}
            label="Set point"
            unit={deg}
            allowNegative
          />
          <DecimalField
            control={control}
            name={`events.${index}.supplyAirC`}
            label="Supply air"
            unit={deg}
            allowNegative
          />
          <DecimalField
            control={control}
            name={`events.${index}.returnAirC`}
            label="Return air"
            unit={deg}
            allowNegative
          />
        </div>
      </fieldset>
      <ChoiceChips
        control={control}
        name={`events.${index}.sightGlass`}
        legend="Sight glass"
        optional
        choices={terms(SIGHT_GLASS_STATES)}
      />
    </>
  );
}

function KindFields(props: Props) {
  const { control, index, kind } = props;
  switch (kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge':
      return <MassFields {...props} />;
    case 'leak_check':
      return <LeakCheckFields {...props} />;
    case 'repair':
      return <RepairFields {...props} />;
    case 'pressure':
      return <PressureFields {...props} />;
    case 'pti':
      return (
        <ChoiceChips
          control={control}
          name={`events.${index}.passed`}
          legend="Result"
          choices={[
            { value: 'pass', label: 'Passed' },
            { value: 'fail', label: 'Failed' },
          ]}
        />
      );
    case 'component_replacement':
      return (
        <TextInput
          control={control}
          name={`events.${index}.component`}
          label="Part replaced"
          placeholder="e.g. filter drier, condenser fan motor"
        />
      );
    case 'status_change':
      return (
        <ChoiceChips
          control={control}
          name={`events.${index}.status`}
          legend="New status"
          columns={1}
          choices={UNIT_STATUS_VALUES.map((s) => ({ value: s, label: UNIT_STATUS_LABELS[s] }))}
        />
      );
    case 'note':
      return null;
  }
}

/** One thing done during the visit: its fields, its cautions and a remove button. */
export function EntryCard(props: Props) {
  const { control, index, kind, refrigerant, onRemove } = props;
  const titleId = `entry-${index}-title`;
  return (
    <section
      aria-labelledby={titleId}
      className="flex flex-col gap-4 rounded-lg border-2 border-ink-200 bg-white p-4 shadow-raised"
      data-entry-kind={kind}
    >
      <div className="flex items-center gap-3">
        <EntryGlyph kind={kind} className="size-9" />
        <h3 id={titleId} className="flex-1 text-lg font-bold">
          {ENTRY_KIND_LABELS[kind]}
        </h3>
        <Button variant="quiet" onClick={onRemove} className="px-3">
          Remove<span className="sr-only"> {ENTRY_KIND_LABELS[kind].toLowerCase()}</span>
        </Button>
      </div>
      <SafetyCautions cautions={cautionsFor(kind, refrigerant)} />
      <KindFields {...props} />
      <TextInput control={control} name={`events.${index}.note`} label="Note" optional={kind !== 'note'} multiline />
    </section>
  );
}
