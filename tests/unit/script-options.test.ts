import { describe, expect, it } from 'vitest';
import { CliUsageError, readCliValues, usageText, type CliOption } from '../../scripts/lib/cli';
import { readBenchOptions } from '../../scripts/bench/options';

const OPTIONS = {
  units: { type: 'number', default: 100, integer: true, min: 1, help: 'units' },
  rate: { type: 'number', default: 50, help: 'requests a second' },
  'train-units': { type: 'number', integer: true, help: 'training units' },
  only: { type: 'string', help: 'scenarios' },
  label: { type: 'string', default: 'current', help: 'label' },
  reset: { type: 'boolean', help: 'empty it' },
} satisfies Record<string, CliOption>;

describe('script options', () => {
  it('gives the defaults when no option is passed', () => {
    expect(readCliValues(OPTIONS, [])).toEqual({
      units: 100,
      rate: 50,
      'train-units': undefined,
      only: undefined,
      label: 'current',
      reset: false,
    });
  });

  it('reads --name value and --name=value, numbers as numbers', () => {
    const v = readCliValues(OPTIONS, ['--units', '300', '--rate=2.5', '--only', 'a,b', '--reset']);
    expect(v).toMatchObject({ units: 300, rate: 2.5, only: 'a,b', reset: true });
  });

  it('refuses an unknown option instead of ignoring it', () => {
    expect(() => readCliValues(OPTIONS, ['--unit', '3'])).toThrow(CliUsageError);
  });

  it.each([
    [['--units', 'many'], '--units must be a whole number of at least 1, not "many".'],
    [['--units', '2.5'], '--units must be a whole number of at least 1, not "2.5".'],
    [['--units', '0'], '--units must be a whole number of at least 1, not "0".'],
    [['--rate', ''], '--rate must be a number, not "".'],
  ])('refuses %j', (argv, message) => {
    expect(() => readCliValues(OPTIONS, argv)).toThrow(message);
  });

  it('answers --help with null, and the usage lists every option with its default', () => {
    expect(readCliValues(OPTIONS, ['--help'])).toBeNull();
    const usage = usageText('npm run x', OPTIONS);
    expect(usage).toContain('--units <n>');
    expect(usage).toContain('units (default 100)');
    expect(usage).toContain('--reset');
    expect(usage).toContain('--help');
  });

  it('reads the benchmark options, --only as a list', () => {
    expect(readBenchOptions(['--duration', '2', '--only', 'unitPage, backtest'])).toMatchObject({
      durationS: 2,
      repeat: 3,
      connections: 16,
      steadyRate: 50,
      only: ['unitPage', 'backtest'],
    });
    expect(readBenchOptions([]).only).toBeUndefined();
  });
});
