import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { updateSettingsSchema } from '../../../shared/schemas/settings';
import { latestJob } from '../../lib/jobs/runner';
import { getSettingsDto, getSettingsHistory, saveSettings } from './settings.service';

export function settingsRoutes(ctx: AppContext) {
  return [
    // Engineers read the policy, thresholds and PTI validity they work by; prices only owners and admins
    // (technicians need none of it: their screens get the figures computed on the server).
    route('get', '/api/settings', 'view:fleet', async (req, res) => {
      res.json(await getSettingsDto(ctx.db, await latestJob(ctx.db, 'stats_recompute'), req.user!));
    }),
    // The route admits whoever may change any section (owners: prices); the service checks each changed section.
    route('put', '/api/settings', 'manage:costs', async (req, res) => {
      const input = updateSettingsSchema.parse(req.body);
      const neighboursBefore = (await ctx.caches.settings.get(ctx.db)).forecast.neighbours;
      const saved = await saveSettings(ctx.db, ctx.caches.settings, req.user!, input, ctx.clock.now());
      if (saved.recompute) {
        await ctx.jobs.start('stats_recompute', {
          settingsId: saved.version,
          userId: req.user!.id,
          message: 'Figures with the new settings.',
        });
        // The forecast's case base is measured and calibrated for K: learned again when K changes (every forecast follows).
        if (input.settings.forecast.neighbours !== neighboursBefore) {
          await ctx.jobs.start('forecast_cases', {
            userId: req.user!.id,
            message: 'After the number of similar cases changed.',
          });
        }
      }
      // The hold window (thresholds) and the minimum repair count (economics) shape repair effectiveness.
      if (saved.sections.includes('thresholds') || saved.sections.includes('economics'))
        await ctx.jobs.start('repair_effectiveness', { userId: req.user!.id });
      res.json({
        ...(await getSettingsDto(ctx.db, await latestJob(ctx.db, 'stats_recompute'), req.user!)),
        changedSections: saved.sections,
      });
    }),
    route('get', '/api/settings/history', 'view:fleet', async (_req, res) => {
      res.json(await getSettingsHistory(ctx.db));
    }),
  ];
}
