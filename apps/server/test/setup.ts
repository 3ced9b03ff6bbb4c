import { afterEach, beforeEach, expect, vi } from 'vitest';

// Tests fail on an unexpected console.error: a warning nobody reads is a bug nobody fixes.
let consoleError: ReturnType<typeof vi.spyOn>;

beforeEach(() => {
  consoleError = vi.spyOn(console, 'error');
});

afterEach(() => {
  expect(consoleError, 'console.error was called').not.toHaveBeenCalled();
  consoleError.mockRestore();
});
