import { test as base, expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'emberline-demo';

/** Console errors a test did not expect, and every CSP violation, fail the test. */
export const test = base.extend<{ consoleProblems: string[] }>({
  consoleProblems: [
    async ({ page }, use) => {
      const problems: string[] = [];
      page.on('console', (message) => {
        const text = message.text();
        if (/Content Security Policy|Refused to/i.test(text)) problems.push(`CSP: ${text}`);
        // A 4xx the app answers in the page (sign-in needed, not found, a conflict shown at the
        // field) is logged by Chromium as a failed resource; it is not a fault of the page.
        else if (
          message.type() === 'error' &&
          !/Failed to load resource: the server responded with a status of 4\d\d/.test(text)
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
