import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { openTestDb, resetDb } from '../support/db';
import { signInAs } from '../support/factories';

const { db, pool } = openTestDb();
const { app } = createApp({ db });

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

describe('field errors in plain words', () => {
  it('answers 400 with "At least 1" and "Enter a whole number", never the validator’s own text', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    const low = await agent.get('/api/units?page=0');
    expect(low.status).toBe(400);
    expect(low.body.error.fields.page).toBe('At least 1');
    const half = await agent.get('/api/units?pageSize=2.5');
    expect(half.status).toBe(400);
    expect(half.body.error.fields.pageSize).toBe('Enter a whole number');
    for (const message of [...Object.values(low.body.error.fields), ...Object.values(half.body.error.fields)]) {
      expect(message).not.toMatch(/Too small|Too big|expected|Invalid input|>=|<=/);
    }
  });
});
