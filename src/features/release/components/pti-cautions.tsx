import { Caution } from '../../../components/ui/caution';

/** The hazards of a PTI, always on screen. */
export function PtiCautions() {
  return (
    <Caution title="Safety">
      <ul className="flex flex-col gap-1.5">
        <li>
          <span className="font-semibold">Electrical:</span> the unit runs on 380–460 V three-phase. Isolate and lock
          out the supply before opening the control box or touching terminals; check the plug and cable before you
          connect.
        </li>
        <li>
          <span className="font-semibold">Self-test:</span> the controller starts fans, the compressor and heaters on
          its own. Keep hands, tools and loose clothing clear of fan guards and the condenser; heaters get hot.
        </li>
        <li>
          <span className="font-semibold">Pressure:</span> gauges on a running circuit see high pressure and liquid
          refrigerant (frostbite). Wear glasses and gloves; CO2 units run far higher.
        </li>
      </ul>
    </Caution>
  );
}
