import { afterEach, beforeEach, vi } from 'vitest';

// An unexpected console.error fails the test (STYLE.md, tests/). A test that expects one
// replaces the spy with its own `vi.spyOn(console, 'error').mockImplementation(...)`.
let errorSpy: ReturnType<typeof vi.spyOn> | undefined;
beforeEach(() => {
  errorSpy = vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    throw new Error(`unexpected console.error: ${args.map(String).join(' ')}`);
  });
});
afterEach(() => {
  errorSpy?.mockRestore();
});
