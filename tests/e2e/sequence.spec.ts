import { expect, test } from '@playwright/test';
import { LoginPage } from './pages/login-page';
import { settleForScreenshot } from './pages/loops-page';
import { SequencePage } from './pages/sequence-page';
import { DEMO_PASSWORD } from './pages/demo-api';

test.describe('Build sequence', () => {
  test('a planner drags a unit to another day, and moves one down from the keyboard', async ({ page }) => {
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('planner@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const sequence = new SequencePage(page);

    await sequence.open();
    await expect(sequence.heading()).toBeVisible();
    // Two days outside the frozen window: one with room to take a unit, and another to give it.
    const openColumns = sequence.openColumns();
    const openCount = await openColumns.count();
    let targetIndex = -1;
    for (let index = 0; index < openCount && targetIndex < 0; index += 1) {
      const column = openColumns.nth(index);
      if ((await sequence.load(column)) < (await sequence.capacity(column))) targetIndex = index;
    }
    expect(targetIndex).toBeGreaterThanOrEqual(0);
    const target = openColumns.nth(targetIndex);
    const source = openColumns.nth(targetIndex === 0 ? 1 : 0);
    const targetDate = await target.getAttribute('data-date');
    const sourceDate = await source.getAttribute('data-date');
    const sourceLoad = await sequence.load(source);
    const targetLoad = await sequence.load(target);
    const moving = sequence.cards(source).nth(1);
    const serial = (await moving.getAttribute('data-serial'))!;

    await sequence.dragCard(moving, sequence.cards(target).nth(1));
    await sequence.saveWhatIf();

    await expect.poll(() => sequence.load(source)).toBe(sourceLoad - 1);
    await expect.poll(() => sequence.load(target)).toBe(targetLoad + 1);
    await expect(target.locator(`[data-serial="${serial}"]`)).toBeVisible();
    await expect(sequence.status()).toContainText(`${serial} moved to`);

    await page.reload();
    const targetAfterReload = sequence.columns().and(page.locator(`[data-date="${targetDate}"]`));
    const sourceAfterReload = sequence.columns().and(page.locator(`[data-date="${sourceDate}"]`));
    await expect(targetAfterReload.locator(`[data-serial="${serial}"]`)).toBeVisible();
    expect(await sequence.load(sourceAfterReload)).toBe(sourceLoad - 1);
    expect(await sequence.load(targetAfterReload)).toBe(targetLoad + 1);

    // The keyboard way: the first unit of the day moves down one place and keeps the focus.
    const first = (await sequence.serials(targetAfterReload))[0]!;
    await sequence.chooseWithKeyboard(first, 'Move down');
    await sequence.saveWhatIf();

    await expect.poll(async () => (await sequence.serials(targetAfterReload)).slice(0, 2)[1]).toBe(first);
    await expect(page.getByRole('button', { name: `Actions for ${first}` })).toBeFocused();
    await expect(sequence.status()).toContainText(`${first} moved to`);
    await expect(sequence.card(first).locator('.sequence-unit-card__position')).toHaveText('Position 2');
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/sequence.png' });

    await page.reload();
    await expect.poll(async () => (await sequence.serials(targetAfterReload))[1]).toBe(first);
  });
});
