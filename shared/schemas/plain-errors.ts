// Validator messages in plain words: "At least 30", not "Too small: expected number to be >=30". One error map for
// every schema, installed once where the code starts (server/middleware/error-handler.ts, src/main.tsx), so the API's
// field errors and the forms say the same. A message a schema gives itself still wins.
import { z } from 'zod';

type Issue = Parameters<NonNullable<z.core.$ZodConfig['customError']>>[0];

const num = (v: number | bigint) =>
  typeof v === 'bigint' ? v.toString() : v.toLocaleString('en-GB', { maximumFractionDigits: 6 });
const plural = (n: number | bigint, one: string, many: string) => `${num(n)} ${Number(n) === 1 ? one : many}`;
const dayOf = (v: number | bigint) => new Date(Number(v)).toISOString().slice(0, 10);

const TYPE_WORDS: Record<string, string> = {
  number: 'Enter a number',
  int: 'Enter a whole number',
  bigint: 'Enter a whole number',
  string: 'Enter text',
  boolean: 'Choose yes or no',
  date: 'Enter a date',
  array: 'Give a list',
  object: 'Fill in this part',
};

const FORMAT_WORDS: Record<string, string> = {
  email: 'Enter an e-mail address such as name@example.com',
  url: 'Enter a web address such as https://example.com',
  date: 'Enter a date',
  datetime: 'Enter a date and time',
  time: 'Enter a time',
  uuid: 'Not a valid reference',
};

function tooSmall(i: Extract<Issue, { code: 'too_small' }>): string {
  const { minimum: m, origin } = i;
  if (origin === 'string') {
    if (Number(m) <= 1) return 'Required';
    return i.exact
      ? `Exactly ${plural(m, 'character', 'characters')}`
      : `At least ${plural(m, 'character', 'characters')}`;
  }
  if (origin === 'array' || origin === 'set') return Number(m) <= 1 ? 'Add at least one' : `At least ${num(m)} items`;
  if (origin === 'date') return `${dayOf(m)} or later`;
  return i.inclusive === false ? `More than ${num(m)}` : `At least ${num(m)}`;
}

function tooBig(i: Extract<Issue, { code: 'too_big' }>): string {
  const { maximum: m, origin } = i;
  if (origin === 'string') return `At most ${plural(m, 'character', 'characters')}`;
  if (origin === 'array' || origin === 'set') return `At most ${num(m)} items`;
  if (origin === 'date') return `${dayOf(m)} or earlier`;
  if (origin === 'file') return `At most ${num(Number(m) / 1_048_576)} MB`;
  return i.inclusive === false ? `Less than ${num(m)}` : `At most ${num(m)}`;
}

/** The plain words for one validator issue (undefined: let zod's own message stand, which the map never needs). */
export function plainMessage(issue: Issue): string {
  switch (issue.code) {
    case 'too_small':
      return tooSmall(issue);
    case 'too_big':
      return tooBig(issue);
    case 'invalid_type':
      if (issue.input === undefined || issue.input === null) return 'Required';
      return TYPE_WORDS[issue.expected] ?? 'Not a valid value';
    case 'invalid_format':
      return FORMAT_WORDS[issue.format] ?? 'Not in the expected form';
    case 'not_multiple_of':
      return `Use steps of ${num(issue.divisor)}`;
    case 'invalid_value':
      // The allowed values are internal codes; the form's choices name them.
      return issue.values.length === 1 ? 'Not the expected value' : 'Choose one of the options';
    case 'unrecognized_keys':
      return `Not expected here: ${issue.keys.join(', ')}`;
    case 'invalid_union':
      return 'Not a valid value';
    default:
      return 'Not a valid value';
  }
}

let installed = false;

/** Makes every schema answer in plain words; safe to call more than once. */
export function installPlainErrors() {
  if (installed) return;
  installed = true;
  z.config({ customError: plainMessage });
}

installPlainErrors();
