import request from 'supertest';
import type { Express } from 'express';
import type { Db } from '../../server/db/client';
import { units, users } from '../../server/db/schema';
import { hashPassword } from '../../server/lib/password';
import { newId, newToken } from '../../server/lib/ids';
import type { Role } from '../../shared/permissions';
import { halyardNumber } from './units';

export const TEST_ORIGIN = 'http://localhost:3000';
export const TEST_PASSWORD = 'correct-horse-battery';

let hashed: Promise<string> | null = null;
let counter = 0;

export async function createTestUser(db: Db, overrides: Partial<typeof users.$inferInsert> & { role?: Role } = {}) {
  hashed ??= hashPassword(TEST_PASSWORD);
  counter += 1;
  const row = {
    id: newId(),
    email: `user${counter}-${Date.now()}@test.example`,
    name: `Test User ${counter}`,
    role: 'technician' as Role,
    passwordHash: await hashed,
    certificateNumber: null,
    active: true,
    ...overrides,
  };
  await db.insert(users).values(row);
  return row;
}

/** A supertest agent with a signed-in session cookie and our Origin on every request. */
export async function signInAs(app: Express, db: Db, role: Role) {
  const user = await createTestUser(db, { role });
  const agent = request.agent(app);
  const res = await agent
    .post('/api/auth/sign-in')
    .set('Origin', TEST_ORIGIN)
    .send({ email: user.email, password: TEST_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { agent, user };
}

let unitCounter = 0;

/** A unit row straight into the database (the registry API has its own tests), with a valid HRLU container number. */
export async function createTestUnit(db: Db, overrides: Partial<typeof units.$inferInsert> = {}) {
  unitCounter += 1;
  const row = {
    containerNumber: halyardNumber(900_000 + unitCounter),
    refrigerant: 'R-134a',
    nominalChargeKg: 5,
    commissionedOn: '2020-01-01',
    qrToken: newToken(),
    ...overrides,
  };
  const [r] = await db.insert(units).values(row).$returningId();
  return { ...row, id: r.id };
}
