import { expect, test, type Page } from '@playwright/test';
import { ImportsPage } from './pages/imports-page';
import { LoginPage } from './pages/login-page';
import { localIsoDate } from '../../shared/domain/date';
import { demoShutdowns } from '../../seed/scenario-calendar';
import { DEMO_PASSWORD } from './pages/demo-api';

// Part numbers of the demo scenario (seed/scenario-parts.ts); the on-hand layout is PRODUCT.md's
// `part_number,on_hand`.
// The counts leave both parts well above their demand, so later journeys still see the demo's planted shortages.
const COUNTS_WITH_A_BAD_ROW = 'part_number,on_hand\nBAT-12-105,600\nNO-SUCH-PART,3\n';
const COUNTS_CORRECTED = 'part_number,on_hand\nBAT-12-105,600\nFK-FIN,5000\n';

async function signIn(page: Page, email: string): Promise<void> {
  const login = new LoginPage(page);
  await login.open();
  await login.signIn(email, DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);
}

/** A worked weekday about six weeks ahead, as YYYY-MM-DD: not a weekend, nor one of the demo's shutdown days. */
/** A working day of the demo calendar at least `calendarDays` from today; from 70 on, past the demo sequence's last unit. */
function workingDayAhead(calendarDays = 70): string {
  const shutdowns = new Set(demoShutdowns(localIsoDate()).map((shutdown) => shutdown.date));
  const date = new Date();
  date.setDate(date.getDate() + calendarDays);
  while (date.getDay() === 0 || date.getDay() === 6 || shutdowns.has(localIsoDate(date))) {
    date.setDate(date.getDate() + 1);
  }
  return localIsoDate(date);
}

test.describe('imports', () => {
  test('a buyer imports stock counts: a bad row stops the file, the corrected file goes in', async ({ page }) => {
    await signIn(page, 'buyer@example.com');
    const imports = new ImportsPage(page);
    await imports.openFromRail();
    await expect(imports.kind('Build sequence')).toHaveCount(0);

    await imports.chooseKind('On-hand counts');
    await imports.chooseCsv('counts.csv', COUNTS_WITH_A_BAD_ROW);
    await expect(imports.importButton()).toHaveText('Import 2 rows');
    await imports.importButton().click();

    await expect(imports.problemReport()).toBeVisible();
    await expect(imports.problemReport()).toContainText('1 problem; nothing was imported');
    expect(await imports.problemRows()).toEqual([['3', 'part_number', "unknown part 'NO-SUCH-PART'"]]);
    await expect(imports.previewRowsWithProblems()).toHaveCount(1);
    await expect(imports.previewRowsWithProblems()).toContainText('NO-SUCH-PART');
    await page.mouse.move(0, 0);
    await page.screenshot({ path: 'test-results/imports.png', fullPage: true, animations: 'disabled' });
    // On a phone the problem's words, with the column they name, fit the screen.
    const desk = page.viewportSize()!;
    await page.setViewportSize({ width: 390, height: 844 });
    const problem = imports.problemReport().locator('td').filter({ hasText: "unknown part 'NO-SUCH-PART'" });
    await expect(problem).toContainText('part_number');
    const box = (await problem.boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(390);
    await problem.scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'test-results/imports-problems-390.png', animations: 'disabled' });
    await page.setViewportSize(desk);

    await imports.chooseCsv('counts-corrected.csv', COUNTS_CORRECTED);
    await expect(imports.problemReport()).toHaveCount(0);
    await imports.importButton().click();

    await expect(imports.result()).toContainText('Imported 2 rows');
    await expect(imports.result()).toContainText('2 on-hand counts set');
    await page.screenshot({ path: 'test-results/imports-done.png', fullPage: true, animations: 'disabled' });
  });

  test('a planner adds a holiday to the plant calendar and saves it', async ({ page }) => {
    const holiday = workingDayAhead();
    await signIn(page, 'planner@example.com');
    await page.getByRole('navigation').getByRole('link', { name: 'Calendar' }).click();
    await expect(page.getByRole('heading', { name: 'Working weekdays' })).toBeVisible();

    await page.getByPlaceholder('Pick a date').fill(holiday);
    await page.getByPlaceholder('Pick a date').press('Enter');
    await page.getByRole('textbox', { name: 'Holiday name' }).fill('Stocktake');
    await page.getByRole('button', { name: 'Add holiday' }).click();
    await expect(page.getByRole('status')).toHaveText('Unsaved changes');
    await page.getByRole('button', { name: 'Save calendar' }).click();

    await expect(page.getByText('Calendar saved.')).toBeVisible();
    await expect(page.getByRole('list', { name: 'Holidays' }).locator(`time[datetime="${holiday}"]`)).toBeVisible();
    await expect(page.getByRole('button', { name: 'Save calendar' })).toBeDisabled();
    await page.reload();
    const saved = page.getByRole('listitem').filter({ has: page.locator(`time[datetime="${holiday}"]`) });
    await expect(saved).toContainText('Stocktake');
    await page.screenshot({ path: 'test-results/calendar.png', fullPage: true, animations: 'disabled' });

    // The same day typed again is refused by name, not emptied.
    await page.getByPlaceholder('Pick a date').fill(holiday);
    await page.getByPlaceholder('Pick a date').press('Enter');
    await page.getByRole('button', { name: 'Add holiday' }).click();
    await expect(
      page.getByText(/^(Mon|Tue|Wed|Thu|Fri) \d{1,2} [A-Z][a-z]{2} \d{4} is already a holiday\.$/),
    ).toBeVisible();
    await expect(page.getByRole('button', { name: 'Save calendar' })).toBeDisabled();

    // A day the demo sequence still builds on: the list warns, and saving asks first.
    await page.getByPlaceholder('Pick a date').fill(workingDayAhead(7));
    await page.getByPlaceholder('Pick a date').press('Enter');
    await page.getByRole('button', { name: 'Add holiday' }).click();
    await expect(page.locator('[data-test="units-planned"]')).toHaveText(
      /^\s*\d+ units? planned that day: move (it|them) on the Build sequence board\s*$/,
    );
    await page.getByRole('button', { name: 'Save calendar' }).click();
    await expect(page.getByRole('dialog', { name: 'Close days that hold units?' })).toBeVisible();
    await page.getByRole('button', { name: 'Go back' }).click();
    await expect(page.getByRole('status')).toHaveText('Unsaved changes');
    await page.getByRole('button', { name: 'Discard changes' }).click();
  });

  test('an admin reads the outbox and the demo mail server’s catch', async ({ page }) => {
    await signIn(page, 'admin@example.com');
    await page.getByRole('navigation').getByRole('link', { name: 'Outbox' }).click();
    await expect(page.getByRole('heading', { name: 'Outbox', level: 1 })).toBeVisible();
    // Delivery holds the attempts, since when a notice fails, its last error and the next try.
    await expect(page.getByRole('columnheader', { name: 'Delivery' })).toBeVisible();

    await page.getByRole('tab', { name: 'Captured by the demo mail server' }).click();
    await expect(page.getByRole('tab', { name: 'Captured by the demo mail server' })).toHaveAttribute(
      'aria-selected',
      'true',
    );

    // The e2e server runs the embedded fake SMTP server, so the tab lists what it caught (or says it caught nothing).
    await expect(page.getByText('In the demo, mail goes to a local server')).toBeVisible();
    await expect(page.getByText('SMTP_URL points to a real mail server')).toHaveCount(0);
    await page.screenshot({ path: 'test-results/outbox.png', fullPage: true, animations: 'disabled' });
  });
});
