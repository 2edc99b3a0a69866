import { describe, expect, it } from 'vitest';
import * as client from '../../src/lib/format';
import { fmtC, fmtKg, fmtMoney, fmtNumber, fmtPct, fmtTonnes } from '../../shared/format';

describe('one number rule for the screens and what the server writes', () => {
  it('writes a whole percentage without a trailing ".0" and keeps one decimal otherwise', () => {
    expect(fmtPct(34)).toBe('34 %');
    expect(fmtPct(34.04)).toBe('34 %');
    expect(fmtPct(100.5)).toBe('100.5 %');
    expect(fmtPct(7.25)).toBe('7.3 %');
  });

  it('writes kilograms to two decimals at most, so a PDF and a screen show the same mass', () => {
    expect(fmtKg(4.125)).toBe('4.13 kg');
    expect(fmtKg(4.5)).toBe('4.5 kg');
    expect(fmtKg(0.005)).toBe('0.01 kg');
  });

  it('writes tonnes, temperatures, plain numbers and money the way the screens do', () => {
    expect(fmtTonnes(6.435)).toBe('6.44 t');
    expect(fmtC(-25)).toBe('−25 °C');
    expect(fmtNumber(1250.44, 0)).toBe('1,250');
    expect(fmtMoney(14_250.4, 'EUR')).toBe('€14,250');
  });

  it('is the very rule the client format module hands to every screen', () => {
    expect(client.fmtPct).toBe(fmtPct);
    expect(client.fmtKg).toBe(fmtKg);
    expect(client.fmtTonnes).toBe(fmtTonnes);
    expect(client.fmtNumber).toBe(fmtNumber);
    expect(client.fmtMoney).toBe(fmtMoney);
  });
});
