import { describe, expect, it } from 'vitest';
import { refrigerantMarking } from '../../server/features/labels/label-sheet';

describe('the hazard marking printed on a unit’s label', () => {
  it('marks A2L refrigerants as flammable and CO2 as high pressure, and nothing else', () => {
    expect(refrigerantMarking('R-1234yf')).toBe('A2L - FLAMMABLE');
    expect(refrigerantMarking('R-744')).toBe('CO2 - HIGH PRESSURE');
    expect(refrigerantMarking('R-134a')).toBeNull();
    expect(refrigerantMarking('R-452A')).toBeNull();
  });
});
