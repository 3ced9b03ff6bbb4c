import type { DestinationStream } from 'pino';

/** A line the server logged at error level or above, as pino wrote it. */
export interface LoggedError {
  level: number;
  msg?: string;
  [key: string]: unknown;
}

const PINO_ERROR = 50;
const logged: LoggedError[] = [];

/**
 * Where the test apps log: warnings and below are dropped, errors are kept so that the test that
 * caused one fails (see setup.ts) unless it takes them with `takeServerErrors` and checks them.
 */
export const serverLogCapture: DestinationStream = {
  write(line: string) {
    const record = JSON.parse(line) as LoggedError;
    if (record.level >= PINO_ERROR) logged.push(record);
  },
};

/** The errors the server logged since the last call; a test that expects an error takes it here. */
export function takeServerErrors(): LoggedError[] {
  return logged.splice(0);
}
