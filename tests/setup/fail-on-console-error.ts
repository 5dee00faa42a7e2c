// A console.error during a test is a bug somewhere: make it fail the test (as the Epic Stack does).
import { afterEach, beforeEach, vi } from 'vitest';

let errors: unknown[][] = [];
beforeEach(() => {
  errors = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    errors.push(args);
  });
});
afterEach(() => {
  vi.restoreAllMocks();
  if (errors.length) throw new Error(`console.error was called: ${errors.map((a) => a.map(String).join(' ')).join('\n')}`);
});
