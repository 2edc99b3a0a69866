// Multi-row INSERT statements for bulk loads: values written as SQL literals (far faster than placeholders for
// millions of rows), in chunks below a byte budget that stays well under max_allowed_packet.
import { getTableColumns, getTableName, type Table } from 'drizzle-orm';
import { civilFromDay } from '../../shared/domain/dates';

export type ColumnList = { key: string; name: string }[];

export function columnsOf(table: Table): ColumnList {
  return Object.entries(getTableColumns(table)).map(([key, col]) => ({ key, name: col.name }));
}

const ESCAPES: Record<string, string> = {
  '\0': '\\0',
  '\n': '\\n',
  '\r': '\\r',
  '\x1a': '\\Z',
  "'": "\\'",
  '\\': '\\\\',
};

export function quote(s: string): string {
  // eslint-disable-next-line no-control-regex -- NUL and Ctrl-Z must be escaped inside MySQL string literals
  return `'${s.replace(/[\0\n\r\x1a'\\]/g, (c) => ESCAPES[c])}'`;
}

const pad2 = (n: number) => (n < 10 ? `0${n}` : `${n}`);
const pad3 = (n: number) => (n < 10 ? `00${n}` : n < 100 ? `0${n}` : `${n}`);
// Rows of one visit repeat the same two or three instants: remember the last few.
const recentMs = [NaN, NaN, NaN];
const recentText = ['', '', ''];
let recentNext = 0;

/** A DATETIME(3) literal in UTC (the app's connections use timezone 'Z'); hand-rolled, it runs millions of times. */
export function datetime(d: Date): string {
  const ms = d.getTime();
  for (let i = 0; i < 3; i++) if (recentMs[i] === ms) return recentText[i];
  const days = Math.floor(ms / 86_400_000);
  let rest = ms - days * 86_400_000;
  const { year, month, day } = civilFromDay(days);
  const h = Math.floor(rest / 3_600_000);
  rest -= h * 3_600_000;
  const mi = Math.floor(rest / 60_000);
  rest -= mi * 60_000;
  const sec = Math.floor(rest / 1000);
  const text = `'${year}-${pad2(month)}-${pad2(day)} ${pad2(h)}:${pad2(mi)}:${pad2(sec)}.${pad3(rest - sec * 1000)}'`;
  recentMs[recentNext] = ms;
  recentText[recentNext] = text;
  recentNext = (recentNext + 1) % 3;
  return text;
}

export function literal(v: unknown): string {
  if (v === undefined) return 'DEFAULT';
  if (v === null) return 'NULL';
  switch (typeof v) {
    case 'number':
      if (!Number.isFinite(v)) throw new Error(`Not a finite number: ${v}`);
      return String(v);
    case 'boolean':
      return v ? '1' : '0';
    case 'string':
      return quote(v);
    case 'object':
      if (v instanceof Date) return datetime(v);
      return quote(JSON.stringify(v));
    default:
      throw new Error(`Cannot write ${typeof v} as SQL`);
  }
}

const values: string[] = [];

export function tuple(cols: ColumnList, row: Record<string, unknown>): string {
  values.length = cols.length;
  for (let i = 0; i < cols.length; i++) values[i] = literal(row[cols[i].key]);
  // One flat string per row (join), rather than a rope of dozens of pieces to flatten later.
  return `(${values.join(',')})`;
}

/** Collects rows of one table and hands them out as one multi-row INSERT statement. */
export class InsertBuffer {
  private readonly head: string;
  private readonly cols: ColumnList;
  private parts: string[] = [];
  /** Characters buffered (UTF-16 units; close to bytes for this mostly-ASCII data). */
  size = 0;
  rows = 0;

  /** `keys`: only these columns (the others take their defaults), so that rows of one kind skip their NULLs. */
  constructor(
    table: Table,
    private readonly flush: (sql: string) => void,
    keys?: readonly string[],
  ) {
    const all = columnsOf(table);
    this.cols = keys ? all.filter((c) => keys.includes(c.key)) : all;
    if (keys && this.cols.length !== keys.length) throw new Error(`Unknown column among ${keys.join(', ')}`);
    this.head = `INSERT INTO \`${getTableName(table)}\` (${this.cols.map((c) => `\`${c.name}\``).join(',')}) VALUES `;
  }

  add(row: Record<string, unknown>): void {
    const t = tuple(this.cols, row);
    this.parts.push(t);
    this.size += t.length + 1;
    this.rows++;
  }

  /** Emits what is buffered as one statement. */
  end(): void {
    if (!this.parts.length) return;
    this.flush(this.head + this.parts.join(','));
    this.parts = [];
    this.size = 0;
  }
}
