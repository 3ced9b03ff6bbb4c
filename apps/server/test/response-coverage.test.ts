import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routeSpecs } from '../src/http/route';
import { routePolicy } from '../src/http/route-policy';
import { RESPONSE_LOG_DIR } from './response-log';
import { startTestApp, type TestApp } from './test-app';

// Runs after the server project (vite.config.ts, sequence.groupOrder), from the keys its tests wrote.
let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

describe('the response contract', () => {
  it('has a 2xx answer validated by a test for every JSON route of the policy table', () => {
    const jsonRoutes = Object.keys(routePolicy).filter(
      (key) => routeSpecs.get(key as never)?.response,
    );
    expect(jsonRoutes.length, 'routes with a response schema').toBeGreaterThan(40);
    const validated = new Set(
      fs.existsSync(RESPONSE_LOG_DIR)
        ? fs
            .readdirSync(RESPONSE_LOG_DIR)
            .flatMap((name) =>
              fs.readFileSync(path.join(RESPONSE_LOG_DIR, name), 'utf8').split('\n'),
            )
        : [],
    );
    expect(
      jsonRoutes.filter((key) => !validated.has(key)),
      'JSON routes whose success answer no test validated (run the server tests first)',
    ).toEqual([]);
  });
});
