// `npm run backtest -- --seed <n> --train-seed <m> --units <k> [--json]`: the next top-up forecast (DOMAIN.md §7b)
// learned from a simulated training fleet (seed m) and measured on a test fleet from another seed (n), against the
// unit's rhythm (§7a) and the naive "the last interval repeats". --json prints one JSON object as the last line;
// `-- --help` lists every option.
import { createFleet } from '../seed/simulator/fleet';
import { backtestForecast, type BacktestRow } from '../seed/simulator/backtest';
import { settingsSchema } from '../shared/schemas/settings';
import { parseCli } from './lib/cli';

const options = parseCli(
  `npm run backtest [-- options]: the next top-up forecast (DOMAIN.md §7b) learned from a simulated training fleet and
measured on a test fleet from another seed, against the unit's rhythm (§7a) and "the last interval repeats".`,
  {
    seed: { type: 'number', default: 11, integer: true, min: 0, help: 'seed of the test fleet' },
    'train-seed': { type: 'number', default: 7, integer: true, min: 0, help: 'seed of the training fleet' },
    units: { type: 'number', default: 4000, integer: true, min: 0, help: 'units of the test fleet' },
    'train-units': { type: 'number', integer: true, min: 0, help: 'units of the training fleet (default: --units)' },
    step: { type: 'number', default: 30, integer: true, min: 0, placeholder: 'days', help: 'days between cut-offs' },
    now: { type: 'string', default: '2026-12-01', placeholder: 'date', help: 'the day both fleets are seen from' },
    k: { type: 'number', default: 100, integer: true, min: 0, help: 'neighbours (the setting)' },
    json: { type: 'boolean', help: 'print one JSON object as the last line' },
  },
);
const testSeed = options.seed;
const trainSeed = options['train-seed'];
const units = options.units;
const trainUnits = options['train-units'] ?? units;
const stepDays = options.step;
const now = new Date(`${options.now}T00:00:00Z`);
const json = options.json;
if (testSeed === trainSeed) console.warn('The test fleet has the training seed: the result is not a fair test.');
const settings = settingsSchema.parse({ forecast: { neighbours: options.k } });

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
