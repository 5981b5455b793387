import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import type { Kit } from '../../shared/schemas/builds';
import type { StockItem } from '../../shared/schemas/stock';
import { KitSheetsPage, LineEndPage, StockPartPage } from './pages/line-end-page';
import { LoginPage } from './pages/login-page';
import { settleForScreenshot } from './pages/loops-page';
import { DEMO_PASSWORD, tokenOf } from './pages/demo-api';

async function getJson<T>(request: APIRequestContext, token: string, path: string): Promise<T> {
  const response = await request.get(path, { headers: { Authorization: `Bearer ${token}` } });
  expect(response.status()).toBe(200);
  return (await response.json()) as T;
}

async function onHandOf(request: APIRequestContext, token: string, partNumber: string): Promise<number> {
  const stock = await getJson<StockItem[]>(request, token, '/api/stock');
  return stock.find((item) => item.partNumber === partNumber)!.onHand;
}

/** A screenshot at a desk screen's width and one at a phone's, for a person to look at. */
async function screenshots(page: Page, name: string, fullPage = true): Promise<void> {
  await settleForScreenshot(page);
  await page.screenshot({ path: `test-results/${name}-1440.png`, fullPage, animations: 'disabled' });
  const size = page.viewportSize()!;
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: `test-results/${name}-390.png`, fullPage, animations: 'disabled' });
  await page.setViewportSize(size);
}

test.use({ viewport: { width: 1440, height: 900 } });

test.describe('Line end', () => {
  test('the planner reports two units built, sees a part’s stock fall, undoes the last and prints the day’s kits', async ({
    page,
    request,
  }) => {
    // window.print would open the browser's dialog; count the calls instead.
    await page.addInitScript(() => {
      const target = window as unknown as { printCalls: number };
      target.printCalls = 0;
      window.print = () => {
        target.printCalls += 1;
      };
    });
    const planner = await tokenOf(request, 'planner@example.com');
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('planner@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const lineEnd = new LineEndPage(page);

    await lineEnd.open();
    const unitCount = await lineEnd.units().count();
    const [first, second, third] = await lineEnd.plannedSerials();
    expect(first && second && third).toBeTruthy();
    const builtBefore = Number(/^(\d+) of/.exec(await lineEnd.builtCount().innerText())![1]);
    const kit = await getJson<Kit>(request, planner, `/api/builds/${first}/kit`);
    const bought = kit.pointsOfUse.flatMap((group) => group.lines).find((line) => line.source === 'buy')!;
    const onHandBefore = await onHandOf(request, planner, bought.partNumber);

    await lineEnd.report(first!);
    await expect(lineEnd.feedback()).toContainText(`${first} reported built`);
    await expect(lineEnd.unit(first!)).toContainText('Built');
    await lineEnd.report(second!);
    await expect(lineEnd.feedback()).toContainText(`${second} reported built`);
    await expect(lineEnd.unit(second!)).toContainText('Built');
    await expect(lineEnd.builtCount()).toHaveText(`${builtBefore + 2} of ${unitCount} built`);
    // A second scan of a built unit is said plainly and consumes nothing again.
    await lineEnd.report(first!);
    await expect(lineEnd.feedback()).toContainText(`${first} is already built`);
    await expect(lineEnd.feedback()).toHaveClass(/is-info/);
    await expect(lineEnd.builtCount()).toHaveText(`${builtBefore + 2} of ${unitCount} built`);
    await screenshots(page, 'line-end');
    // The line's own tablet, held landscape.
    await page.setViewportSize({ width: 1024, height: 768 });
    await page.screenshot({ path: 'test-results/line-end-tablet.png', animations: 'disabled' });
    await page.setViewportSize({ width: 1440, height: 900 });

    const kitDialog = await lineEnd.openKit(first!);
    await expect(kitDialog.getByRole('img', { name: `QR code of serial ${first}` })).toBeVisible();
    await screenshots(page, 'line-end-kit', false);
    await kitDialog.getByRole('link', { name: bought.partNumber, exact: true }).click();

    const stockPage = new StockPartPage(page);
    await expect(page.getByRole('heading', { name: bought.partNumber, level: 1 })).toBeVisible();
    const onHandAfter = await onHandOf(request, planner, bought.partNumber);
    expect(onHandAfter).toBeLessThan(onHandBefore);
    await expect.poll(() => stockPage.onHand()).toBe(onHandAfter);
    await expect(
      stockPage
        .movements()
        .filter({ hasText: `Unit ${first}` })
        .first(),
    ).toContainText('Used in a build');
    await screenshots(page, 'stock-part');

    // Scrap at the line: the form checks its fields first, then the part leaves stock with its reason.
    await page.getByRole('button', { name: 'Record scrap' }).click();
    const scrap = page.getByRole('dialog', { name: `Record scrap of ${bought.partNumber}` });
    await scrap.getByRole('button', { name: 'Record scrap' }).click();
    await expect(scrap.getByText('Type how many were scrapped')).toBeVisible();
    await expect(scrap.getByText('Say what happened')).toBeVisible();
    await scrap.getByLabel(/^Scrapped/).fill('1');
    await scrap.getByLabel('What happened').fill('Dropped at the station');
    await screenshots(page, 'stock-scrap', false);
    await scrap.getByRole('button', { name: 'Record scrap' }).click();
    await expect(scrap).toBeHidden();
    await expect.poll(() => stockPage.onHand()).toBe(onHandAfter - 1);
    await expect(stockPage.movements().first()).toContainText('Scrapped');
    await expect(stockPage.movements().first()).toContainText('Dropped at the station');

    // On the build sequence the built unit shows as done and offers no grip to drag it away.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Build sequence' }).click();
    const builtCard = page.locator(`[data-test="unit-card"][data-serial="${first}"]`);
    await expect(builtCard).toContainText('Built');
    await expect(builtCard.locator('[data-test="drag-handle"]')).toHaveCount(0);
    const plannedCard = page.locator(`[data-test="unit-card"][data-serial="${third}"]`);
    await expect(plannedCard.locator('[data-test="drag-handle"]')).toHaveCount(1);
    await screenshots(page, 'sequence-built', false);

    await lineEnd.open();
    await lineEnd.undoLast('Scanned the wrong unit');
    await expect(lineEnd.feedback()).toContainText(`${second} undone`);
    await expect(lineEnd.unit(second!)).toContainText('Planned');
    await expect(lineEnd.builtCount()).toHaveText(`${builtBefore + 1} of ${unitCount} built`);

    await lineEnd.printDayKits();
    const kits = new KitSheetsPage(page);
    await expect(kits.sheets()).toHaveCount(unitCount);
    await expect(
      kits
        .sheets()
        .first()
        .getByRole('img', { name: /^QR code of serial / }),
    ).toBeVisible();
    await kits.printButton().click();
    expect(await page.evaluate(() => (window as unknown as { printCalls: number }).printCalls)).toBe(1);
    await screenshots(page, 'kit-sheets', false);
    // What the printer gets: one A4 sheet per unit, without the app's frame.
    await page.pdf({ path: 'test-results/kit-sheets.pdf', preferCSSPageSize: true, printBackground: true });

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Stock' }).click();
    await expect(page.getByRole('heading', { name: 'Stock', level: 1 })).toBeVisible();
    await expect(page.locator('[data-test="stock-summary"]')).toBeVisible();
    await screenshots(page, 'stock');
  });

  test('a line operator added by the admin reports a unit, issues the next kit and may undo only its own build', async ({
    page,
    request,
  }) => {
    const admin = await tokenOf(request, 'admin@example.com');
    const operator = { email: 'line.operator@example.com', name: 'Lina Operator', password: 'line-operator-2026' };
    const created = await request.post('/api/users', {
      headers: { Authorization: `Bearer ${admin}` },
      data: { ...operator, role: 'line' },
    });
    expect(created.status()).toBe(201);
    const planner = await tokenOf(request, 'planner@example.com');
    const login = new LoginPage(page);
    await login.open();
    await login.signIn(operator.email, operator.password);
    await expect(page).toHaveURL(/\/$/);

    await expect(page.getByText('You report each unit built as it leaves the line')).toBeVisible();
    await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link')).toHaveText([
      'Overview',
      'Build sequence',
      'Line end',
      'Stock',
      'Line risk',
      'Horizon',
      'Loops',
      'Releases',
      'Supplier performance',
      'Dock',
      'Parts',
      'Suppliers',
      'Calendar',
    ]);
    await screenshots(page, 'home-line');
    const lineEnd = new LineEndPage(page);
    await lineEnd.open();
    const [plannerUnit, lineUnit, kitUnit] = await lineEnd.plannedSerials();
    // The planner reports the day's next unit first, so the line's "Undo last" later reaches a build not its own.
    const plannerBuild = await request.post('/api/builds', {
      headers: { Authorization: `Bearer ${planner}`, 'Idempotency-Key': `e2e-${plannerUnit}` },
      data: { serial: plannerUnit },
    });
    expect(plannerBuild.status()).toBe(201);
    await expect(lineEnd.unit(plannerUnit!)).toContainText('Built');

    await lineEnd.report(lineUnit!);
    await expect(lineEnd.feedback()).toContainText(`${lineUnit} reported built`);
    const kit = await lineEnd.openKit(kitUnit!);
    await kit.getByRole('button', { name: 'Issue kit' }).click();
    await expect(kit.locator('[data-test="kit-sheet"] [data-test="unit-status"]')).toHaveText('Started');
    await kit.getByRole('button', { name: 'Close', exact: true }).click();
    await expect(lineEnd.unit(kitUnit!)).toContainText('Started');

    await lineEnd.undoLast('Scanned the wrong unit');
    await expect(lineEnd.feedback()).toContainText(`${lineUnit} undone`);
    await page.getByRole('button', { name: `Undo last (${plannerUnit})` }).click();
    const undo = page.getByRole('dialog', { name: `Undo ${plannerUnit}?` });
    await undo.getByRole('button', { name: 'Undo build' }).click();
    await expect(undo.locator('[data-test="undo-refusal"]')).toContainText('30 minutes');
    await screenshots(page, 'line-end-undo-refused', false);
    await undo.getByRole('button', { name: 'Keep it built' }).click();
    await expect(lineEnd.unit(plannerUnit!)).toContainText('Built');
    await expect(page.getByRole('button', { name: 'Close the day' })).toHaveCount(0);
  });

  test('a buyer counts a part due a count: the difference is posted and the flag goes', async ({ page, request }) => {
    const buyer = await tokenOf(request, 'buyer@example.com');
    const stock = await getJson<StockItem[]>(request, buyer, '/api/stock');
    const due = stock.find((item) => item.countDue && !item.negative && item.onHand > 2)!;
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('buyer@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const stockPage = new StockPartPage(page);

    await stockPage.open(due.partNumber);
    await expect(page.locator('[data-test="stock-flag"]')).toHaveText(['Count due']);
    await page.getByRole('button', { name: 'Record a count' }).click();
    const count = page.getByRole('dialog', { name: `Record a count of ${due.partNumber}` });
    // A typo is refused beside the box and stays in it as typed, never turned into 0.
    await count.getByLabel(/^Counted/).fill('-3');
    await count.getByLabel(/^Reason/).focus();
    await expect(count.getByText('Must be 0 or more')).toBeVisible();
    await expect(count.getByLabel(/^Counted/)).toHaveValue('-3');
    await expect(count.locator('[data-test="count-difference"]')).toHaveCount(0);
    await count.getByLabel(/^Counted/).fill(String(due.onHand - 2));
    await count.getByLabel(/^Reason/).fill('Cycle count');
    await expect(count.locator('[data-test="count-difference"]')).toContainText('Adjustment: −2');
    await screenshots(page, 'stock-count', false);
    await count.getByRole('button', { name: 'Record count' }).click();

    await expect(count).toBeHidden();
    await expect.poll(() => stockPage.onHand()).toBe(due.onHand - 2);
    await expect(stockPage.movements().first()).toContainText('Count adjustment');
    await expect(stockPage.movements().first()).toContainText('Cycle count');
    await expect(page.locator('[data-test="stock-flag"]')).toHaveCount(0);
  });
});
