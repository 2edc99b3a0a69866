// The app font's faces (scripts/subset-fonts.ts): every Latin character of Work Sans is in exactly one of the two
// faces of each weight, the core face holds printable ASCII, and index.html preloads the core faces.
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { FONT_DIR, FONT_WEIGHTS, FONTS_CSS, LATIN, unicodeRange } from '../../../scripts/subset-fonts';
import { PROJECT_ROOT } from '../../../scripts/lib/mariadb';

/** The code points of a CSS unicode-range value. */
function codePoints(range: string): Set<number> {
  const out = new Set<number>();
  for (const part of range.split(',').map((p) => p.trim())) {
    const [a, b] = part.replace(/^U\+/, '').split('-');
    for (let cp = parseInt(a, 16); cp <= parseInt(b ?? a, 16); cp++) out.add(cp);
  }
  return out;
}

function faceRange(css: string, weight: number, part: 'core' | 'rest'): Set<number> {
  const face = new RegExp(
    `font-weight: ${weight}; src: url\\('./assets/fonts/work-sans-${weight}-${part}.woff2'\\) format\\('woff2'\\); unicode-range: ([^;]+);`,
  ).exec(css);
  expect(face, `${part} face of weight ${weight}`).not.toBeNull();
  expect(existsSync(path.join(FONT_DIR, `work-sans-${weight}-${part}.woff2`))).toBe(true);
  return codePoints(face![1]);
}

describe('the app font', () => {
  it('puts every Latin character of each weight in exactly one face, printable ASCII in the core', () => {
    const css = readFileSync(FONTS_CSS, 'utf8').replace(/\s+/g, ' ');
    const latin = new Set(LATIN.flatMap(([a, b]) => Array.from({ length: b - a + 1 }, (_, i) => a + i)));
    for (const cp of [...latin]) if (cp < 0x20) latin.delete(cp);
    for (const weight of FONT_WEIGHTS) {
      const core = faceRange(css, weight, 'core');
      const rest = faceRange(css, weight, 'rest');
      expect([...core].filter((cp) => rest.has(cp))).toEqual([]);
      expect(new Set([...core, ...rest])).toEqual(latin);
      for (let cp = 0x20; cp <= 0x7e; cp++) expect(core.has(cp)).toBe(true);
    }
  });

  it('preloads exactly the core faces from index.html', () => {
    const html = readFileSync(path.join(PROJECT_ROOT, 'index.html'), 'utf8');
    const preloaded = [...html.matchAll(/<link rel="preload" href="([^"]+)" as="font"/g)].map((m) => m[1]);
    expect(preloaded).toEqual(FONT_WEIGHTS.map((w) => `/src/assets/fonts/work-sans-${w}-core.woff2`));
  });

  it('writes the range of a run of code points as one span', () => {
    expect(unicodeRange([0x20, 0x21, 0x22, 0xa0, 0x2013, 0x2014])).toBe('U+0020-0022, U+00A0, U+2013-2014');
  });
});
