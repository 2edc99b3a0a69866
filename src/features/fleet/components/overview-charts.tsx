import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { useParentSize } from '@visx/responsive';
import { scaleBand, scaleLinear } from '@visx/scale';
import { Bar, Line } from '@visx/shape';
import { useMemo, useState } from 'react';
import type { FleetOverviewDto } from '../../../../shared/schemas/fleet';
import { cx } from '../../../components/ui/cx';
import { fmtKg, fmtMonth, fmtTonnes } from '../../../lib/format';
import { foldSmallSeries, type Stacked } from '../utils/fold-series';

const INK = '#2f434d';
const GRID = '#cbd3d6';
/** Series colours from the design tokens, dark to light, each readable against paper and told apart by the legend. */
const SERIES = [
  '#005264',
  '#a9d62e',
  '#7a4300',
  '#a3190f',
  '#435762',
  '#15613a',
  '#7b8c95',
  '#00404f',
  '#dbf78f',
  '#13222b',
];
const tickLabel = { fill: INK, fontSize: 13, fontFamily: 'Work Sans, sans-serif' };
/** The charts' axes: ink lines, labels in the app's type; the count axis on the left with four ticks. */
const leftAxis = {
  numTicks: 4,
  stroke: INK,
  tickStroke: INK,
  tickLabelProps: () => ({ ...tickLabel, textAnchor: 'end' as const, dx: -4, dy: 4 }),
  labelProps: { ...tickLabel, fontSize: 12 },
};
const bottomAxis = {
  stroke: INK,
  tickStroke: INK,
  tickLabelProps: () => ({ ...tickLabel, textAnchor: 'middle' as const }),
};

/** Histogram of the rolling 365-day leak rate across the fleet, with the alert threshold marked. */
export function LeakRateHistogram({ data }: { data: FleetOverviewDto['leakRate'] }) {
  const { parentRef, width } = useParentSize({ debounceTime: 50, initialSize: { width: 360 } });
  const height = 240;
  const m = { top: 16, right: 12, bottom: 44, left: 52 };
  const innerW = Math.max(120, width - m.left - m.right);
  const innerH = height - m.top - m.bottom;
  const x = scaleLinear({ domain: [0, 110], range: [0, innerW] });
  const max = Math.max(1, ...data.bins.map((b) => b.units));
  const y = scaleLinear({ domain: [0, max], range: [innerH, 0], nice: true });
  const t = Math.min(110, data.thresholdPct);
  return (
    <div ref={parentRef} className="w-full">
      <svg
        width={width}
        height={height}
        role="img"
        aria-label={`Units per 10 % of rolling leak rate; ${data.zero} units with no made-up refrigerant in the last 365 days are not drawn.`}
      >
        <Group left={m.left} top={m.top}>
          {y.ticks(4).map((v) => (
            <Line key={v} from={{ x: 0, y: y(v) }} to={{ x: innerW, y: y(v) }} stroke={GRID} strokeDasharray="2 3" />
          ))}
          {data.bins.map((b) => {
            const x0 = x(b.fromPct);
            const x1 = x(b.toPct ?? 110);
            const h = innerH - y(b.units);
            return (
              <Bar
                key={b.fromPct}
                x={x0 + 1}
                y={y(b.units)}
                width={Math.max(1, x1 - x0 - 2)}
                height={h}
                fill={b.fromPct >= data.thresholdPct ? '#a3190f' : '#005264'}
                rx={2}
              >
                <title>{`${b.toPct === null ? `${b.fromPct} % and above` : `${b.fromPct}–${b.toPct} %`}: ${b.units} units`}</title>
              </Bar>
            );
          })}
          <Line
            from={{ x: x(t), y: 0 }}
            to={{ x: x(t), y: innerH }}
            stroke="#0b161d"
            strokeWidth={2}
            strokeDasharray="6 4"
          />
          <text x={x(t) + 6} y={12} fontSize={13} fill="#0b161d" fontWeight={600} fontFamily="Work Sans, sans-serif">
            alert {data.thresholdPct} %
          </text>
          <AxisLeft scale={y} {...leftAxis} label="units" />
          <AxisBottom
            top={innerH}
            scale={x}
            tickValues={[0, 20, 40, 60, 80, 100]}
            tickFormat={(v) => (Number(v) === 100 ? '≥100 %' : `${v} %`)}
            {...bottomAxis}
            label="rolling leak rate, share of full charge in 365 days"
            labelProps={{ ...tickLabel, fontSize: 12, textAnchor: 'middle' }}
          />
        </Group>
      </svg>
    </div>
  );
}

type Measure = 'kg' | 'co2e';
type GroupBy = 'site' | 'refrigerant';

/** Each month's amounts per site or refrigerant; the series ordered largest first, so the biggest sits at the bottom. */
function stackEmissions(data: FleetOverviewDto['emissions'], measure: Measure, groupBy: GroupBy): Stacked {
  const byMonth = new Map<string, Map<string, number>>(data.months.map((m) => [m, new Map()]));
  const keyTotals = new Map<string, number>();
  const rows =
    groupBy === 'site'
      ? data.bySite.map((r) => ({ ...r, key: r.site?.name ?? 'No site' }))
      : data.byRefrigerant.map((r) => ({ ...r, key: r.refrigerant }));
  for (const r of rows) {
    const key = r.key;
    const v = measure === 'kg' ? r.madeUpKg : r.co2eTonnes;
    const row = byMonth.get(r.month);
    if (!row) continue;
    row.set(key, (row.get(key) ?? 0) + v);
    keyTotals.set(key, (keyTotals.get(key) ?? 0) + v);
  }
  const keys = [...keyTotals.entries()].sort((a, b) => b[1] - a[1]).map(([k]) => k);
  const totals = new Map(data.months.map((m) => [m, [...(byMonth.get(m)?.values() ?? [])].reduce((s, v) => s + v, 0)]));
  // 21 sites over ten colours repeated them: the top nine keep a colour each, the rest share "other".
  return foldSmallSeries({ keys, byMonth, totals }, SERIES.length, (n) =>
    groupBy === 'site' ? `Other sites (${n})` : `Other refrigerants (${n})`,
  );
}

/** The chart's figures as a table, for reading exact amounts and for screen readers. */
function EmissionsTable({
  months,
  stacked,
  amount,
}: {
  months: string[];
  stacked: Stacked;
  amount: (v: number) => string;
}) {
  const { keys, byMonth, totals } = stacked;
  return (
    <details className="text-sm">
      <summary className="min-h-touch cursor-pointer py-3 font-semibold text-fjord-700">The figures as a table</summary>
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead>
            <tr>
              <th className="py-1 pr-3">Month</th>
              {keys.map((k) => (
                <th key={k} className="py-1 pr-3">
                  {k}
                </th>
              ))}
              <th className="py-1">Total</th>
            </tr>
          </thead>
          <tbody>
            {months.map((month) => (
              <tr key={month} className="border-t border-ink-100">
                <td className="py-1 pr-3 tabular-nums">{month}</td>
                {keys.map((k) => (
                  <td key={k} className="py-1 pr-3 tabular-nums">
                    {amount(byMonth.get(month)?.get(k) ?? 0)}
                  </td>
                ))}
                <td className="py-1 tabular-nums">{amount(totals.get(month) ?? 0)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}

/** Made-up refrigerant per month, stacked by site or refrigerant, in kg or t CO2e. */
export function EmissionsChart({ data }: { data: FleetOverviewDto['emissions'] }) {
  const [measure, setMeasure] = useState<Measure>('co2e');
  const [groupBy, setGroupBy] = useState<GroupBy>('site');
  const { parentRef, width } = useParentSize({ debounceTime: 50, initialSize: { width: 360 } });

  const stacked = useMemo(() => stackEmissions(data, measure, groupBy), [data, measure, groupBy]);
  const { keys, byMonth, totals } = stacked;

  const height = 280;
  const m = { top: 16, right: 12, bottom: 40, left: 56 };
  const innerW = Math.max(120, width - m.left - m.right);
  const innerH = height - m.top - m.bottom;
  const x = scaleBand({ domain: data.months, range: [0, innerW], padding: 0.25 });
  const y = scaleLinear({ domain: [0, Math.max(0.001, ...totals.values())], range: [innerH, 0], nice: true });
  const colour = (k: string) => SERIES[keys.indexOf(k) % SERIES.length];
  const unit = measure === 'kg' ? 'kg' : 't CO2e';
  const amount = (v: number) => (measure === 'kg' ? fmtKg(v) : `${fmtTonnes(v)} CO2e`);
  const every = Math.ceil(data.months.length / Math.max(1, Math.floor(innerW / 56)));
  const total = [...totals.values()].reduce((s, v) => s + v, 0);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap gap-3">
        <Toggle
          label="Show"
          value={measure}
          onChange={setMeasure}
          options={[
            ['co2e', 't CO2e'],
            ['kg', 'kg'],
          ]}
        />
        <Toggle
          label="Stack by"
          value={groupBy}
          onChange={setGroupBy}
          options={[
            ['site', 'Site'],
            ['refrigerant', 'Refrigerant'],
          ]}
        />
      </div>
      <p className="text-base text-ink-700">
        {amount(total)} made up in {data.months.length} months (GWP {data.gwpBasis}
        ).
      </p>
      <div ref={parentRef} className="w-full">
        <svg
          width={width}
          height={height}
          role="img"
          aria-label={`Made-up refrigerant per month in ${unit}, stacked by ${groupBy}. The table below has the figures.`}
        >
          <Group left={m.left} top={m.top}>
            {y.ticks(4).map((v) => (
              <Line key={v} from={{ x: 0, y: y(v) }} to={{ x: innerW, y: y(v) }} stroke={GRID} strokeDasharray="2 3" />
            ))}
            {data.months.map((month) => {
              let acc = 0;
              return keys.map((k) => {
                const v = byMonth.get(month)?.get(k) ?? 0;
                if (v <= 0) return null;
                const y0 = y(acc);
                acc += v;
                const y1 = y(acc);
                return (
                  <Bar
                    key={`${month}-${k}`}
                    x={x(month)}
                    y={y1}
                    width={x.bandwidth()}
                    height={Math.max(0.5, y0 - y1)}
                    fill={colour(k)}
                    stroke="#ffffff"
                    strokeWidth={0.5}
                  >
                    <title>{`${month} · ${k}: ${amount(v)}`}</title>
                  </Bar>
                );
              });
            })}
            <AxisLeft scale={y} {...leftAxis} label={unit} />
            <AxisBottom
              top={innerH}
              scale={x}
              tickValues={data.months.filter((_, i) => (data.months.length - 1 - i) % every === 0)}
              tickFormat={(v) => fmtMonth(String(v))}
              {...bottomAxis}
            />
          </Group>
        </svg>
      </div>
      {keys.length > 0 && (
        <ul className="flex flex-wrap gap-x-4 gap-y-1" aria-label="Legend">
          {keys.map((k) => (
            <li key={k} className="flex items-center gap-2 text-sm text-ink-800">
              <span aria-hidden="true" className="inline-block size-3.5 rounded-sm" style={{ background: colour(k) }} />
              {k}
            </li>
          ))}
        </ul>
      )}
      <EmissionsTable months={data.months} stacked={stacked} amount={amount} />
    </div>
  );
}

function Toggle<T extends string>({
  label,
  value,
  onChange,
  options,
}: {
  label: string;
  value: T;
  onChange: (v: T) => void;
  options: [T, string][];
}) {
  return (
    <fieldset className="flex items-center gap-2">
      <legend className="sr-only">{label}</legend>
      <span aria-hidden="true" className="text-sm font-semibold text-ink-700">
        {label}
      </span>
      <div className="flex rounded-md border-2 border-ink-400 bg-white p-0.5">
        {options.map(([v, text]) => (
          <label
            key={v}
            className={cx(
              'flex min-h-11 cursor-pointer items-center rounded-sm px-3 text-sm font-semibold',
              value === v ? 'bg-fjord-700 text-white' : 'text-ink-800',
            )}
          >
            <input type="radio" className="sr-only" checked={value === v} onChange={() => onChange(v)} />
            {text}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
