// Multi-row INSERT statements for bulk loads: values written as SQL literals (far faster than placeholders for
// millions of rows), in chunks below a byte budget that stays well under max_allowed_packet.
import { getTableColumns, getTableName, type Table } from 'drizzle-orm';

export type ColumnList = { key: string; name: string }[];

export function columnsOf(table: Table): ColumnList {
  return Object.entries(getTableColumns(table)).map(([key, col]) => ({ key, name: col.name }));
}

const ESCAPES: Record<string, string> = { '\0': '\\0', '\n': '\\n', '\r': '\\r', '\x1a': '\\Z', "'": "\\'", '\\': '\\\\' };

export function quote(s: string): string {
  // eslint-disable-next-line no-control-regex -- NUL and Ctrl-Z must be escaped inside MySQL string literals
  return `'${s.replace(/[\0\n\r\x1a'\\]/g, (c) => ESCAPES[c])}'`;
}

/** A DATETIME(3) literal in UTC (the app's connections use timezone 'Z'). */
export function datetime(d: Date): string {
  return `'${d.toISOString().slice(0, 23).replace('T', ' ')}'`;
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

export function tuple(cols: ColumnList, row: Record<string, unknown>): string {
  let s = '(';
  for (let i = 0; i < cols.length; i++) {
    if (i) s += ',';
    s += literal(row[cols[i].key]);
  }
  return s + ')';
}

/** Collects rows of one table and hands them out as one multi-row INSERT statement. */
export class InsertBuffer {
  private readonly head: string;
  private readonly cols: ColumnList;
  private parts: string[] = [];
  /** Characters buffered (UTF-16 units; close to bytes for this mostly-ASCII data). */
  size = 0;
  rows = 0;

  constructor(
    table: Table,
    private readonly flush: (sql: string) => void,
  ) {
    this.cols = columnsOf(table);
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
