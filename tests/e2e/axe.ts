import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';

// Accessibility reference check: axe-core's WCAG 2.0/2.1 A and AA rules (QUALITY §1), no serious or
// critical violation on the screens each role works in.
export async function seriousViolations(page: Page) {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
    .analyze();
  return results.violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .map(
      (violation) =>
        `${violation.id}: ${violation.nodes
          .map((node) => node.target.join(' '))
          .slice(0, 3)
          .join(', ')}`,
    );
}
