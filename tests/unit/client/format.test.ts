import { describe, expect, it } from 'vitest';
import {
  fmtC,
  fmtContainer,
  fmtCount,
  fmtDateTime,
  fmtDay,
  fmtDayShort,
  fmtK,
  fmtKg,
  fmtMoney,
  fmtMonth,
  fmtNumber,
  fmtPct,
  fmtTime,
  fmtTonnes,
} from '../../../src/lib/format';

describe('client formatting: one rule per quantity', () => {
  it('writes one leak rate the same way on every screen: one decimal at most', () => {
    expect(fmtPct(25.34)).toBe('25.3 %');
    expect(fmtPct(25)).toBe('25 %');
    expect(fmtPct(4.25)).toBe('4.3 %');
    expect(fmtPct(0)).toBe('0 %');
    expect(fmtPct(1234.5)).toBe('1,234.5 %');
  });

  it('writes refrigerant mass to the 10 g a service scale reads, without trailing zeros', () => {
    expect(fmtKg(0.35)).toBe('0.35 kg');
    expect(fmtKg(0.8)).toBe('0.8 kg');
    expect(fmtKg(12.345)).toBe('12.35 kg');
    expect(fmtKg(12)).toBe('12 kg');
    expect(fmtKg(1234.5)).toBe('1,234.5 kg');
  });

  it('writes tonnes of CO2e to two decimals and never shows a real amount as 0', () => {
    expect(fmtTonnes(7.1487)).toBe('7.15 t');
    expect(fmtTonnes(20)).toBe('20 t');
    expect(fmtTonnes(0)).toBe('0 t');
    expect(fmtTonnes(0.004)).toBe('< 0.01 t');
    expect(fmtTonnes(0.005)).toBe('0.01 t');
  });

  it('writes temperatures with one decimal and a true minus sign', () => {
    expect(fmtC(-18.04)).toBe('−18 °C');
    expect(fmtC(4.25)).toBe('4.3 °C');
    expect(fmtK(-2.5)).toBe('−2.5 K');
    expect(fmtK(3)).toBe('+3 K');
    expect(fmtK(0)).toBe('0 K');
  });

  it('writes counts grouped and numbers with the decimals asked for', () => {
    expect(fmtCount(12500)).toBe('12,500');
    expect(fmtNumber(1.005, 1)).toBe('1');
    expect(fmtNumber(1234.56, 1)).toBe('1,234.6');
  });

  it('writes money in whole units, with the currency where it is known', () => {
    expect(fmtMoney(1234.56, 'EUR')).toBe('€1,235');
    expect(fmtMoney(1234.56, 'euro')).toBe('1,235 euro');
    expect(fmtMoney(25000)).toBe('25,000');
  });

  it('shows a calendar day as that day whatever the time zone, and a missing one as a dash', () => {
    expect(fmtDay('2026-06-01')).toBe('1 Jun 2026');
    expect(fmtDay('2026-09-30')).toBe('30 Sep 2026');
    expect(fmtDay(null)).toBe('—');
    expect(fmtDay(undefined)).toBe('—');
    expect(fmtDayShort('2026-12-24')).toBe('24 Dec');
    expect(fmtMonth('2026-06')).toBe('Jun 26');
  });

  it('shows a moment in the viewer’s own time, on a 24-hour clock', () => {
    const local = new Date(2026, 5, 1, 14, 5, 9);
    expect(fmtDay(local)).toBe('1 Jun 2026');
    expect(fmtDateTime(local)).toBe('1 Jun 2026, 14:05');
    expect(fmtDateTime(local.toISOString())).toBe('1 Jun 2026, 14:05');
    expect(fmtTime(local)).toBe('14:05:09');
  });

  it('writes a container number with its owner code, serial and check digit apart', () => {
    expect(fmtContainer('HRLU1000016')).toBe('HRLU 100001 6');
  });
});
