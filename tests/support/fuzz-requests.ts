// Random API requests for the route-table fuzz (tests/api/fuzz.test.ts). Per route: valid shapes built from the rows
// the test seeded (referenced by pool and index, resolved when sent), the same shapes mutated, and plain junk.
import fc from 'fast-check';
import {
  LEAK_CHECK_METHOD_IDS,
  LEAK_LOCATION_IDS,
  REFRIGERANT_CODES,
  REPAIR_ACTION_IDS,
  SIGHT_GLASS_STATE_IDS,
} from '../../shared/domain';
import { ROLES, type Role } from '../../shared/permissions';
import { ALERT_KINDS } from '../../shared/schemas/alerts';
import { DECISION_CHOICES } from '../../shared/schemas/decisions';
import { FLEET_SORTS, SCORE_BANDS } from '../../shared/schemas/fleet';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { SITE_KINDS } from '../../shared/schemas/sites';
import { IMPORT_COLUMNS } from '../../shared/schemas/imports';
import { UNIT_SORTS, UNIT_STATUSES } from '../../shared/schemas/units';
import { TEST_PASSWORD } from './factories';
import { halyardNumber } from './units';

// ---- references to seeded rows ------------------------------------------------------------------------------

export const POOLS = [
  'unitId',
  'siteId',
  'eventId',
  'attachmentId',
  'jobId',
  'userId',
  'userEmail',
  'qrToken',
  'containerNumber',
  'invitationToken',
  'resetToken',
  'importKey',
  'idempotencyKey',
  'unsubscribe',
  'settingsVersion',
  'sessionId',
  'userSession',
] as const;
export type PoolName = (typeof POOLS)[number];
export type Pools = Record<PoolName, unknown[]>;

/** "The index-th row of a pool", resolved when the request is sent (the pools grow and shrink as the fuzz runs). */
export class PoolRef {
  constructor(
    readonly pool: PoolName,
    readonly index: number,
    readonly field?: string,
  ) {}
}

const ref = (pool: PoolName) => fc.nat().map((i) => new PoolRef(pool, i));

export type Shape = null | boolean | number | string | PoolRef | Shape[] | { [key: string]: Shape };

// ---- the request model ----------------------------------------------------------------------------------------

export type Actor = Role | 'signed-out';
export const ACTORS: readonly Actor[] = [...ROLES, 'signed-out'];

/** A path parameter: a seeded row, text to percent-encode, or raw text put into the path as it is. */
export type ParamValue = PoolRef | { text: string } | { raw: string };
export type QueryValue = PoolRef | string | { raw: string };
export type FilePart = { field: string; name: string; contentType: string; content: Buffer };

export type Body =
  | { kind: 'none' }
  | { kind: 'json'; value: Shape }
  | { kind: 'raw'; contentType: string; text: string }
  | { kind: 'multipart'; fields: [string, string | PoolRef][]; files: FilePart[] };

export type FuzzRequest = {
  route: string;
  actor: Actor;
  params: Record<string, ParamValue>;
  query: [string, QueryValue][];
  body: Body;
  withOrigin: boolean;
  /** How many identical copies go out at once (a double click). */
  copies: number;
};

/** Which roles a route admits; `access` as in server/routes.ts. */
export type RouteInfo = { method: string; path: string; access: string; allowed: readonly Actor[] };

// ---- odd values -------------------------------------------------------------------------------------------------

const WEIRD_STRINGS = [
  '',
  ' ',
  '\ud800',
  'a\udfffb',
  '\udc00\ud800',
  '1850-01-01',
  '9999-12-31',
  '0000-00-00',
  '2026-02-30',
  '1899-12-31',
  '2200-01-01',
  '1850-01-01T00:00:00Z',
  '9999-12-31T23:59:59Z',
  '+275760-09-13T00:00:00.000Z',
  '2026-06-15T25:61:00Z',
  'NaN',
  'Infinity',
  '-Infinity',
  '-0',
  '1e309',
  '0x10',
  '4,5',
  '-25',
  'null',
  'undefined',
  'true',
  '[]',
  '{}',
  '__proto__',
  'constructor',
  '=HYPERLINK("http://example.invalid","x")',
  '+1',
  '@SUM(A1)',
  '\t',
  '\r\n',
  "'; DROP TABLE units; --",
  '%',
  '%00',
  '\u0000',
  '\u202e',
  'Ω≈ç√∫',
  '🧊❄️',
  'e\u0301',
  '../../etc/passwd',
  'R-134a',
  'HRLU1000016',
  'in_service',
];

const WEIRD_NUMBERS = [
  0,
  -0,
  -1,
  1,
  1.5,
  0.1,
  2 ** 31 - 1,
  2 ** 31,
  2 ** 32,
  2 ** 53 + 2,
  -(2 ** 31),
  1e21,
  1e300,
  -1e300,
  5e-324,
  36501,
];

const loneSurrogates = fc.string({
  unit: fc.integer({ min: 0xd800, max: 0xdfff }).map((c) => String.fromCharCode(c)),
  minLength: 1,
  maxLength: 4,
});
const withLoneSurrogate = fc
  .tuple(fc.string({ maxLength: 8 }), loneSurrogates, fc.string({ maxLength: 8 }))
  .map((p) => p.join(''));
const longString = fc
  .tuple(fc.constantFrom(65, 121, 256, 1001, 2001, 5000, 70_000), fc.constantFrom('x', 'é', '🧊', '\ud800', 'A1'))
  .map(([n, c]) => c.repeat(Math.ceil(n / c.length)).slice(0, n));
const deepNest = fc.integer({ min: 20, max: 600 }).map((depth) => {
  let v: Shape = 1;
  for (let i = 0; i < depth; i++) v = i % 2 ? [v] : { a: v };
  return v;
});
const bigArray = fc
  .tuple(fc.constantFrom(21, 501, 2001, 5000), fc.constantFrom<Shape>(1, 'x', {}, null))
  .map(([n, v]) => Array<Shape>(n).fill(v));

const weirdString: fc.Arbitrary<string> = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(...WEIRD_STRINGS) },
  { weight: 2, arbitrary: withLoneSurrogate },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 20 }) },
  { weight: 1, arbitrary: fc.string({ maxLength: 30 }) },
  { weight: 1, arbitrary: longString },
  { weight: 1, arbitrary: fc.constantFrom(...WEIRD_NUMBERS).map(String) },
);

const weirdValue: fc.Arbitrary<Shape> = fc.oneof(
  { weight: 6, arbitrary: weirdString },
  { weight: 3, arbitrary: fc.constantFrom(...WEIRD_NUMBERS) },
  { weight: 1, arbitrary: fc.double() },
  { weight: 2, arbitrary: fc.constantFrom<Shape>(null, true, false, {}, [], [null], { a: { b: { c: {} } } }) },
  { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<Shape> },
  { weight: 1, arbitrary: deepNest },
  { weight: 1, arbitrary: bigArray },
);

// ---- mutating a valid shape -------------------------------------------------------------------------------------

type Path = (string | number)[];
/** Near-valid: one value swapped for an odd one of its own kind (a date for a date, a number for a number). */
type Tweak = { date: string; text: string; number: Shape; id: Shape; other: Shape; textFirst: boolean };
type Mutation =
  | { op: 'tweak'; pick: number; tweak: Tweak }
  | { op: 'set'; pick: number; value: Shape }
  | { op: 'delete'; pick: number }
  | { op: 'addKey'; pick: number; key: string; value: Shape }
  | { op: 'wrap'; pick: number }
  | { op: 'asText'; pick: number }
  | { op: 'repeat'; pick: number; times: number };

const isContainer = (v: Shape): v is Shape[] | { [key: string]: Shape } =>
  v !== null && typeof v === 'object' && !(v instanceof PoolRef);

function pathsOf(shape: Shape, at: Path = []): Path[] {
  const out: Path[] = [at];
  if (Array.isArray(shape)) shape.forEach((v, i) => out.push(...pathsOf(v, [...at, i])));
  else if (isContainer(shape)) for (const [k, v] of Object.entries(shape)) out.push(...pathsOf(v, [...at, k]));
  return out;
}

function valueAt(shape: Shape, path: Path): Shape {
  return path.reduce<Shape>((v, k) => (v as Record<string | number, Shape>)[k], shape);
}

/** Replaces the value at the path (undefined deletes it); copies only along the path, so shapes are never shared. */
function updateAt(shape: Shape, path: Path, fn: (v: Shape) => Shape | undefined): Shape | undefined {
  if (!path.length) return fn(shape);
  const [head, ...rest] = path;
  if (Array.isArray(shape)) {
    const copy = [...shape];
    const next = updateAt(copy[head as number], rest, fn);
    if (next === undefined) copy.splice(head as number, 1);
    else copy[head as number] = next;
    return copy;
  }
  const copy = { ...(shape as Record<string, Shape>) };
  const next = updateAt(copy[head], rest, fn);
  if (next === undefined) delete copy[head];
  else copy[head] = next;
  return copy;
}

const DATE_LIKE = /^\d{4}-\d{2}-\d{2}/;
const tweaked = (v: Shape, t: Tweak): Shape =>
  v instanceof PoolRef
    ? t.id
    : typeof v === 'string'
      ? DATE_LIKE.test(v)
        ? t.date
        : t.text
      : typeof v === 'number'
        ? t.number
        : t.other;

function applyMutation(shape: Shape | undefined, m: Mutation): Shape | undefined {
  if (shape === undefined) return m.op === 'set' ? m.value : undefined;
  const paths = pathsOf(shape);
  if (m.op === 'tweak') {
    // Dates and free text are where odd values got furthest, so they are picked more often than their share.
    const all = paths.filter((p) => !isContainer(valueAt(shape, p)));
    const texts = all.filter((p) => typeof valueAt(shape, p) === 'string');
    const leaves = m.tweak.textFirst && texts.length ? texts : all;
    return leaves.length ? updateAt(shape, leaves[m.pick % leaves.length], (v) => tweaked(v, m.tweak)) : shape;
  }
  const path = paths[m.pick % paths.length];
  switch (m.op) {
    case 'set':
      return updateAt(shape, path, () => m.value);
    case 'delete':
      return updateAt(shape, path, () => undefined);
    case 'addKey':
      return updateAt(shape, path, (v) => (isContainer(v) && !Array.isArray(v) ? { ...v, [m.key]: m.value } : v));
    case 'wrap':
      return updateAt(shape, path, (v) => [v]);
    case 'asText':
      return updateAt(shape, path, (v) => (v instanceof PoolRef ? v : JSON.stringify(v)));
    case 'repeat':
      return updateAt(shape, path, (v) => (Array.isArray(v) && v.length ? Array<Shape>(m.times).fill(v[0]) : v));
  }
}

const ODD_DATES = [
  '1850-01-01',
  '1899-12-31',
  '1900-01-01',
  '1959-12-31',
  '0001-01-01',
  '9999-12-31',
  '2200-01-01',
  '2026-02-30',
  '2026-13-01',
  '2027-01-01',
  '1850-01-01T00:00:00Z',
  '1969-12-31T23:59:59.999Z',
  '9999-12-31T23:59:59Z',
  '2026-06-15T12:10:00Z',
  '2036-06-15T12:00:00+14:00',
  '2026-06-15T12:00:00-12:00',
];
const ODD_IDS: Shape[] = [0, -1, 1.5, 2 ** 31, 2 ** 53 + 2, '1', 'x', null, 999_999];

const tweak: fc.Arbitrary<Tweak> = fc.record({
  date: fc.oneof({ weight: 4, arbitrary: fc.constantFrom(...ODD_DATES) }, { weight: 1, arbitrary: weirdString }),
  text: fc.oneof(
    { weight: 2, arbitrary: withLoneSurrogate },
    { weight: 1, arbitrary: longString },
    { weight: 4, arbitrary: weirdString },
  ),
  number: fc.oneof(
    { weight: 4, arbitrary: fc.constantFrom(...WEIRD_NUMBERS) },
    { weight: 1, arbitrary: fc.double() },
    { weight: 1, arbitrary: weirdString },
  ),
  id: fc.constantFrom(...ODD_IDS),
  other: weirdValue,
  textFirst: fc.boolean(),
});

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 8, arbitrary: fc.record({ op: fc.constant('tweak' as const), pick: fc.nat(), tweak }) },
  { weight: 3, arbitrary: fc.record({ op: fc.constant('set' as const), pick: fc.nat(), value: weirdValue }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('delete' as const), pick: fc.nat() }) },
  {
    weight: 1,
    arbitrary: fc.record({
      op: fc.constant('addKey' as const),
      pick: fc.nat(),
      key: fc.oneof(
        fc.constantFrom('__proto__', 'constructor', 'id', 'userId', 'role', 'unitId', 'kind'),
        fc.string({ maxLength: 8 }),
      ),
      value: weirdValue,
    }),
  },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('wrap' as const), pick: fc.nat() }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('asText' as const), pick: fc.nat() }) },
  {
    weight: 1,
    arbitrary: fc.record({ op: fc.constant('repeat' as const), pick: fc.nat(), times: fc.constantFrom(0, 2, 21, 501) }),
  },
);

// Mostly one change, so the rest of the request stays valid and the odd value reaches the code behind the schema.
const mutated = (valid: fc.Arbitrary<Shape>) =>
  fc
    .tuple(
      valid,
      fc.oneof(
        { weight: 6, arbitrary: fc.array(mutation, { minLength: 1, maxLength: 1 }) },
        { weight: 2, arbitrary: fc.array(mutation, { minLength: 2, maxLength: 3 }) },
      ),
    )
    .map(([v, ms]) => ms.reduce<Shape | undefined>(applyMutation, v));

// ---- valid shapes per route -------------------------------------------------------------------------------------

const NOW = Date.parse('2026-06-15T12:00:00Z');
const DAY = 86_400_000;
const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
const recentInstant = fc
  .integer({ min: NOW - 6 * 365 * DAY, max: NOW - 60_000 })
  .map((ms) => new Date(ms).toISOString());
const recentDay = fc.integer({ min: NOW - 6 * 365 * DAY, max: NOW }).map(day);
const key = fc.oneof({ weight: 5, arbitrary: fc.uuid() }, { weight: 1, arbitrary: ref('idempotencyKey') });
const kg = fc.constantFrom(0.2, 0.5, 1, 1.25, 4.5);
const cylinder = fc.constantFrom('CYL-A100', 'CYL-B200', 'REC-1', 'LOT77');
const note = fc.option(fc.constantFrom('Checked at the gate', 'Valve cap missing'), { nil: undefined });
const refrigerant = fc.constantFrom(...REFRIGERANT_CODES, 'r134a', 'R-404a');
const leakLocation = fc.constantFrom(...LEAK_LOCATION_IDS);
const freshEmail = fc.nat(1_000_000).map((n) => `fuzz-${n}@test.example`);
const freshContainer = fc.integer({ min: 200_000, max: 999_999 }).map((n) => halyardNumber(n));
const freshSiteCode = fc.nat(99_999).map((n) => `FZ-${n}`);

/** Drops the keys whose value is undefined (optional fields left out). */
const compact = (o: Record<string, Shape | undefined>): Shape =>
  Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Shape;
const rec = (fields: Record<string, fc.Arbitrary<Shape | undefined>>) => fc.record(fields).map(compact);
const opt = <T extends Shape>(a: fc.Arbitrary<T>) => fc.option(a, { nil: undefined });

const visitEvent: fc.Arbitrary<Shape> = fc.oneof(
  rec({ kind: fc.constant('pti'), passed: fc.boolean(), note }),
  rec({
    kind: fc.constant('leak_check'),
    method: fc.constantFrom(...LEAK_CHECK_METHOD_IDS),
    leakFound: fc.constant(true),
    location: leakLocation,
    locationOther: fc.constant('by the drain'),
  }),
  rec({
    kind: fc.constant('leak_check'),
    method: fc.constantFrom(...LEAK_CHECK_METHOD_IDS),
    leakFound: fc.constant(false),
  }),
  rec({
    kind: fc.constant('repair'),
    location: leakLocation,
    locationOther: fc.constant('by the drain'),
    action: fc.constantFrom(...REPAIR_ACTION_IDS),
    actionOther: fc.constant('cleaned'),
    verified: fc.boolean(),
  }),
  rec({ kind: fc.constant('component_replacement'), component: fc.constant('Evaporator fan motor'), note }),
  rec({ kind: fc.constant('status_change'), status: fc.constantFrom(...UNIT_STATUSES), note }),
  rec({ kind: fc.constant('note'), note: fc.constant('Door seal worn') }),
  rec({
    kind: fc.constant('top_up'),
    kg,
    cylinder,
    reusedRecovered: opt(fc.boolean()),
    enteredAs: opt(fc.constant({ value: 1, unit: 'kg' })),
  }),
  rec({ kind: fc.constant('recovery'), kg, cylinder }),
  rec({ kind: fc.constant('recharge'), kg, cylinder, excludedFromLeakRate: opt(fc.boolean()) }),
  rec({
    kind: fc.constant('pressure'),
    suctionKPaG: fc.integer({ min: 40, max: 140 }),
    dischargeKPaG: opt(fc.integer({ min: 700, max: 1100 })),
    ambientC: opt(fc.integer({ min: -10, max: 40 })),
    setPointC: opt(fc.constantFrom(-25, 2, 13)),
    sightGlass: opt(fc.constantFrom(...SIGHT_GLASS_STATE_IDS)),
    enteredAs: opt(fc.constant({ pressureUnit: 'bar', temperatureUnit: 'C' })),
  }),
);

const recordVisit = rec({
  idempotencyKey: key,
  unitId: ref('unitId'),
  siteId: opt(fc.oneof(ref('siteId'), fc.constant(null))),
  occurredAt: recentInstant,
  events: fc.array(visitEvent, { minLength: 1, maxLength: 5 }),
});

const createUnit = rec({
  containerNumber: freshContainer,
  refrigerant,
  nominalChargeKg: fc.oneof(kg, fc.constant('4,5')),
  commissionedOn: opt(fc.oneof(recentDay, fc.constant(''))),
  siteId: opt(ref('siteId')),
  status: opt(fc.constantFrom(...UNIT_STATUSES, 'In service')),
  machinerySerial: opt(fc.constant('MX-2021-004417')),
  model: opt(fc.constant('HX-40 Cold')),
  manufactureYear: opt(fc.integer({ min: 1970, max: 2026 })),
  purchaseCost: opt(fc.constantFrom(14800, '14800.00')),
  residualValue: opt(fc.constant(3500)),
  notes: opt(fc.constant('Machinery replaced 2023')),
});
const updateUnit = createUnit.map((u) => {
  const { containerNumber: _n, ...rest } = u as Record<string, Shape>;
  return rest;
});

const createSite = rec({
  code: freshSiteCode,
  name: fc.constantFrom('Fuzz depot', 'Quay 4 terminal'),
  kind: fc.constantFrom(...SITE_KINDS),
  country: opt(fc.constantFrom('NL', 'de', '', null)),
});

const siteQuery = { siteId: opt(ref('siteId')) };
const fleetFilters = {
  ...siteQuery,
  refrigerant: opt(refrigerant),
  status: opt(fc.constantFrom(...UNIT_STATUSES)),
  band: opt(fc.constantFrom(...SCORE_BANDS)),
  rateAbove: opt(fc.constantFrom('0', '10', '55.5')),
  forecastDays: opt(fc.constantFrom('0', '30', '3650')),
  forecastOverdue: opt(fc.constantFrom('1', '0', 'true')),
  leakCheckOverdue: opt(fc.constantFrom('1', 'false')),
  ptiExpired: opt(fc.constantFrom('1', '0')),
  // The overview's bars and My day's groups, each a filter too.
  rateFrom: opt(fc.constantFrom('0', '10', '12.5')),
  rateBelow: opt(fc.constantFrom('10', '20', '100000')),
  rateAtMost: opt(fc.constantFrom('0', '5')),
  leakCheckDueDays: opt(fc.constantFrom('0', '14', '3650')),
  quarantined: opt(fc.constantFrom('1', 'false')),
  recheckDue: opt(fc.constantFrom('1', '0')),
  openLeak: opt(fc.constantFrom('true', '0')),
  ptiExpiredDays: opt(fc.constantFrom('1', '7', '3650')),
  ptiExpiringDays: opt(fc.constantFrom('0', '14')),
  forecastRangeDays: opt(fc.constantFrom('0', '7', '30')),
  q: opt(fc.constantFrom('hrlu', 'HRLU 9', 'HLQU1')),
};
const fleetQuery = rec({
  ...fleetFilters,
  sort: opt(fc.constantFrom(...FLEET_SORTS)),
  dir: opt(fc.constantFrom('asc', 'desc')),
  page: opt(fc.constantFrom('1', '2', '4000')),
  pageSize: opt(fc.constantFrom('10', '25', '100')),
  count: opt(fc.constantFrom('1', '0')),
});
const period = fc
  .tuple(recentDay, fc.integer({ min: 0, max: 365 }))
  .map(([from, n]) => ({ from, to: day(Date.parse(from) + n * DAY) }));
const traceQuery = fc.oneof(
  rec({ cylinder }),
  fc.tuple(ref('siteId'), period).map(([siteId, p]) => ({ siteId, ...p }) as Shape),
);

const settings = fc
  .record({
    policy: fc.constantFrom('EU', 'US', 'custom'),
    ptiValidityDays: fc.constantFrom(30, 90, 365),
    gwpBasis: fc.constantFrom('AR4', 'AR5'),
    currency: fc.constantFrom('USD', 'EUR'),
    price: fc.constantFrom(30, 250),
  })
  .map(({ currency, price, ...s }) => {
    const base = JSON.parse(JSON.stringify(DEFAULT_SETTINGS)) as {
      economics: Record<string, Shape> & { refrigerantPricePerKg: Record<string, Shape> };
    };
    return {
      ...base,
      ...s,
      economics: {
        ...base.economics,
        currency,
        refrigerantPricePerKg: { ...base.economics.refrigerantPricePerKg, 'R-134a': price },
      },
    } as Shape;
  });

const decision = rec({
  choice: fc.constantFrom(...DECISION_CHOICES),
  economics: fc.constant(JSON.parse(JSON.stringify(DEFAULT_SETTINGS.economics)) as Shape),
  inputs: rec({
    topUpIntervalDays: fc.oneof(fc.constantFrom(30, 60, 365), fc.constant(null)),
    madeUpKgPerVisit: fc.oneof(fc.constantFrom(0, 1.2), fc.constant(null)),
    leakLocation,
  }),
  note: opt(fc.constant('Cheaper to retire')),
  idempotencyKey: key,
});

// Uploads: files that are what they say, files that are not, and names no file system would choose.
const PNG_1PX = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
  'base64',
);
const PDF_TINY = Buffer.from('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n');
const fileName = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom('valve.png', 'photo.jpg', 'report.pdf', 'fleet.csv') },
  { weight: 1, arbitrary: weirdString.map((s) => `${s}.png`) },
);
const fileBytes = fc.oneof(
  fc.constant(PNG_1PX),
  fc.constant(PDF_TINY),
  fc.constant(Buffer.concat([PNG_1PX.subarray(0, 16), Buffer.from('broken')])),
  fc.uint8Array({ maxLength: 64 }).map((a) => Buffer.from(a)),
  weirdString.map((s) => Buffer.from(s)),
);
const contentType = fc.constantFrom(
  'image/png',
  'image/jpeg',
  'application/pdf',
  'text/csv',
  'application/octet-stream',
  'text/plain',
);
const validFile = fc.record({
  field: fc.constant('files'),
  name: fc.constantFrom('valve.png', 'report.pdf'),
  contentType,
  content: fc.constantFrom(PNG_1PX, PDF_TINY),
});
const anyFile = fc.record({
  field: fc.constantFrom('files', 'files', 'file', 'other'),
  name: fileName,
  contentType,
  content: fileBytes,
});
const attachmentsForm = fc.oneof(
  fc.array(validFile, { minLength: 1, maxLength: 2 }),
  fc.array(anyFile, { maxLength: 3 }),
);

const csvCell = (valid: fc.Arbitrary<string>) =>
  fc.oneof({ weight: 40, arbitrary: valid }, { weight: 1, arbitrary: weirdString });
const csvRow = fc.tuple(
  csvCell(freshContainer),
  csvCell(refrigerant),
  csvCell(fc.constantFrom('4.5', '4,5', '5')),
  csvCell(fc.oneof({ weight: 8, arbitrary: recentDay }, { weight: 1, arbitrary: fc.constantFrom('', ...ODD_DATES) })),
  csvCell(
    fc.oneof(
      { weight: 8, arbitrary: fc.constantFrom('FZA', 'FZB', '') },
      { weight: 1, arbitrary: fc.constant('NOPE') },
    ),
  ),
  csvCell(fc.constantFrom('in_service', 'Out of service', '')),
);
const quoteCsv = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
const csvFile = fc.oneof(
  {
    weight: 4,
    arbitrary: fc
      .array(csvRow, { maxLength: 6 })
      .map((rows) =>
        [IMPORT_COLUMNS.slice(0, 6).map((c) => c.header), ...rows].map((r) => r.map(quoteCsv).join(',')).join('\n'),
      ),
  },
  { weight: 1, arbitrary: weirdString },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      '',
      'a,b\n"unclosed',
      'container_number\n\n\n',
      '\ufeffcontainer_number;refrigerant\nHRLU1000016;R-134a',
    ),
  },
);
const mapping = fc.oneof(
  {
    weight: 4,
    arbitrary: fc.constant(
      JSON.stringify({
        containerNumber: 'container_number',
        refrigerant: 'refrigerant',
        nominalChargeKg: 'nominal_charge_kg',
      }),
    ),
  },
  { weight: 1, arbitrary: fc.constantFrom('{', 'null', '[]', '{"containerNumber":5}', '{"nope":"x"}') },
  { weight: 1, arbitrary: weirdString },
);
const validImportKey = fc.stringMatching(/^[A-Za-z0-9_-]{16,43}$/);
const importForm = (withKey: boolean) =>
  fc
    .record({
      csv: csvFile,
      name: fc.oneof({ weight: 3, arbitrary: fc.constant('fleet.csv') }, { weight: 1, arbitrary: fileName }),
      contentType: fc.oneof({ weight: 3, arbitrary: fc.constant('text/csv') }, { weight: 1, arbitrary: contentType }),
      mapping: opt(mapping),
      importKey: withKey
        ? fc.oneof(
            { weight: 8, arbitrary: validImportKey as fc.Arbitrary<string | PoolRef> },
            { weight: 1, arbitrary: ref('importKey') },
            { weight: 1, arbitrary: weirdString },
          )
        : fc.constant(undefined),
      skipExisting: opt(fc.constantFrom('true', 'false', 'true', 'false', 'yes')),
    })
    .map((f) => ({
      fields: Object.entries({ mapping: f.mapping, importKey: f.importKey, skipExisting: f.skipExisting }).filter(
        (e): e is [string, string | PoolRef] => e[1] !== undefined,
      ),
      files: [{ field: 'file', name: f.name, contentType: f.contentType, content: Buffer.from(f.csv) }],
    }));

/** A pool, or one field of a pool's rows; the fields of one request come from the same row (a user and their session). */
type ParamSource = PoolName | { pool: PoolName; field: string };

type RouteShape = {
  /** Pool that fills each path parameter with a real row. */
  params?: Record<string, ParamSource>;
  query?: fc.Arbitrary<Shape>;
  body?: fc.Arbitrary<Shape>;
  multipart?: fc.Arbitrary<{ fields: [string, string | PoolRef][]; files: FilePart[] }>;
  /** Relative share of requests (argon2 and PDF routes are slow, so they get fewer). */
  weight?: number;
};

const EMPTY = fc.constant<Shape>({});

const signInPassword = fc.oneof(
  { weight: 3, arbitrary: fc.constant(TEST_PASSWORD) },
  { weight: 1, arbitrary: fc.constant('wrong-password-1') },
);
/** Strong enough for the password rules (length, not common, not the person's name). */
const NEW_PASSWORD = 'Quay-lantern-drifts-47';

/** Keyed "method path" as in the route table; a route missing here is still fuzzed, from its parameters' names. */
export const ROUTE_SHAPES: Record<string, RouteShape> = {
  'get /api/health': { weight: 0.3 },
  'post /api/auth/sign-in': {
    weight: 0.5,
    body: rec({
      email: fc.oneof({ weight: 3, arbitrary: ref('userEmail') }, { weight: 1, arbitrary: freshEmail }),
      password: signInPassword,
    }),
  },
  'post /api/auth/sign-out': { weight: 0.3, body: EMPTY },
  'get /api/auth/me': { weight: 0.3 },
  'get /api/users': {},
  'get /api/account/sessions': {},
  'post /api/password-check': {
    body: rec({
      password: fc.constantFrom(NEW_PASSWORD, TEST_PASSWORD, 'password1234'),
      email: opt(ref('userEmail')),
      name: opt(fc.constant('Ana Žilić')),
    }),
  },
  'post /api/account/sessions/sign-out': {
    weight: 0.5,
    body: rec({ password: signInPassword, sessionId: opt(ref('sessionId')) }),
  },
  'post /api/account/password': {
    weight: 0.5,
    body: rec({ currentPassword: signInPassword, newPassword: fc.constantFrom(NEW_PASSWORD, 'short', TEST_PASSWORD) }),
  },
  'get /api/users/:id/sessions': { params: { id: 'userId' } },
  'delete /api/users/:id/sessions': { weight: 0.5, params: { id: 'userId' } },
  'delete /api/users/:id/sessions/:sessionId': {
    weight: 0.5,
    params: { id: { pool: 'userSession', field: 'user' }, sessionId: { pool: 'userSession', field: 'id' } },
  },
  'post /api/users': {
    body: rec({
      email: fc.oneof({ weight: 4, arbitrary: freshEmail }, { weight: 1, arbitrary: ref('userEmail') }),
      name: fc.constantFrom('Fuzz Person', 'Ana Žilić'),
      role: fc.constantFrom(...ROLES),
      certificateNumber: opt(fc.constantFrom('F-GAS-123', '')),
      password: fc.option(fc.constant(NEW_PASSWORD), { nil: undefined, freq: 1 }),
    }),
  },
  'patch /api/users/:id': {
    params: { id: 'userId' },
    body: rec({
      name: opt(fc.constant('Renamed Person')),
      role: opt(fc.constantFrom(...ROLES)),
      certificateNumber: opt(fc.constantFrom('F-GAS-9', '')),
      active: opt(fc.boolean()),
    }),
  },
  'post /api/users/:id/invitation': { params: { id: 'userId' }, body: EMPTY },
  'get /api/invitations/:token': { params: { token: 'invitationToken' } },
  'post /api/invitations/:token': {
    weight: 0.5,
    params: { token: 'invitationToken' },
    body: rec({ password: fc.constant(NEW_PASSWORD) }),
  },
  'post /api/password-reset': { weight: 0.5, body: rec({ email: fc.oneof(ref('userEmail'), freshEmail) }) },
  'get /api/password-reset/:token': { params: { token: 'resetToken' } },
  'post /api/password-reset/:token': {
    weight: 0.5,
    params: { token: 'resetToken' },
    body: rec({ password: fc.constant(NEW_PASSWORD) }),
  },
  'get /api/alerts/subscriptions': {},
  'put /api/alerts/subscriptions': {
    body: rec({
      subscriptions: fc.array(rec({ siteId: ref('siteId'), kind: fc.constantFrom(...ALERT_KINDS) }), { maxLength: 6 }),
      allSites: opt(fc.subarray([...ALERT_KINDS])),
      useDefaults: opt(fc.subarray([...ALERT_KINDS])),
    }),
  },
  'post /api/alerts/unsubscribe': {
    body: fc.nat().map((i) => ({
      user: new PoolRef('unsubscribe', i, 'user'),
      kind: new PoolRef('unsubscribe', i, 'kind'),
      sig: new PoolRef('unsubscribe', i, 'sig'),
    })),
  },
  'get /api/dev/mailbox': { query: rec({ limit: opt(fc.constantFrom('1', '50', '100')) }) },
  'post /api/visits': { weight: 2, body: recordVisit },
  'post /api/events/:id/void': {
    weight: 1.5,
    params: { id: 'eventId' },
    body: rec({ reason: fc.constantFrom('Entered on the wrong unit', 'Wrong cylinder') }),
  },
  'post /api/events/:id/attachments': {
    params: { id: 'eventId' },
    multipart: attachmentsForm.map((files) => ({ fields: [], files })),
  },
  'get /api/attachments/:id/file': { params: { id: 'attachmentId' } },
  'get /api/attachments/:id/thumbnail': { params: { id: 'attachmentId' } },
  'get /api/units/:id/overview': { params: { id: 'unitId' } },
  'get /api/units/:id/history': {
    params: { id: 'unitId' },
    query: rec({ before: opt(ref('eventId')), limit: opt(fc.constantFrom('1', '25', '200')) }),
  },
  'get /api/units/:id/timeline': { params: { id: 'unitId' } },
  'get /api/units': {
    query: rec({
      q: opt(fc.constantFrom('hrlu', 'HRLU 9')),
      ...siteQuery,
      status: opt(fc.constantFrom(...UNIT_STATUSES)),
      refrigerant: opt(refrigerant),
      sort: opt(fc.constantFrom(...UNIT_SORTS)),
      dir: opt(fc.constantFrom('asc', 'desc')),
      page: opt(fc.constantFrom('1', '3')),
      pageSize: opt(fc.constantFrom('1', '25', '100')),
    }),
  },
  'get /api/units/by-token/:token': { params: { token: 'qrToken' } },
  'get /api/units/by-number/:number': { params: { number: 'containerNumber' } },
  'get /api/units/:id': { params: { id: 'unitId' } },
  'get /api/units/:id/changes': { params: { id: 'unitId' } },
  'post /api/units': { body: createUnit },
  'patch /api/units/:id': { params: { id: 'unitId' }, body: updateUnit },
  'post /api/units/:id/qr-token': { params: { id: 'unitId' }, body: EMPTY },
  'get /api/sites': {},
  'get /api/sites/:id': { params: { id: 'siteId' } },
  'post /api/sites': { body: createSite },
  'patch /api/sites/:id': { params: { id: 'siteId' }, body: createSite },
  'delete /api/sites/:id': { weight: 0.5, params: { id: 'siteId' } },
  'post /api/labels': { weight: 0.5, body: rec({ unitIds: fc.array(ref('unitId'), { minLength: 1, maxLength: 6 }) }) },
  'get /api/units/:id/label': {
    weight: 0.5,
    params: { id: 'unitId' },
    query: rec({ layout: opt(fc.constantFrom('sheet', 'single')) }),
  },
  'get /api/unit-imports/template': {},
  'post /api/unit-imports/preview': { multipart: importForm(false) },
  'post /api/unit-imports': { multipart: importForm(true) },
  'get /api/unit-imports/:key': { params: { key: 'importKey' } },
  'get /api/fleet': { query: fleetQuery },
  'get /api/fleet/count': { query: rec(fleetFilters) },
  'get /api/fleet/export.csv': { query: fleetQuery },
  'get /api/fleet/overview': {
    query: rec({ months: opt(fc.constantFrom('1', '12', '36')), ...siteQuery, refrigerant: opt(refrigerant) }),
  },
  'post /api/fleet/repair-effectiveness/refresh': { weight: 0.5, body: EMPTY },
  'get /api/traceability': { query: traceQuery },
  'get /api/traceability/export.csv': { query: traceQuery },
  'post /api/traceability/mark-for-inspection': {
    body: rec({ query: traceQuery, reason: fc.constant('Supplier recalled the lot'), idempotencyKey: key }),
  },
  'get /api/refrigerant-log': {
    query: fc
      .tuple(period, opt(ref('siteId')), opt(refrigerant), opt(fc.constant('2026-06-01T10:00:00.000Z_5')))
      .map(([p, siteId, r, before]) => compact({ ...p, siteId, refrigerant: r, before })),
  },
  'get /api/refrigerant-log/export.csv': {
    query: fc.tuple(period, opt(ref('siteId'))).map(([p, siteId]) => compact({ ...p, siteId })),
  },
  'get /api/decisions/candidates': { query: rec({ ...siteQuery, limit: opt(fc.constantFrom('1', '50', '200')) }) },
  'get /api/decisions/units/:id': { params: { id: 'unitId' } },
  'post /api/decisions/units/:id': { params: { id: 'unitId' }, body: decision },
  'get /api/settings': {},
  'put /api/settings': {
    weight: 0.5,
    body: rec({
      settings,
      baseVersion: fc.oneof(
        { weight: 4, arbitrary: ref('settingsVersion') },
        { weight: 1, arbitrary: fc.constantFrom(0, null) },
      ),
    }),
  },
  'get /api/settings/history': {},
  'get /api/jobs/:id': { params: { id: 'jobId' } },
};

/** For routes without a shape: the pool a parameter probably names. */
function guessPool(path: string, param: string): PoolName | null {
  if (param === 'token')
    return path.includes('invitation') ? 'invitationToken' : path.includes('password') ? 'resetToken' : 'qrToken';
  if (param === 'number') return 'containerNumber';
  if (param === 'key') return 'importKey';
  if (param !== 'id') return null;
  if (path.startsWith('/api/users')) return 'userId';
  if (path.startsWith('/api/sites')) return 'siteId';
  if (path.startsWith('/api/events')) return 'eventId';
  if (path.startsWith('/api/attachments')) return 'attachmentId';
  if (path.startsWith('/api/jobs')) return 'jobId';
  return 'unitId';
}

const INVALID_PARAMS = [
  '0',
  '-1',
  '1.5',
  '1e3',
  '999999',
  '2147483647',
  '2147483648',
  '9007199254740993',
  '99999999999999999999999',
  'NaN',
  'abc',
  ' ',
  '%20',
];
const RAW_PARAMS = ['%', '%zz', '%ED%A0%80', '%C0%AF', '%FF%FE', '%2F', '..', '%00', 'a%2Fb'];

const paramValue = (pool: ParamSource | null): fc.Arbitrary<ParamValue> =>
  fc.oneof(
    {
      weight: pool ? 6 : 0,
      arbitrary:
        pool === null
          ? fc.constant({ text: '1' })
          : typeof pool === 'string'
            ? ref(pool)
            : fc.nat().map((i) => new PoolRef(pool.pool, i, pool.field)),
    },
    { weight: 3, arbitrary: fc.constantFrom(...INVALID_PARAMS).map((text) => ({ text })) },
    { weight: 1, arbitrary: fc.constantFrom(...RAW_PARAMS).map((raw) => ({ raw })) },
    { weight: 2, arbitrary: weirdString.filter((s) => s.length > 0).map((text) => ({ text })) },
  );

/** Points every field reference of one pool at the same row as the first one. */
function sameRow(params: Record<string, ParamValue>): Record<string, ParamValue> {
  const first = Object.values(params).find((v): v is PoolRef => v instanceof PoolRef && v.field !== undefined);
  if (!first) return params;
  return Object.fromEntries(
    Object.entries(params).map(([k, v]) => [
      k,
      v instanceof PoolRef && v.field !== undefined && v.pool === first.pool
        ? new PoolRef(v.pool, first.index, v.field)
        : v,
    ]),
  );
}

const RAW_QUERY = ['%', '%zz', '%ED%A0%80', '%C0%AF', '%00'];
const queryValue: fc.Arbitrary<QueryValue> = fc.oneof(
  { weight: 5, arbitrary: weirdString },
  { weight: 1, arbitrary: fc.constantFrom(...RAW_QUERY).map((raw) => ({ raw })) },
);

/** Query pairs: the valid ones (a PoolRef stays a PoolRef), with values changed, keys dropped, repeated or added. */
function queryPairs(valid: fc.Arbitrary<Shape>): fc.Arbitrary<[string, QueryValue][]> {
  const pairsOf = (q: Shape): [string, QueryValue][] =>
    Object.entries((q ?? {}) as Record<string, Shape>).map(([k, v]) => [
      k,
      v instanceof PoolRef ? v : typeof v === 'string' ? v : JSON.stringify(v),
    ]);
  const edit = fc.oneof(
    fc.record({ op: fc.constant('tweak' as const), pick: fc.nat(), tweak }),
    fc.record({ op: fc.constant('set' as const), pick: fc.nat(), value: queryValue }),
    fc.record({ op: fc.constant('drop' as const), pick: fc.nat() }),
    fc.record({ op: fc.constant('repeat' as const), pick: fc.nat() }),
    fc.record({
      op: fc.constant('add' as const),
      key: fc.oneof(
        fc.constantFrom('page', 'limit', 'siteId', 'sort', 'from', 'to', 'q', 'a[b]', '__proto__'),
        fc.string({ maxLength: 6 }),
      ),
      value: queryValue,
    }),
  );
  return fc.oneof(
    { weight: 3, arbitrary: valid.map(pairsOf) },
    {
      weight: 5,
      arbitrary: fc.tuple(valid.map(pairsOf), fc.array(edit, { minLength: 1, maxLength: 2 })).map(([pairs, edits]) => {
        const out = [...pairs];
        for (const e of edits) {
          if (e.op === 'add') out.push([e.key, e.value]);
          else if (!out.length) continue;
          else if (e.op === 'tweak') {
            const [k, v] = out[e.pick % out.length];
            const odd = tweaked(typeof v === 'string' || v instanceof PoolRef ? v : v.raw, e.tweak);
            out[e.pick % out.length] = [k, typeof odd === 'string' ? odd : JSON.stringify(odd)];
          } else if (e.op === 'set') out[e.pick % out.length] = [out[e.pick % out.length][0], e.value];
          else if (e.op === 'drop') out.splice(e.pick % out.length, 1);
          else out.push(out[e.pick % out.length]);
        }
        return out;
      }),
    },
  );
}

const RAW_BODIES: { contentType: string; text: string }[] = [
  { contentType: 'application/json', text: '{' },
  { contentType: 'application/json', text: '"just a string"' },
  { contentType: 'application/json', text: 'null' },
  { contentType: 'application/json', text: '[]' },
  { contentType: 'application/json', text: '123' },
  { contentType: 'application/json', text: '{"a":1,"a":2}' },
  { contentType: 'application/json', text: '{"s":"\\ud800"}' },
  { contentType: 'application/json; charset=latin1', text: '{}' },
  { contentType: 'text/plain', text: '{"reason":"plain text body"}' },
  { contentType: 'application/x-www-form-urlencoded', text: 'email=a%40b.c&password=x' },
  { contentType: 'multipart/form-data; boundary=zz', text: '--zz\r\nbroken' },
];

function bodyFor(shape: RouteShape, method: string): fc.Arbitrary<Body> {
  const valid =
    shape.body ?? (method === 'get' ? fc.constant<Shape>({}) : fc.jsonValue({ maxDepth: 2 }).map((v) => v as Shape));
  const json = (v: fc.Arbitrary<Shape | undefined>) =>
    v.map((value): Body => (value === undefined ? { kind: 'none' } : { kind: 'json', value }));
  const sendsJson = method !== 'get' && !shape.multipart;
  const options: fc.WeightedArbitrary<Body>[] = [
    { weight: sendsJson ? 4 : 0, arbitrary: json(valid) },
    { weight: sendsJson ? 5 : 0, arbitrary: json(mutated(valid)) },
    { weight: 1, arbitrary: json(fc.jsonValue({ maxDepth: 3 }).map((v) => v as Shape)) },
    { weight: 1, arbitrary: fc.constantFrom(...RAW_BODIES).map((r): Body => ({ kind: 'raw', ...r })) },
    { weight: method === 'get' ? 6 : 1, arbitrary: fc.constant<Body>({ kind: 'none' }) },
  ];
  if (shape.multipart)
    options.push({ weight: 9, arbitrary: shape.multipart.map((m): Body => ({ kind: 'multipart', ...m })) });
  return fc.oneof(...options);
}

/** One random request to one of the routes, by a role the route admits three times in four. */
export function requestArbitrary(routes: RouteInfo[]): fc.Arbitrary<FuzzRequest> {
  const perRoute = routes.map((r) => {
    const key = `${r.method} ${r.path}`;
    const shape = ROUTE_SHAPES[key] ?? {};
    const names = [...r.path.matchAll(/:(\w+)/g)].map((m) => m[1]);
    const params = fc.record(
      Object.fromEntries(names.map((n) => [n, paramValue(shape.params?.[n] ?? guessPool(r.path, n))])),
    );
    const query = queryPairs(shape.query ?? fc.constant<Shape>({}));
    const actor = fc.oneof(
      { weight: 3, arbitrary: fc.constantFrom(...(r.allowed.length ? r.allowed : ACTORS)) },
      { weight: 1, arbitrary: fc.constantFrom(...ACTORS) },
    );
    const arbitrary = fc
      .record({
        actor,
        params,
        query,
        body: bodyFor(shape, r.method),
        withOrigin: fc.oneof(
          { weight: 19, arbitrary: fc.constant(true) },
          { weight: 1, arbitrary: fc.constant(false) },
        ),
        copies: fc.oneof({ weight: 15, arbitrary: fc.constant(1) }, { weight: 1, arbitrary: fc.constantFrom(2, 3) }),
      })
      .map((x): FuzzRequest => ({ route: key, ...x, params: sameRow(x.params as Record<string, ParamValue>) }));
    // Weights are integers; tenths keep the relative shares.
    return { weight: Math.round((shape.weight ?? 1) * 10), arbitrary };
  });
  return fc.oneof(...perRoute);
}
