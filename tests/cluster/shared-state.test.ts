// Two API processes of the running cluster, addressed one by one (not through the balancer): a limit counts over
// both, a figure changed through one is what the other answers at once, and a file uploaded through one downloads
// through the other (both keep files in the same S3 bucket).
import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { DEMO_ACCOUNTS } from '../../seed/demo-accounts';
import { PORTS } from '../../scripts/cluster/layout';
import { halyardNumber } from '../support/units';
import { Client, connectNode, rows } from './support';

const api = (i: number) => `http://127.0.0.1:${PORTS.api(i)}`;
const account = (role: string) => DEMO_ACCOUNTS.find((a) => a.role === role)!.email;

async function signedIn(role: string): Promise<Client> {
  const client = new Client(api(1));
  expect((await client.signIn(account(role))).status).toBe(200);
  return client;
}

describe('two API processes of the cluster', () => {
  it('counts 8 wrong passwords sent to both processes against one limit', async () => {
    // A client address of its own for this run (a documentation-range IPv6 /64, only ever a header: the processes
    // trust X-Forwarded-For from loopback, where the balancer is), so earlier runs' failures do not count here.
    const from = { 'X-Forwarded-For': `2001:db8:${Math.floor(Math.random() * 0xffff).toString(16)}::7` };
    const email = `nobody-${randomUUID().slice(0, 8)}@halyard.example`;
    const answers: number[] = [];
    for (let n = 0; n < 8; n++) {
      const res = await new Client(api(1 + (n % 2)), from).signIn(email, 'not the password at all');
      answers.push(res.status);
    }
    expect(answers.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(answers.slice(5)).toContain(429);
  });

  it('shows a top-up recorded through one process in the other’s monthly totals at once', async () => {
    const technician = await signedIn('technician');
    const engineer = await signedIn('engineer');
    const conn = await connectNode(1);
    const [unit] = await rows<{ id: number; refrigerant: string }>(
      conn,
      "SELECT id, refrigerant FROM units WHERE status = 'in_service' ORDER BY id DESC LIMIT 1",
    );
    await conn.end();
    const month = new Date().toISOString().slice(0, 7);
    const total = async () => {
      const res = await engineer.via(api(2)).request('GET', '/api/fleet/overview?months=12');
      expect(res.status).toBe(200);
      const rowsOf = (
        res.body!.emissions as { byRefrigerant: { month: string; refrigerant: string; madeUpKg: number }[] }
      ).byRefrigerant;
      return rowsOf
        .filter((r) => r.month === month && r.refrigerant === unit.refrigerant)
        .reduce((s, r) => s + r.madeUpKg, 0);
    };
    const before = await total();
    const visit = await technician.request('POST', '/api/visits', {
      idempotencyKey: randomUUID(),
      unitId: Number(unit.id),
      occurredAt: new Date(Date.now() - 60_000).toISOString(),
      events: [{ kind: 'top_up', kg: 0.75, cylinder: 'CYL-S2' }],
    });
    expect(visit.status).toBe(201);
    expect((await total()) - before).toBeCloseTo(0.75, 6);
  });

  it('counts a unit registered through one process in the other’s fleet size at once', async () => {
    const engineer = await signedIn('engineer');
    const count = async () =>
      ((await engineer.via(api(2)).request('GET', '/api/fleet?count=1')).body!.count as { total: number }).total;
    const before = await count();
    const res = await engineer.request('POST', '/api/units', {
      containerNumber: halyardNumber(800_000 + Math.floor(Math.random() * 99_999)),
      refrigerant: 'R-134a',
      nominalChargeKg: 4,
    });
    expect(res.status).toBe(201);
    expect(await count()).toBe(before + 1);
  });

  it('downloads through one process a photo uploaded through the other', async () => {
    const technician = await signedIn('technician');
    const conn = await connectNode(1);
    const [unit] = await rows<{ id: number }>(conn, "SELECT id FROM units WHERE status = 'in_service' LIMIT 1");
    await conn.end();
    const visit = await technician.request('POST', '/api/visits', {
      idempotencyKey: randomUUID(),
      unitId: Number(unit.id),
      occurredAt: new Date(Date.now() - 60_000).toISOString(),
      events: [{ kind: 'note', note: 'Door seal photo' }],
    });
    expect(visit.status).toBe(201);
    const eventId = (visit.body!.events as { id: number }[])[0].id;
    const png = await sharp({ create: { width: 300, height: 200, channels: 3, background: '#2a7' } })
      .png()
      .toBuffer();
    const up = await technician.upload(`/api/events/${eventId}/attachments`, 'files', 'seal.png', png, 'image/png');
    expect(up.status).toBe(201);
    const url = (up.body!.attachments as { url: string }[])[0].url;
    const down = await technician.via(api(2)).download(url);
    expect(down.status).toBe(200);
    expect(down.bytes.equals(png)).toBe(true);
  });
});
