import path from 'node:path';

/**
 * Where the server tests write the keys of the routes whose 2xx answers fitted their schema, one
 * file per worker; `response-coverage.test.ts` reads them after the server project has run.
 */
export const RESPONSE_LOG_DIR = path.resolve(
  import.meta.dirname,
  '../../../node_modules/.cache/emberline-response-checks',
);
