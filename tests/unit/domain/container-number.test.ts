import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CONTAINER_LETTER_VALUES,
  containerCheckDigit,
  DomainError,
  formatContainerNumber,
  parseContainerNumber,
  wrongCheckDigitText,
} from '../../../shared/domain';

describe('ISO 6346 check digit', () => {
  it('returns 3 for CSQU305438', () => {
    // Source: ISO 6346 check-digit algorithm, published example CSQU3054383
    expect(containerCheckDigit('CSQU305438')).toBe(3);
  });

  it('returns 4 for MWCU605978', () => {
    // Source: ISO 6346 check-digit algorithm (DOMAIN.md §2 check value)
    expect(containerCheckDigit('MWCU605978')).toBe(4);
  });

  it('values letters from A = 10 to Z = 38, skipping 11, 22 and 33', () => {
    // Source: ISO 6346 letter values as publicly described (DOMAIN.md §2 table)
    const table =
      'A10 B12 C13 D14 E15 F16 G17 H18 I19 J20 K21 L23 M24 N25 O26 P27 Q28 R29 S30 T31 U32 V34 W35 X36 Y37 Z38';
    for (const pair of table.split(' ')) expect(CONTAINER_LETTER_VALUES[pair[0]]).toBe(Number(pair.slice(1)));
  });

  it('turns a remainder of 10 into 0', () => {
    // Scan serials of CSQU for one whose weighted sum is 10 mod 11; its check digit must be 0.
    let found = '';
    for (let n = 0; n < 1000 && !found; n++) {
      const s = `CSQU${String(n).padStart(6, '0')}`;
      let sum = 0;
      for (let i = 0; i < 10; i++) sum += (i < 4 ? CONTAINER_LETTER_VALUES[s[i]] : Number(s[i])) * 2 ** i;
      if (sum % 11 === 10) found = s;
    }
    expect(found).not.toBe('');
    expect(containerCheckDigit(found)).toBe(0);
  });

  it('accepts lower case, spaces and hyphens', () => {
    expect(containerCheckDigit('csqu 305-438')).toBe(3);
  });

  it('refuses input that is not owner code + category + serial', () => {
    expect(() => containerCheckDigit('CSQU30543')).toThrow(DomainError);
    expect(() => containerCheckDigit('C5QU305438')).toThrow(/3-letter owner code/);
    expect(() => containerCheckDigit('CSQX305438')).toThrow(/must be U, J or Z/);
    expect(() => containerCheckDigit('CSQU30543A')).toThrow(/6-digit serial/);
  });
});

describe('parseContainerNumber', () => {
  it('stores the 11-character upper-case form', () => {
    expect(parseContainerNumber(' csqu 305438-3 ')).toEqual({ ok: true, value: 'CSQU3054383' });
    expect(parseContainerNumber('MWCU6059784')).toEqual({ ok: true, value: 'MWCU6059784' });
  });

  it('says which check digit the first ten characters imply', () => {
    const r = parseContainerNumber('CSQU3054384');
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.expectedCheckDigit).toBe(3);
      expect(r.error).toContain('gives 3, not 4');
    }
    const letter = parseContainerNumber('CSQU305438X');
    expect(letter).toMatchObject({ ok: false, expectedCheckDigit: 3 });
  });

  it('explains a wrong length, an empty field and a bad category', () => {
    expect(parseContainerNumber('')).toMatchObject({
      ok: false,
      error: expect.stringContaining('Enter the container number'),
    });
    expect(parseContainerNumber('CSQU305')).toMatchObject({ ok: false, error: expect.stringContaining('has 7') });
    expect(parseContainerNumber('CSQA3054383')).toMatchObject({
      ok: false,
      error: expect.stringContaining('U, J or Z'),
    });
  });

  it('formats the stored form for display', () => {
    expect(formatContainerNumber('CSQU3054383')).toBe('CSQU 305438 3');
    expect(formatContainerNumber('abc')).toBe('ABC');
  });

  it('accepts every number built with its own check digit and rejects every other digit', () => {
    const letter = fc.constantFrom(...'ABCDEFGHIJKLMNOPQRSTUVWXYZ');
    fc.assert(
      fc.property(
        fc.tuple(letter, letter, letter),
        fc.constantFrom('U', 'J', 'Z'),
        fc.integer({ min: 0, max: 999_999 }),
        fc.integer({ min: 0, max: 9 }),
        (owner, cat, serial, other) => {
          const first10 = `${owner.join('')}${cat}${String(serial).padStart(6, '0')}`;
          const digit = containerCheckDigit(first10);
          expect(parseContainerNumber(`${first10}${digit}`)).toEqual({ ok: true, value: `${first10}${digit}` });
          if (other !== digit)
            expect(parseContainerNumber(`${first10}${other}`)).toMatchObject({ ok: false, expectedCheckDigit: digit });
        },
      ),
    );
  });
});

describe('wrongCheckDigitText', () => {
  it('says which check digit the first ten characters imply, and the number it makes', () => {
    // CSQU 305438 3 is the standard's own example; 5 in place of 3 is a typo.
    expect(wrongCheckDigitText('CSQU3054385')).toBe(
      'Check digit should be 3: CSQU\u00a0305438\u00a03. Check the number for a typo.',
    );
  });

  it('says nothing for a valid number, a short one or one that is wrong in another way', () => {
    expect(wrongCheckDigitText('CSQU 305438 3')).toBeNull();
    expect(wrongCheckDigitText('CSQU30543')).toBeNull();
    expect(wrongCheckDigitText('CSQX3054383')).toBeNull();
  });
});
