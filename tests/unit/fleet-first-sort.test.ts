import { describe, expect, it } from 'vitest';
import { nextSort } from '../../src/features/fleet/utils/first-sort';

describe('fleet column sorting', () => {
  it('sorts "Next top-up", leak checks and PTIs soonest first at the first click', () => {
    expect(nextSort('forecast', { sort: 'score', dir: 'desc' })).toBe('asc');
    expect(nextSort('leakCheck', { sort: 'score', dir: 'desc' })).toBe('asc');
    expect(nextSort('pti', { sort: 'score', dir: 'desc' })).toBe('asc');
  });

  it('sorts score, leak rate and CO2e worst first at the first click', () => {
    expect(nextSort('score', { sort: 'forecast', dir: 'asc' })).toBe('desc');
    expect(nextSort('rate', { sort: 'forecast', dir: 'asc' })).toBe('desc');
    expect(nextSort('co2e', { sort: 'forecast', dir: 'asc' })).toBe('desc');
  });

  it('turns the order round on a second click', () => {
    expect(nextSort('forecast', { sort: 'forecast', dir: 'asc' })).toBe('desc');
    expect(nextSort('score', { sort: 'score', dir: 'desc' })).toBe('asc');
  });
});
