// The command-line options of the scripts (`npm run bench -- --duration 5`, `npm run seed:bench -- --units 1000`, …)
// through node:util's parseArgs: `--name value` or `--name=value`, numbers checked, `--help` prints the usage, and an
// unknown option stops the script instead of being ignored.
import { parseArgs } from 'node:util';

export type CliOption =
  | { type: 'number'; default?: number; help: string; placeholder?: string; integer?: boolean; min?: number }
  | { type: 'string'; default?: string; help: string; placeholder?: string }
  | { type: 'boolean'; help: string };

type Value<O extends CliOption> = O extends { type: 'number'; default: number }
  ? number
  : O extends { type: 'number' }
    ? number | undefined
    : O extends { type: 'boolean' }
      ? boolean
      : O extends { default: string }
        ? string
        : string | undefined;

export type CliValues<T extends Record<string, CliOption>> = { [K in keyof T]: Value<T[K]> };

/** The usage text: the summary, then one line an option with its default. */
export function usageText(summary: string, options: Record<string, CliOption>): string {
  const left = (name: string, o: CliOption) =>
    o.type === 'boolean' ? `--${name}` : `--${name} <${o.placeholder ?? (o.type === 'number' ? 'n' : 'text')}>`;
  const width = Math.max(...Object.entries(options).map(([name, o]) => left(name, o).length), '--help'.length);
  const lines = Object.entries(options).map(([name, o]) => {
    const fallback = o.type !== 'boolean' && o.default !== undefined ? ` (default ${o.default})` : '';
    return `  ${left(name, o).padEnd(width)}  ${o.help}${fallback}`;
  });
  return [summary.trim(), '', 'Options:', ...lines, `  ${'--help'.padEnd(width)}  this text`].join('\n');
}

/** A bad option: why, for the message above the usage. */
export class CliUsageError extends Error {}

/** Parses `argv` into the options' values (null when it asks for --help); throws CliUsageError for a bad option. */
export function readCliValues<T extends Record<string, CliOption>>(options: T, argv: string[]): CliValues<T> | null {
  let parsed: ReturnType<typeof parseArgs>;
  try {
    parsed = parseArgs({
      args: argv,
      strict: true,
      allowPositionals: false,
      options: {
        help: { type: 'boolean', short: 'h' },
        ...Object.fromEntries(
          Object.entries(options).map(([name, o]) => [name, { type: o.type === 'boolean' ? 'boolean' : 'string' }]),
        ),
      },
    });
  } catch (err) {
    throw new CliUsageError((err as Error).message);
  }
  if (parsed.values.help) return null;
  const values: Record<string, unknown> = {};
  for (const [name, o] of Object.entries(options)) {
    const raw = parsed.values[name];
    if (o.type === 'boolean') values[name] = raw === true;
    else if (o.type === 'string' || raw === undefined) values[name] = raw ?? o.default;
    else values[name] = toNumber(name, String(raw), o);
  }
  return values as CliValues<T>;
}

function toNumber(name: string, raw: string, o: Extract<CliOption, { type: 'number' }>): number {
  const n = Number(raw);
  if (raw.trim() === '' || !Number.isFinite(n) || (o.integer && !Number.isInteger(n)) || n < (o.min ?? -Infinity)) {
    const least = o.min !== undefined ? ` of at least ${o.min}` : '';
    throw new CliUsageError(`--${name} must be a${o.integer ? ' whole' : ''} number${least}, not "${raw}".`);
  }
  return n;
}

/** The script's options: on `--help` prints the usage and exits 0, on a bad option prints why and the usage and exits 2. */
export function parseCli<T extends Record<string, CliOption>>(
  summary: string,
  options: T,
  argv: string[] = process.argv.slice(2),
): CliValues<T> {
  try {
    const values = readCliValues(options, argv);
    if (values) return values;
    console.log(usageText(summary, options));
    process.exit(0);
  } catch (err) {
    if (!(err instanceof CliUsageError)) throw err;
    console.error(`${err.message}\n\n${usageText(summary, options)}`);
    process.exit(2);
  }
}
