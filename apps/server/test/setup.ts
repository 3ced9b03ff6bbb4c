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
    takeServerErrors().map((line) => line.msg),
    'the server logged an error',
  ).toEqual([]);
  expect(takeResponseProblems(), 'a response does not fit its schema').toEqual([]);
});
