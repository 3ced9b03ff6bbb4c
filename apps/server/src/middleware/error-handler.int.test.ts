import express from 'express';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../test/test-app';
import { takeServerErrors } from '../../test/server-log';
import { inTransaction } from '../db/client';
import { trackRequestWrites } from '../db/request-writes';
import { loginFailures } from '../db/schema';
import { errorHandler } from './error-handler';
import { requestLogger } from './request-logger';

let running: TestApp | null = null;
afterEach(async () => {
  await running?.close();
  running = null;
});

describe('the answer to an unexpected error', () => {
  it('says nothing was changed only when no transaction of the request committed', async () => {
    // The product's own SQLite file and transaction helper, behind the product's error handler.
    running = await startTestApp({ demo: false });
    const { db } = running.runtime.ctx;
    const app = express();
    app.use((_req, _res, next) => trackRequestWrites(next));
    app.use(requestLogger(running.runtime.ctx.logger));
    app.post('/before', () => {
      throw new Error('failed before writing');
    });
    app.post('/rolled-back', () =>
      inTransaction(db, (tx) => {
        tx.insert(loginFailures).values({ key: 'test:rolled-back', at: new Date() }).run();
        throw new Error('failed inside the write');
      }),
    );
    app.post('/after', async () => {
      inTransaction(db, (tx) => {
        inTransaction(tx as never, (inner) =>
          inner.insert(loginFailures).values({ key: 'test:saved', at: new Date() }).run(),
        );
      });
      await new Promise((resolve) => setTimeout(resolve, 5));
      throw new Error('failed after the write');
    });
    app.use(errorHandler);

    for (const path of ['/before', '/rolled-back']) {
      const answer = await request(app).post(path);
      expect(answer.status, path).toBe(500);
      expect(answer.body.error.message, path).toMatch(/Nothing was changed by this request/);
    }
    const after = await request(app).post('/after');
    expect(after.status).toBe(500);
    expect(after.body.error.message).toMatch(
      /^Something went wrong on the server after this request's change was saved: reload the page/,
    );
    expect(after.body.error.message).not.toMatch(/Nothing was changed/);
    takeServerErrors();
  });
});
