// `npm run backtest -- --seed <n> --train-seed <m> --units <k> [--json]`: the next top-up forecast (DOMAIN.md §7b)
// learned from a simulated training fleet (seed m) and measured on a test fleet from another seed (n), against the
// unit's rhythm (§7a) and the naive "the last interval repeats". --json prints one JSON object as the last line.
//   --train-units <k>  units of the training fleet (default: --units)   --step <days>  days between cut-offs (30)
//   --now <date>       the day both fleets are seen from (2026-12-01)   --k <n>        neighbours (the setting, 100)
import { createFleet } from '../seed/simulator/fleet';
import { backtestForecast, type BacktestRow } from '../seed/simulator/backtest';
import { settingsSchema } from '../shared/schemas/settings';

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}
function num(name: string, fallback: number): number {
  const v = arg(name);
  if (v === undefined) return fallback;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 0) {
    console.error(`--${name} must be a whole number, not ${v}`);
    process.exit(2);
  }
  return n;
}
const testSeed = num('seed', 11);
const trainSeed = num('train-seed', 7);
const units = num('units', 4000);
const trainUnits = num('train-units', units);
const stepDays = num('step', 30);
const now = new Date(`${arg('now') ?? '2026-12-01'}T00:00:00Z`);
const json = process.argv.includes('--json');
if (testSeed === trainSeed) console.warn('The test fleet has the training seed: the result is not a fair test.');
const settings = settingsSchema.parse({ forecast: { neighbours: num('k', 100) } });

const result = backtestForecast({
  train: createFleet({ seed: trainSeed, units: trainUnits, now }),
  test: createFleet({ seed: testSeed, units, now }),
  trainUnits,
  testUnits: units,
  settings,
  stepDays,
});

const pct = (x: number | null) => (x === null ? '–' : `${(x * 100).toFixed(1)} %`);
const line = (r: BacktestRow) =>
  `| ${r.title} | ${r.cases.toLocaleString('en')} | ${r.forecastMaeDays} | ${r.rhythmMaeDays} | ${r.naiveMaeDays ?? '–'} | ${pct(r.coverage80)} | ` +
  `${r.pinball1090Days} | ${pct(r.rhythmCoverage)} of ${pct(r.rhythmRangeShare)} | ${pct(r.rhythmBeforeCutoff)} |`;
console.log(
  `Training fleet seed ${trainSeed} (${trainUnits.toLocaleString('en')} units, ${result.caseBaseCases.toLocaleString('en')} cases, ` +
    `${(result.caseBaseMs / 1000).toFixed(1)} s); test fleet seed ${testSeed} (${units.toLocaleString('en')} units, ` +
    `${result.unitsWithTopUps.toLocaleString('en')} with top-ups), a cut-off every ${stepDays} days, K = ${result.k}.`,
);
console.log('');
console.log(
  '| situation at the cut-off | cases | forecast MAE d | rhythm MAE d | naive MAE d | 80 % range held | pinball 10/90 d | rhythm range held (of cases with one) | rhythm date already past |',
);
console.log('|---|---:|---:|---:|---:|---:|---:|---:|---:|');
for (const r of result.bySituation) console.log(line(r));
console.log(line(result.all));
console.log(line(result.withoutNaive));
console.log('');
const a = result.all;
const ratio = a.forecastMaeDays / (a.naiveMaeDays ?? Number.NaN);
const inRange = result.bySituation
  .filter((r) => r.cases >= 500)
  .every((r) => r.coverage80 >= 0.75 && r.coverage80 <= 0.85);
console.log(
  `Forecast MAE ${a.forecastMaeDays} d = ${ratio.toFixed(2)} × naive (${a.naiveMaeDays} d; target ≤ 0.55); rhythm ${a.rhythmMaeDays} d; ` +
    `80 % range held ${pct(a.coverage80)} (target 75–85 % in every situation with ≥ 500 cases: ${inRange ? 'met' : 'NOT met'}); ` +
    `dates before the cut-off: ${a.forecastBeforeCutoff}. Test took ${(result.testMs / 1000).toFixed(1)} s.`,
);
if (json) {
  console.log(
    JSON.stringify({
      cases: result.cases,
      forecastMaeDays: a.forecastMaeDays,
      naiveMaeDays: a.naiveMaeDays,
      rhythmMaeDays: a.rhythmMaeDays,
      coverage80: a.coverage80,
      pinball1090Days: a.pinball1090Days,
      trainSeed,
      testSeed,
      units,
      k: result.k,
      bySituation: result.bySituation,
    }),
  );
}
