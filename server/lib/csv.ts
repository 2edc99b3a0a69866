// The one rule for cells in every CSV the product writes (the exports, the import template).
import type { CastReturnObject, Options } from 'csv-stringify';

// A negative number keeps its minus sign unescaped: csv-stringify applies `escape_formulas` to every cell, and a
// cast may override options for its own cell.
const plainNegative = (n: number) => ({ value: String(n), escape_formulas: false }) as CastReturnObject;

/**
 * csv-stringify options for every CSV: text starting with `=`, `+`, `-`, `@`, tab or carriage return (and their
 * full-width forms) gets a leading single quote, so a spreadsheet shows it instead of running it as a formula;
 * numbers are written as numbers (−25 stays −25), booleans as yes/no, dates as ISO 8601 in UTC.
 * Source: OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection).
 */
export const CSV_OPTIONS = {
  escape_formulas: true,
  cast: {
    number: (n: number) => (n < 0 ? plainNegative(n) : String(n)),
    boolean: (value: boolean) => (value ? 'yes' : 'no'),
    date: (value: Date) => value.toISOString(),
  },
} satisfies Options;
