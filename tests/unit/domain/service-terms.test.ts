import { describe, expect, it } from 'vitest';
import {
  isLeakCheckMethod,
  isLeakLocation,
  isRepairAction,
  isSightGlassState,
  LEAK_CHECK_METHODS,
  LEAK_CHECK_METHOD_IDS,
  LEAK_LOCATIONS,
  LEAK_LOCATION_IDS,
  REPAIR_ACTIONS,
  REPAIR_ACTION_IDS,
  SIGHT_GLASS_STATES,
  SIGHT_GLASS_STATE_IDS,
  termLabel,
} from '../../../shared/domain';

describe('service vocabularies', () => {
  it('label every id, in the same order, with snake_case ids', () => {
    const pairs = [
      [LEAK_LOCATIONS, LEAK_LOCATION_IDS],
      [REPAIR_ACTIONS, REPAIR_ACTION_IDS],
      [LEAK_CHECK_METHODS, LEAK_CHECK_METHOD_IDS],
      [SIGHT_GLASS_STATES, SIGHT_GLASS_STATE_IDS],
    ] as const;
    for (const [terms, ids] of pairs) {
      expect(terms.map((t) => t.id)).toEqual([...ids]);
      for (const t of terms) {
        expect(t.id).toMatch(/^[a-z]+(_[a-z]+)*$/);
        expect(t.label.length).toBeGreaterThan(0);
      }
    }
  });

  it('includes the leak-check methods technicians use', () => {
    expect([...LEAK_CHECK_METHOD_IDS]).toEqual([
      'electronic_detector',
      'bubble_solution',
      'uv_dye',
      'nitrogen_pressure_test',
      'vacuum_test',
    ]);
  });

  it('finds labels and falls back to the id', () => {
    expect(termLabel(LEAK_LOCATIONS, 'service_valve')).toBe('Service valve');
    expect(termLabel(LEAK_LOCATIONS, 'roof')).toBe('roof');
  });

  it('tells known ids from anything else', () => {
    expect(isLeakLocation('brazed_joint')).toBe(true);
    expect(isLeakLocation('roof')).toBe(false);
    expect(isRepairAction('rebrazed')).toBe(true);
    expect(isRepairAction(3)).toBe(false);
    expect(isLeakCheckMethod('uv_dye')).toBe(true);
    expect(isLeakCheckMethod('sniffing')).toBe(false);
    expect(isSightGlassState('bubbles')).toBe(true);
    expect(isSightGlassState(null)).toBe(false);
  });
});
