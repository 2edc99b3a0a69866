// The learned next top-up forecast (DOMAIN.md §7b) in the browser: the unit card says the situation, the 80 % range
// and how often such ranges held; the overview shows the forecast's accuracy on the fleet. SCREENSHOT_DIR=<dir> keeps
// screenshots of both at phone and desktop width.
import path from 'node:path';
import { afterAll, describe, expect, inject, it } from 'vitest';
import type { APIRequestContext, Page } from 'playwright-core';
import { createDb } from '../../server/db/client';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, signInToApp } from '../support/browser';
import { createHistoryUnit, recordVisits } from '../support/history';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const engineer = DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!;
const DAY = 86_400_000;
const at = (daysAgo: number) => new Date(Date.now() - daysAgo * DAY).toISOString();
const shots = process.env.SCREENSHOT_DIR;

async function shoot(page: Page, name: string) {
  if (shots) await page.screenshot({ path: path.join(shots, `${name}.png`), fullPage: true });
}

/** Polls a job until it is no longer running. */
async function finished(request: APIRequestContext, baseUrl: string, id: number) {
  for (let i = 0; i < 240; i++) {
    const { job } = (await (await request.get(`${baseUrl}/api/jobs/${id}`)).json()) as { job: { status: string } };
    if (job.status !== 'running') return job;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`job ${id} still running`);
}

describe('the learned next top-up forecast', () => {
  it('shows the situation, the 80 % range and how often such ranges held on the unit card, and the fleet’s accuracy on the overview', async () => {
    const b = await openBrowser({ viewport: PHONE });
    try {
      const { page } = b;
      const baseUrl = inject('baseUrl');
      const unit = await createHistoryUnit(db, { nominalChargeKg: 5, commissionedOn: '2019-03-01' });
      const waiting = await createHistoryUnit(db, { nominalChargeKg: 5, commissionedOn: '2019-03-01' });
      await signInToApp(page, engineer.email, DEMO_PASSWORD);
      // Five top-ups at routine calls about 100 days apart, the last 40 days ago: three or more intervals.
      await recordVisits(
        page.request,
        baseUrl,
        unit.id,
        [440, 340, 245, 140, 40].map((d, i) => ({
          at: at(d),
          events: [
            { kind: 'pti' as const, passed: true },
            { kind: 'top_up' as const, kg: 0.6 + 0.05 * i, cylinder: 'CYL-E2E-F' },
          ],
        })),
      );

      // Another, topped up every 100 days until 230 days ago: its own rhythm said 130 days ago.
      await recordVisits(
        page.request,
        baseUrl,
        waiting.id,
        [530, 430, 330, 230].map((d) => ({
          at: at(d),
          events: [{ kind: 'top_up' as const, kg: 0.7, cylinder: 'CYL-E2E-F' }],
        })),
      );

      // Learn from the fleet, then wait for every forecast to be recomputed from it.
      const start = await page.request.post(`${baseUrl}/api/fleet/forecast/refresh`, { headers: { Origin: baseUrl } });
      expect(start.status()).toBe(202);
      const learned = await finished(page.request, baseUrl, ((await start.json()) as { job: { id: number } }).job.id);
      expect(learned.status).toBe('done');
      const settings = (await (await page.request.get(`${baseUrl}/api/settings`)).json()) as {
        recompute: { id: number };
      };
      expect((await finished(page.request, baseUrl, settings.recompute.id)).status).toBe('done');

      await page.goto(`/units/${unit.id}`);
      const card = page.getByTestId('forecast-card');
      await card.waitFor();
      expect(await page.getByTestId('forecast-situation').textContent()).toMatch(
        /^Three or more intervals between top-ups; the last on /,
      );
      expect(await page.getByTestId('forecast-range').textContent()).toMatch(
        /^Range \(80 %\): \d+ \w+ \d{4} – \d+ \w+ \d{4}\.$/,
      );
      expect(await page.getByTestId('forecast-coverage').textContent()).toMatch(
        /^On this fleet, ranges like this held the next top-up \d+(\.\d)? % of the time\.$/,
      );
      expect(await page.getByTestId('forecast-basis').textContent()).toMatch(/most similar past cases of the fleet/);
      await shoot(page, 'unit-card-390');
      await page.setViewportSize(DESKTOP);
      await shoot(page, 'unit-card-1280');

      // No stale date: the unit that waited past its rhythm is "likely within" a date still to come.
      await page.setViewportSize(PHONE);
      await page.goto(`/units/${waiting.id}`);
      await page.getByTestId('forecast-card').waitFor();
      expect(await page.getByTestId('forecast-value').textContent()).toMatch(
        /^Likely within (a day|\d+ days)by \d+ \w+ \d{4}$/,
      );
      expect(await page.getByTestId('forecast-card').textContent()).toMatch(
        /It has gone 230 days without a top-up, longer than its usual 100/,
      );
      await shoot(page, 'unit-waiting-390');

      await page.setViewportSize(DESKTOP);
      await page.goto('/fleet/overview');
      const panel = page.getByRole('region', { name: 'Forecast accuracy on this fleet' });
      await panel.waitFor();
      expect(await page.getByTestId('forecast-accuracy-mae').textContent()).toMatch(/^\d+(\.\d)? days$/);
      expect(await page.getByTestId('forecast-accuracy-coverage').textContent()).toMatch(/^\d+(\.\d)? %$/);
      expect(await panel.getByRole('row').count()).toBeGreaterThan(1);
      await panel.scrollIntoViewIfNeeded();
      await shoot(page, 'overview-1280');
      await page.setViewportSize(PHONE);
      await shoot(page, 'overview-390');
      expect(b.pageErrors).toEqual([]);
      expect(b.consoleErrors).toEqual([]);
    } finally {
      await b.close();
    }
  });
});
