import { DomainError } from './errors';

/**
 * ISO 6346 letter values: A = 10, then upwards skipping multiples of 11 (11, 22, 33), so B = 12 … Z = 38.
 */
export const CONTAINER_LETTER_VALUES: Readonly<Record<string, number>> = (() => {
  const values: Record<string, number> = {};
  let v = 10;
  for (let c = 65; c <= 90; c++) {
    if (v % 11 === 0) v++;
    values[String.fromCharCode(c)] = v++;
  }
  return values;
})();

/** Equipment category letters of ISO 6346: U freight container, J detachable equipment, Z trailer or chassis. */
export const EQUIPMENT_CATEGORIES = {
  U: 'freight container',
  J: 'detachable equipment',
  Z: 'trailer or chassis',
} as const;

export type ContainerNumberResult =
  { ok: true; value: string } | { ok: false; error: string; expectedCheckDigit?: number };

/** Upper case with spaces and hyphens removed: "csqu 305438-3" → "CSQU3054383". */
export function normalizeContainerNumber(input: string): string {
  return input.replace(/[\s-]+/g, '').toUpperCase();
}

/** Why the first ten characters are not owner code + category + serial, or null when they are. */
function first10Problem(s: string): string | null {
  if (!/^[A-Z]{3}/.test(s)) return 'A container number starts with a 3-letter owner code, such as CSQU 305438 3.';
  if (!/^[A-Z]{3}[UJZ]/.test(s)) {
    return `The 4th character is the equipment category and must be U, J or Z, not "${s.charAt(3)}".`;
  }
  if (!/^[A-Z]{3}[UJZ][0-9]{6}/.test(s)) {
    return 'After the four letters come a 6-digit serial number and the check digit.';
  }
  return null;
}

/** ISO 6346 check digit: Σ value(cᵢ) × 2ⁱ over the first 10 characters, mod 11, a remainder of 10 becomes 0. */
export function containerCheckDigit(first10: string): number {
  const s = normalizeContainerNumber(first10);
  const problem =
    s.length === 10
      ? first10Problem(s)
      : 'The check digit is computed from exactly 10 characters: 4 letters and 6 digits.';
  if (problem) throw new DomainError(problem, 'containerNumber');
  let sum = 0;
  for (let i = 0; i < 10; i++) {
    const ch = s.charAt(i);
    const value = i < 4 ? CONTAINER_LETTER_VALUES[ch] : ch.charCodeAt(0) - 48;
    sum += value * 2 ** i;
  }
  return (sum % 11) % 10;
}

/** Validates and normalizes a container number; on a wrong check digit, says which digit the rest implies. */
export function parseContainerNumber(input: string): ContainerNumberResult {
  if (typeof input !== 'string' || input.trim() === '') {
    return { ok: false, error: 'Enter the container number, for example CSQU 305438 3.' };
  }
  const s = normalizeContainerNumber(input);
  if (s.length !== 11) {
    return {
      ok: false,
      error: `A container number has 11 characters (4 letters, 6 digits, 1 check digit); "${input.trim()}" has ${s.length}.`,
    };
  }
  const problem = first10Problem(s);
  if (problem) return { ok: false, error: problem };
  const expected = containerCheckDigit(s.slice(0, 10));
  const given = s.charAt(10);
  if (!/[0-9]/.test(given)) {
    return {
      ok: false,
      error: `The last character is the check digit and must be a digit; here it should be ${expected}.`,
      expectedCheckDigit: expected,
    };
  }
  if (Number(given) !== expected) {
    return {
      ok: false,
      error: `The check digit does not match: ${s.slice(0, 10)} gives ${expected}, not ${given}. Check the number for a typo.`,
      expectedCheckDigit: expected,
    };
  }
  return { ok: true, value: s };
}

/** Display form "CSQU 305438 3" of a stored 11-character number. */
export function formatContainerNumber(value: string): string {
  const s = normalizeContainerNumber(value);
  return s.length === 11 ? `${s.slice(0, 4)} ${s.slice(4, 10)} ${s.slice(10)}` : s;
}

/**
 * What to tell a person whose number has a wrong check digit, in the same words everywhere (scan page, Home's search,
 * forms): the digit the first ten characters imply and the number it makes. Spaces inside the number do not break.
 */
export function wrongCheckDigitText(input: string): string | null {
  const s = normalizeContainerNumber(input);
  if (s.length !== 11) return null;
  const r = parseContainerNumber(s);
  if (r.ok || r.expectedCheckDigit === undefined) return null;
  const fixed = formatContainerNumber(`${s.slice(0, 10)}${r.expectedCheckDigit}`).replace(/ /g, '\u00a0');
  return `Check digit should be ${r.expectedCheckDigit}: ${fixed}. Check the number for a typo.`;
}
