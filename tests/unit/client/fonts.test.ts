// The preloaded font faces hold every character the app's own words use (scripts/subset-fonts.ts cuts them).
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { appCodePoints, FONT_DIR, FONT_WEIGHTS, FONTS_CSS, unicodeRange } from '../../../scripts/subset-fonts';
import { PROJECT_ROOT } from '../../../scripts/lib/mariadb';

describe('the app font', () => {
  it('has a core face per weight that covers every character in src/ and shared/', () => {
    const css = readFileSync(FONTS_CSS, 'utf8').replace(/\s+/g, ' ');
    const want = unicodeRange(appCodePoints());
    for (const weight of FONT_WEIGHTS) {
      const core = new RegExp(
        `font-weight: ${weight}; src: url\\('./assets/fonts/work-sans-${weight}-core.woff2'\\) format\\('woff2'\\); unicode-range: ([^;]+);`,
      );
      // When this fails, run `npx tsx scripts/subset-fonts.ts` and commit what it writes.
      expect(core.exec(css)?.[1], `weight ${weight}`).toBe(want);
      expect(existsSync(path.join(FONT_DIR, `work-sans-${weight}-core.woff2`))).toBe(true);
      expect(existsSync(path.join(FONT_DIR, `work-sans-${weight}-rest.woff2`))).toBe(true);
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
