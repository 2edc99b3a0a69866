// The next top-up forecast's backtest (`npm run backtest`): learned from a simulated fleet of another seed, tested
// on the benchmark fleet's own first units.
import { backtestForecast, type BacktestResult } from '../../seed/simulator/backtest';
import { createFleet, DEFAULT_SEED } from '../../seed/simulator/fleet';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import type { LaterPart } from './context';
import { runsPart } from './options';

export const backtest: LaterPart<BacktestResult | null> = {
  id: 'backtest',
  needsServers: false,
  async run({ options, dataset }) {
    if (!runsPart(options, 'backtest')) return null;
    const { backtestUnits, backtestTrainSeed } = options;
    const { seedInfo } = dataset;
    console.log(
      `Forecast backtest (\`npm run backtest\`): trained on ${backtestUnits.toLocaleString('en')} units of seed ${backtestTrainSeed}, tested on the benchmark fleet's first ${backtestUnits.toLocaleString('en')}…`,
    );
    const now = new Date(String(seedInfo?.asOf ?? new Date().toISOString()));
    const test = createFleet({
      seed: Number(seedInfo?.seed ?? DEFAULT_SEED),
      units: Number(seedInfo?.units ?? dataset.unitTotal) - 1,
      now,
      busyUnitEvents: 0,
    });
    const units = Math.min(backtestUnits, test.units);
    return backtestForecast({
      train: createFleet({ seed: backtestTrainSeed, units, now }),
      test,
      trainUnits: units,
      testUnits: units,
      settings: DEFAULT_SETTINGS,
    });
  },
  markdown(b) {
    if (!b) return [];
    const a = b.all;
    return [
      `Next top-up forecast (DOMAIN.md §7b, \`npm run backtest -- --seed ${b.testSeed} --train-seed ${b.trainSeed} --units ${b.testUnits}\`): ` +
        `case base learned from ${b.caseBaseCases.toLocaleString('en')} cut-offs of a ${b.trainUnits.toLocaleString('en')}-unit fleet of seed ${b.trainSeed} ` +
        `(${(b.caseBaseMs / 1000).toFixed(1)} s), tested on ${b.cases.toLocaleString('en')} cut-offs of the benchmark fleet (seed ${b.testSeed}), ` +
        `K = ${b.k}: MAE **${a.forecastMaeDays} days** = ${(a.forecastMaeDays / (a.naiveMaeDays ?? Number.NaN)).toFixed(2)} × naive ` +
        `("the last interval repeats", ${a.naiveMaeDays} days; target ≤ 0.55), the rhythm alone ${a.rhythmMaeDays} days; the 80 % range held ` +
        `**${(a.coverage80 * 100).toFixed(1)} %** (target 75–85 %), pinball loss of its ends ${a.pinball1090Days} days; ${a.forecastBeforeCutoff} dates before the cut-off.`,
      '',
      '| situation at the cut-off | cases | forecast MAE (bias) d | rhythm MAE d | naive MAE d | 80 % range held | pinball 10/90 d |',
      '|---|---:|---:|---:|---:|---:|---:|',
      ...[...b.bySituation, a].map(
        (r) =>
          `| ${r.title} | ${r.cases.toLocaleString('en')} | ${r.forecastMaeDays} (${r.forecastBiasDays >= 0 ? '+' : ''}${r.forecastBiasDays}) | ${r.rhythmMaeDays} | ` +
          `${r.naiveMaeDays} | ${(r.coverage80 * 100).toFixed(1)} % | ${r.pinball1090Days} |`,
      ),
    ];
  },
};
