import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';

/** The WCAG 2.0/2.1/2.2 level A and AA rules of axe-core (axe's own tag names). */
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

/**
 * Waits until nothing on the page is still fading or sliding in: contrast read halfway through a
 * dialog's opening animation blends its text with the page behind it.
 */
export async function animationsFinished(page: Page): Promise<void> {
  // Endless ones (a spinner) never finish and change no contrast worth waiting for.
  await page.waitForFunction(() =>
    document
      .getAnimations()
      .every(
        (animation) => animation.playState !== 'running' || animation.effect?.getComputedTiming().endTime === Infinity,
      ),
  );
}

/** Serious and critical WCAG A/AA violations, one line each (rule, then the first offending targets). */
export async function seriousViolations(page: Page): Promise<string[]> {
  const results = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze();
  return results.violations
    .filter((violation) => violation.impact === 'serious' || violation.impact === 'critical')
    .map(
      (violation) =>
        `${violation.id} (${violation.impact}): ${violation.nodes
          .slice(0, 3)
          .map((node) => node.target.join(' '))
          .join(' | ')}`,
    );
}

/** How far the page reaches past the viewport's right edge, in CSS pixels. */
export async function sidewaysOverflow(page: Page): Promise<number> {
  return page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
}
