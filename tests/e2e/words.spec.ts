import type { Page } from '@playwright/test';
import { expect, signIn, test } from './fixtures';

// Internal keys a person must never read: row keys ("hpt1-blade") and rule ids
// ("hpt1-blade.crack.edges"). Places that show an id on purpose, small beside its words, carry
// `data-shows-ids` and are left out.
const rowKey = /\b[a-z]+\d+-[a-z]+\b/;
const ruleId = /\b[a-z]+\d*-[a-z]+(?:\.[a-z-]+)+\b/;

/** A screen's address with its ids blanked, so that one or two of each kind are walked. */
const screenKind = (path: string) =>
  path
    .split('/')
    .map((part) => (/\d/.test(part) || part.length > 20 ? ':id' : part))
    .join('/');

/** The words on the screen, without the places that show ids on purpose. */
async function readableText(page: Page): Promise<string> {
  return page.evaluate(() => {
    const main = document.body.cloneNode(true) as HTMLElement;
    main.querySelectorAll('[data-shows-ids], script, style').forEach((node) => node.remove());
    const hidden = document.createElement('div');
    hidden.style.position = 'absolute';
    hidden.style.left = '-10000px';
    hidden.append(main);
    document.body.append(hidden);
    const text = main.innerText;
    hidden.remove();
    return text;
  });
}

/** Every screen a role reaches by following the product's own links, up to two of each kind. */
async function walk(page: Page, limit = 30): Promise<Map<string, string>> {
  const seen = new Map<string, string>();
  const kinds = new Map<string, number>();
  const queue = ['/fleet'];
  while (queue.length > 0 && seen.size < limit) {
    const path = queue.shift()!;
    if (seen.has(path)) continue;
    const kind = screenKind(path);
    if ((kinds.get(kind) ?? 0) >= 2) continue;
    kinds.set(kind, (kinds.get(kind) ?? 0) + 1);
    await page.goto(path);
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await page.waitForLoadState('networkidle');
    seen.set(path, await readableText(page));
    const links = await page
      .locator('a[href^="/"]')
      .evaluateAll((anchors) => anchors.map((anchor) => anchor.getAttribute('href') ?? ''));
    for (const href of links) {
      const next = href.split(/[?#]/)[0]!;
      if (next.startsWith('/api/') || next.startsWith('/verify/') || seen.has(next)) continue;
      queue.push(next);
    }
  }
  return seen;
}

for (const email of [
  'inspector@demo.test',
  'engineer@demo.test',
  'planner@demo.test',
  'customer@demo.test',
  'admin@demo.test',
]) {
  test(`${email} reads no row key or rule id on any screen`, async ({ page }) => {
    test.setTimeout(120_000);
    await signIn(page, email);
    const screens = await walk(page);
    expect(screens.size, 'screens walked').toBeGreaterThan(3);
    const found: string[] = [];
    for (const [path, text] of screens) {
      for (const pattern of [rowKey, ruleId]) {
        const match = pattern.exec(text);
        if (match)
          found.push(`${path}: “${text.slice(Math.max(0, match.index - 40), match.index + 40)}”`);
      }
    }
    expect(found, 'internal keys shown to a person').toEqual([]);
  });
}
