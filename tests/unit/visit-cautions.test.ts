import { describe, expect, it } from 'vitest';
import { PRECEDENCE } from '../../src/components/ui/caution';
import * as safety from '../../src/features/history/utils/safety';
import { cautionsFor } from '../../src/features/history/utils/safety';

const ids = (kind: Parameters<typeof cautionsFor>[0], refrigerant: string) =>
  cautionsFor(kind, refrigerant).map((c) => c.id);

describe('cautions on the visit form', () => {
  it('gives charging its electrical point (380–460 V, fans)', () => {
    expect(ids('top_up', 'R-134a')).toContain('charging-power');
    expect(ids('recharge', 'R-134a')).toContain('charging-power');
    expect(cautionsFor('top_up', 'R-134a').find((c) => c.id === 'charging-power')!.summary).toMatch(/380–460 V/);
  });

  it('warns about nitrogen pressure tests on leak checks and repairs: regulator, relief valve, never oxygen or air', () => {
    for (const kind of ['leak_check', 'repair'] as const) {
      const n = cautionsFor(kind, 'R-134a').find((c) => c.id === 'nitrogen')!;
      expect(n.summary).toMatch(/regulator.*relief valve.*never oxygen or air.*pressure limits/);
    }
  });

  it('warns about frostbite, nitrogen purging and a fire watch on a repair', () => {
    const opening = cautionsFor('repair', 'R-134a').find((c) => c.id === 'opening')!;
    expect(opening.summary).toMatch(/frostbite/);
    expect(opening.summary).toMatch(/purge with nitrogen/);
    expect(opening.summary).toMatch(/fire watch/);
  });

  it('marks a pressure reading on an A2L unit as flammable work (no ignition sources)', () => {
    expect(ids('pressure', 'R-1234yf')).toContain('flammable');
    expect(ids('pressure', 'R-134a')).not.toContain('flammable');
  });

  it('keeps no copy of the precedence sentence: the form and every caution box say the one in ui/caution', () => {
    expect(Object.values(safety)).not.toContain(PRECEDENCE);
    for (const kind of ['top_up', 'recovery', 'recharge', 'leak_check', 'repair', 'pressure'] as const) {
      for (const c of cautionsFor(kind, 'R-1234yf')) expect(c.summary).not.toContain('take precedence');
    }
  });
});
