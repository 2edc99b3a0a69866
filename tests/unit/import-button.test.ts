import { describe, expect, it } from 'vitest';
import { importButtonLabel } from '../../src/features/imports/utils/import-button';

describe('the import button', () => {
  it('counts the units that go in', () => {
    expect(importButtonLabel(2, false)).toBe('Import 2 units');
    expect(importButtonLabel(1, false)).toBe('Import 1 unit');
    expect(importButtonLabel(1200, false)).toBe('Import 1,200 units');
  });

  it('does not say "Import 2 units" while nothing can go in', () => {
    expect(importButtonLabel(2, true)).toBe('Nothing can be imported yet');
    expect(importButtonLabel(0, false)).toBe('Nothing can be imported yet');
  });

  it('names no count before a file is chosen', () => {
    expect(importButtonLabel(undefined, true)).toBe('Import units');
  });
});
