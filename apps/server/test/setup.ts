import { afterEach, beforeEach, expect, vi } from 'vitest';
import { checkJsonResponses, takeResponseProblems } from './response-contract';
import { takeServerErrors } from './server-log';

checkJsonResponses();

// Tests fail on an unexpected console.error: a warning nobody reads is a bug nobody fixes.
let consoleError: ReturnType<typeof vi.spyOn>;

beforeEach(() => {
  consoleError = vi.spyOn(console, 'error');
  takeServerErrors();
});

afterEach(() => {
  expect(consoleError, 'console.error was called').not.toHaveBeenCalled();
  consoleError.mockRestore();
  // An error the server logged is a failure unless the test took it and checked it.
  expect(
    // With the error itself, so that a failure that happens once in a while can be read.
    takeServerErrors().map((line) =>
      line.err ? `${line.msg}: ${JSON.stringify(line.err).slice(0, 2000)}` : line.msg,
    ),
    'the server logged an error',
  ).toEqual([]);
  expect(takeResponseProblems(), 'a response does not fit its schema').toEqual([]);
});
