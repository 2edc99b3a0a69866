/** The hazards of a PTI, always on screen. */
export function PtiCautions() {
  return (
    <aside aria-label="Safety" className="rounded-md border-2 border-heed-800 bg-heed-50 px-3 py-2 text-ink-950">
      <p className="font-semibold text-heed-800">Safety</p>
      <ul className="mt-1 flex flex-col gap-1.5 text-sm leading-snug">
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
      <p className="mt-2 text-sm font-semibold">
        Local regulations and the equipment maker&apos;s instructions take precedence over this checklist.
      </p>
    </aside>
  );
}
