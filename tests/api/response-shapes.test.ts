// The API contract for the cylinder register, the depot's day, quarantine and release: each success body, as the
// server really sends it, is exactly the shape its zod schema in shared/schemas describes — nothing missing, nothing
// extra — and is an object of named parts (the one success-body rule), never a bare list or value.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type TestAgent from 'supertest/lib/agent';
import type { z } from 'zod';
import { createApp } from '../../server/app';
import { PTI_ITEMS } from '../../shared/domain/pti';
import {
  cylinderDetailDto,
  cylinderImportResultDto,
  cylinderListDto,
  cylinderResponseDto,
  quarantineResultDto,
} from '../../shared/schemas/cylinders';
import { dayDto, unitDepotDto } from '../../shared/schemas/day';
import { liftQuarantineResultDto, quarantineUnitsResultDto } from '../../shared/schemas/quarantine';
import { recordPtiResultDto, releaseResultDto } from '../../shared/schemas/release';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let technician: TestAgent;
let site: { id: number; code: string };
let serial = 630001;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  technician = (await signInAs(app, db, 'technician')).agent;
  site = await createTestSite(db, { name: 'South yard', code: 'SY' });
});
afterAll(() => pool.end());

const newUnit = async () =>
  (
    await createTestUnit(db, {
      containerNumber: halyardNumber(serial++),
      siteId: site.id,
      nominalChargeKg: 5,
      commissionedOn: '2024-01-10',
    })
  ).id;
const post = (agent: TestAgent, url: string, body: object) => agent.post(url).set('Origin', TEST_ORIGIN).send(body);
const keyed = (body: object) => ({ idempotencyKey: randomUUID(), ...body });

/** The body parses, and parsing drops nothing: every key the server sent is one the schema names. */
function expectShape(schema: z.ZodType, res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(typeof res.body === 'object' && res.body !== null && !Array.isArray(res.body)).toBe(true);
  const parsed = schema.safeParse(res.body);
  expect(parsed.error?.issues ?? []).toEqual([]);
  expect(parsed.data).toEqual(res.body);
}

describe('cylinder register responses', () => {
  it('answers registering, listing, opening, weighing, quarantining and importing in the shapes of its schemas', async () => {
    const created = await post(engineer, '/api/cylinders', {
      code: 'SH-1',
      kind: 'new',
      refrigerant: 'R-134a',
      tareKg: 12,
      capacityKg: 13.6,
      grossKg: 25.6,
      gasOrigin: 'virgin',
      lot: 'LOT-SH',
      siteId: site.id,
    });
    expectShape(cylinderDetailDto, created, 201);
    const id = (created.body as z.infer<typeof cylinderDetailDto>).cylinder.id;

    const unitId = await newUnit();
    await recordVisits(technician, unitId, [
      {
        at: '2026-05-20T09:00:00Z',
        siteId: site.id,
        events: [{ kind: 'top_up', kg: 0.6, cylinder: 'SH-1', cylinderId: id }],
      },
    ]);

    expectShape(cylinderListDto, await technician.get('/api/cylinders'), 200);
    expectShape(cylinderResponseDto, await technician.get('/api/cylinders/by-code/SH-1'), 200);
    expectShape(cylinderDetailDto, await post(technician, `/api/cylinders/${id}/weighings`, { grossKg: 25 }), 201);
    const quarantined = await post(engineer, `/api/cylinders/${id}/status`, {
      status: 'quarantined',
      reason: 'Supplier recall of lot LOT-SH',
    });
    expectShape(quarantineResultDto, quarantined, 200);
    expect(quarantined.body.unitIds).toEqual([unitId]);
    const detail = await technician.get(`/api/cylinders/${id}`);
    expectShape(cylinderDetailDto, detail, 200);
    expect(detail.body.moves).toHaveLength(1);
    expect(detail.body.quarantinedUnits).toHaveLength(1);

    const csv = [
      'code,kind,refrigerant,tareKg,capacityKg,grossKg,gasOrigin,siteCode',
      'SH-2,recovery,R-134a,14,20,,,SY',
    ];
    const imported = await engineer
      .post('/api/cylinder-imports')
      .set('Origin', TEST_ORIGIN)
      .attach('file', Buffer.from(csv.join('\n')), 'cylinders.csv');
    expectShape(cylinderImportResultDto, imported, 201);
  });
});

describe('depot day, quarantine and release responses', () => {
  it('answers the depot state, My day, a PTI, a release, a quarantine and its lift in the shapes of their schemas', async () => {
    const unitId = await newUnit();
    await recordVisits(technician, unitId, [
      {
        at: '2026-05-31T09:00:00Z',
        siteId: site.id,
        events: [{ kind: 'top_up', kg: 0.4, cylinder: 'CYL-9' }],
      },
    ]);
    const depot = await technician.get(`/api/units/${unitId}/depot`);
    expectShape(unitDepotDto, depot, 200);
    expect(depot.body.openRecheck).not.toBeNull();
    const day = await technician.get(`/api/day?siteId=${site.id}`);
    expectShape(dayDto, day, 200);
    expect(day.body.groups.some((g: { rows: unknown[] }) => g.rows.length > 0)).toBe(true);

    const other = await newUnit();
    const items = PTI_ITEMS.map((i) => ({ id: i.id, result: 'passed' }));
    expectShape(recordPtiResultDto, await post(technician, `/api/units/${other}/pti`, keyed({ items })), 201);
    expectShape(releaseResultDto, await post(technician, `/api/units/${other}/release`, keyed({})), 201);

    const q = await post(
      engineer,
      '/api/quarantine',
      keyed({ unitIds: [other], reason: 'Charged from a suspect lot' }),
    );
    expectShape(quarantineUnitsResultDto, q, 201);
    const inQuarantine = await technician.get(`/api/units/${other}/depot`);
    expectShape(unitDepotDto, inQuarantine, 200);
    expect(inQuarantine.body.quarantine).not.toBeNull();
    const lift = await post(
      engineer,
      `/api/units/${other}/quarantine/lift`,
      keyed({ result: 'identified_pure', note: 'Identifier reading 99.8 % R-134a' }),
    );
    expectShape(liftQuarantineResultDto, lift, 201);
  });
});
