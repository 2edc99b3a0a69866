import { afterEach, beforeEach, vi } from 'vitest';

// A stray console.error fails the test that caused it: errors must be handled or asserted, never ignored.
let errors: unknown[][] = [];
beforeEach(() => {
  errors = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    errors.push(args);
  });
});
afterEach(() => {
  vi.mocked(console.error).mockRestore();
  if (errors.length > 0) {
    throw new Error(`console.error was called:\n${errors.map((a) => a.map(String).join(' ')).join('\n')}`);
  }
});
