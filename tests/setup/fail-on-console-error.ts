import { afterEach, beforeEach, vi } from 'vitest';

// An unexpected console.error is a bug the test did not notice: fail the test that caused it.
let unexpected: unknown[][] = [];

beforeEach(() => {
  unexpected = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    unexpected.push(args);
  });
});

afterEach(() => {
  vi.mocked(console.error).mockRestore();
  if (unexpected.length > 0) {
    const first = unexpected[0]?.map((part) => (part instanceof Error ? part.stack : String(part))).join(' ');
    throw new Error(`console.error was called ${unexpected.length} time(s); first: ${first}`);
  }
});
