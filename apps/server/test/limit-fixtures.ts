import type { Express } from 'express';
import request from 'supertest';
import { expect } from 'vitest';
import { DEMO_PASSWORD } from './test-app';

/**
 * The independent check of a limit draft, signed by the second demo engineer (who neither made
 * nor changed the demo drafts), so that a test can go on to publish it.
 */
export async function checkLimitDraft(
  app: Express,
  signIn: (email: string) => Promise<string>,
  id: string,
): Promise<void> {
  const checker = await signIn('engineer2@demo.test');
  const response = await request(app)
    .post(`/api/v1/limit-sets/${id}/check`)
    .set('Cookie', checker)
    .send({ password: DEMO_PASSWORD });
  expect(response.status).toBe(201);
  expect(response.body.check.signerName).toBeTruthy();
}
