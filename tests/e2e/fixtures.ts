import { test as base, expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'emberline-demo';

/** An HTTP error answer a test provokes on purpose: its status and a part of its address. */
interface ExpectedHttpError {
  status: number;
  url: string | RegExp;
}

// The one 4xx every signed-out page sees: the client asks who is signed in and learns nobody is.
const routine: ExpectedHttpError[] = [{ status: 401, url: '/api/v1/auth/me' }];

const matches = (expected: ExpectedHttpError, status: number, url: string) =>
  expected.status === status &&
  (typeof expected.url === 'string' ? url.includes(expected.url) : expected.url.test(url));

/**
 * Console errors, CSP violations and HTTP error answers fail the test, unless the test declared the
 * answer it provokes with `expectHttpError(status, url)` (a refused sign-in, a 404 page, a conflict
 * shown at the field).
 */
export const test = base.extend<{
  consoleProblems: string[];
  expectHttpError: (status: number, url: string | RegExp) => void;
}>({
  expectHttpError: [
    async ({ page }, use) => {
      const expected: ExpectedHttpError[] = [...routine];
      const unexpected: string[] = [];
      page.on('response', (response) => {
        const status = response.status();
        if (status < 400) return;
        const url = response.url();
        if (!expected.some((item) => matches(item, status, url)))
          unexpected.push(`${status} ${response.request().method()} ${url}`);
      });
      await use((status, url) => expected.push({ status, url }));
      expect(unexpected, 'HTTP error answers the test did not expect').toEqual([]);
    },
    { auto: true },
  ],
  consoleProblems: [
    async ({ page }, use) => {
      const problems: string[] = [];
      // A violation the browser reports without a console line (an eval probe caught by the
      // page's own code) is still a report: make each one a console line.
      await page.addInitScript(() =>
        document.addEventListener('securitypolicyviolation', (event) =>
          console.error(
            `Content Security Policy violation: ${event.violatedDirective} ${event.blockedURI} at ${event.sourceFile}:${event.lineNumber}:${event.columnNumber}`,
          ),
        ),
      );
      page.on('console', (message) => {
        const text = message.text();
        if (/Content Security Policy|Refused to/i.test(text)) problems.push(`CSP: ${text}`);
        // Chromium logs every HTTP error answer as a failed resource; those are judged above, by
        // status and address, so that only the ones a test expects pass.
        else if (
          message.type() === 'error' &&
          !/^Failed to load resource: the server responded with a status of [45]\d\d/.test(text)
        )
          problems.push(text);
      });
      page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
      await use(problems);
      expect(problems, 'console errors or CSP violations').toEqual([]);
    },
    { auto: true },
  ],
});

export { expect };

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
}
