import { expect, test, type Page, type TestInfo } from '@playwright/test';
import { isWorkingDay } from '../../shared/domain/calendar';
import { localIsoDate } from '../../shared/domain/date';
import { demoShutdowns } from '../../seed/scenario-calendar';
import { LineRiskPage } from './pages/line-risk-page';
import { LoginPage } from './pages/login-page';
import { CardScanPage, LoopsPage, settleForScreenshot } from './pages/loops-page';
import { ReleasesPage } from './pages/releases-page';
import { SequencePage } from './pages/sequence-page';
import { SupplierAccountPage } from './pages/supplier-account-page';
import { DEMO_PASSWORD } from './pages/demo-api';

/*
 * The README's "Tour of the demo", one journey per role: sign in, follow the first-run guide on
 * the Overview step by step, and check that each screen shows what the tour says. Read-only, so
 * the journeys after it meet the demo as seeded; the viewer alone hides its guide, at the end.
 * Each step leaves a screenshot at 1440 and 390 px with the test results.
 */

const DESKTOP = { width: 1440, height: 900 };
const PHONE = { width: 390, height: 844 };

const today = localIsoDate();
const plantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: demoShutdowns(today).map((day) => day.date) };
/** On a weekend or shutdown day nothing is due at the dock "today"; the tour's first day is the next working day. */
const plantWorksToday = isWorkingDay(today, plantCalendar);

async function signIn(page: Page, email: string): Promise<void> {
  await page.setViewportSize(DESKTOP);
  const login = new LoginPage(page);
  await login.open();
  await login.signIn(email, DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);
}

function guide(page: Page) {
  return page.locator('[data-test="first-run-guide"]');
}

/** The guide's steps as the role sees them, in order. */
async function expectGuide(page: Page, titles: string[]): Promise<void> {
  await expect(guide(page).getByRole('heading', { name: 'Start here' })).toBeVisible();
  await expect(guide(page).locator('ol > li .overview-guide__title')).toHaveText(titles);
}

/** Back to the Overview, then the guide's step of that title: the way the tour is followed. */
async function followStep(page: Page, title: string, heading: string | RegExp): Promise<void> {
  await page.goto('/');
  await guide(page)
    .getByRole('link', { name: new RegExp(`^\\d?\\s*${title}`) })
    .click();
  await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible();
}

/** A screenshot of the screen at a desk and on a phone, kept as test artifacts. */
async function shoot(page: Page, testInfo: TestInfo, name: string): Promise<void> {
  await settleForScreenshot(page);
  for (const [width, viewport] of [
    ['1440', DESKTOP],
    ['390', PHONE],
  ] as const) {
    await page.setViewportSize(viewport);
    const path = testInfo.outputPath(`tour-${name}-${width}.png`);
    await page.screenshot({ path, fullPage: true, animations: 'disabled' });
    await testInfo.attach(`${name} at ${width} px`, { path, contentType: 'image/png' });
  }
  await page.setViewportSize(DESKTOP);
}

/** The supplier performance summary row of one supplier. */
function summaryRow(page: Page, supplierCode: string) {
  return page
    .locator('[data-test="performance-summary"] tr.el-table__row')
    .filter({ has: page.locator('strong', { hasText: new RegExp(`^${supplierCode}$`) }) });
}

/** The "early / late" cell of a summary row, as two numbers. */
async function earlyAndLate(page: Page, supplierCode: string): Promise<[number, number]> {
  const text = await summaryRow(page, supplierCode).locator('td').nth(4).innerText();
  const match = /^(\d+) \/ (\d+)$/.exec(text.trim());
  expect(match, `early / late of ${supplierCode}: "${text}"`).not.toBeNull();
  return [Number(match![1]), Number(match![2])];
}

test.describe('Tour of the demo', () => {
  test('planner: line risk, the build sequence, the horizon and the calendar', async ({ page }, testInfo) => {
    await signIn(page, 'planner@example.com');
    await expectGuide(page, ['Line risk', 'Build sequence', 'Horizon', 'Calendar']);
    await expect(page.locator('[data-test="figure-unitsAtRiskFrozen"]')).toBeVisible();
    await shoot(page, testInfo, 'planner-overview');

    await followStep(page, 'Line risk', 'Line risk');
    const lineRisk = new LineRiskPage(page);
    // The guide opens the four weeks its words are about.
    await expect(lineRisk.horizonOption('4 weeks')).toBeChecked();
    await expect(lineRisk.group('expedite').locator('.line-risk-table__part-number')).toHaveText(['BAT-06-312']);
    await expect(lineRisk.group('loop').locator('.line-risk-table__part-number')).toHaveText(['GRP-W']);
    await expect(lineRisk.group('count').locator('.line-risk-table__part-number')).toHaveText(['DRM-R15']);
    await expect(lineRisk.group('release')).toContainText('parts covered by the normal release');
    await shoot(page, testInfo, 'planner-line-risk');

    await followStep(page, 'Build sequence', 'Build sequence');
    const sequence = new SequencePage(page);
    await expect(sequence.atRiskCards().first()).toBeVisible();
    await shoot(page, testInfo, 'planner-sequence');

    await followStep(page, 'Horizon', 'Horizon');
    await expect(page.locator('[data-test="sequence-end"]')).toHaveText(
      /^The build sequence (ends on|runs to) \w{3} \d{1,2} \w{3} \d{4}/,
    );
    await shoot(page, testInfo, 'planner-horizon');

    await followStep(page, 'Calendar', 'Plant calendar');
    const christmasYear = today.slice(5) <= '12-25' ? Number(today.slice(0, 4)) : Number(today.slice(0, 4)) + 1;
    const christmas = page
      .getByRole('list', { name: 'Holidays' })
      .getByRole('listitem')
      .filter({ has: page.locator(`time[datetime="${christmasYear}-12-25"]`) });
    await expect(christmas).toContainText('Plant shutdown: year end');
    await shoot(page, testInfo, 'planner-calendar');
  });

  test('buyer: the supplier answer waiting, the expedite, loops to resize and the scorecard', async ({
    page,
  }, testInfo) => {
    await signIn(page, 'buyer@example.com');
    await expectGuide(page, ['Releases', 'Line risk', 'Loops', 'Supplier performance']);
    await expect(page.locator('[data-test="figure-exceptionsWaiting"]')).toContainText('1');
    await expect(page.locator('[data-test="figure-loopsToResize"]')).toContainText('2');
    await shoot(page, testInfo, 'buyer-overview');

    await followStep(page, 'Releases', 'Releases');
    const releases = new ReleasesPage(page);
    await expect(releases.decisions()).toBeVisible();
    await expect(releases.decisions()).toContainText('Tallowford Fluid Parts');
    await expect(releases.decisions()).toContainText('PMP-S24');
    await expect(releases.rows().filter({ hasText: 'Received' }).first()).toBeVisible();
    await shoot(page, testInfo, 'buyer-releases');
    // On a phone an opened release lists its lines one under another, inside the screen.
    await page.setViewportSize(PHONE);
    const received = releases.rows().filter({ hasText: 'Received' }).first();
    await received.locator('.el-table__expand-icon').click();
    const releaseLine = page.locator('[data-test="release-line"]').last();
    await expect(releaseLine).toContainText('Received');
    await releaseLine.evaluate((element) => element.scrollIntoView({ block: 'center' }));
    const lineBox = (await releaseLine.boundingBox())!;
    expect(lineBox.x + lineBox.width).toBeLessThanOrEqual(PHONE.width);
    await received.locator('.el-table__expand-icon').click();
    // The decision's changed line stacks its facts: what differs stays on screen.
    const difference = releases.decisions().locator('td[data-label="Difference"]').first();
    await difference.scrollIntoViewIfNeeded();
    await expect(difference).toContainText('arrives after the need date');
    const differenceBox = (await difference.boundingBox())!;
    expect(differenceBox.x + differenceBox.width).toBeLessThanOrEqual(PHONE.width);
    // Nothing of it hides sideways in its frame either.
    const frame = releases.decisions().locator('.releases-exceptions__scroll').first();
    expect(await frame.evaluate((element) => element.scrollWidth - element.clientWidth)).toBeLessThanOrEqual(0);
    await page.setViewportSize(DESKTOP);

    await followStep(page, 'Line risk', 'Line risk');
    const lineRisk = new LineRiskPage(page);
    await expect(lineRisk.rescue('BAT-06-312')).toContainText(/Expedite \d[\d,.]* \w+ of BAT-06-312 from \w+/);
    await shoot(page, testInfo, 'buyer-line-risk');

    await followStep(page, 'Loops', 'Loops');
    const loops = new LoopsPage(page);
    await loops.search('GRP-W');
    await expect(loops.proposal('GRP-W')).toHaveText('Add 2');
    await loops.search('SQB-F20');
    await expect(loops.proposal('SQB-F20')).toHaveText('Pull 2');
    await loops.search('');
    await shoot(page, testInfo, 'buyer-loops');

    await followStep(page, 'Supplier performance', 'Supplier performance');
    await expect(summaryRow(page, 'OMW')).toContainText('Oldwick Motor Winding');
    const [, late] = await earlyAndLate(page, 'OMW');
    expect(late).toBeGreaterThan(0);
    const [early] = await earlyAndLate(page, 'SRM');
    expect(early).toBeGreaterThan(0);
    // Greyhithe's short delivery keeps its fill rate under 100 %.
    await expect(summaryRow(page, 'GDC').locator('td').nth(2)).not.toContainText('100');
    await shoot(page, testInfo, 'buyer-supplier-performance');
  });

  test('receiving clerk: deliveries due today and late, receipts in the ledger, the scan box', async ({
    page,
  }, testInfo) => {
    await signIn(page, 'receiving@example.com');
    await expectGuide(page, ['Dock', 'Stock', 'Scan cards']);
    await expect(page.locator('[data-test="figure-late"]')).toBeVisible();
    await shoot(page, testInfo, 'receiving-overview');

    await followStep(page, 'Dock', 'Dock');
    await expect(page.locator('[data-test="overdue"]').first()).toBeVisible();
    await expect(page.locator('[data-test="dock-card"]').filter({ hasText: 'Oldwick' }).first()).toBeVisible();
    if (plantWorksToday) expect(await page.locator('[data-test="due-today"]').count()).toBeGreaterThanOrEqual(2);
    await shoot(page, testInfo, 'receiving-dock');

    await followStep(page, 'Stock', 'Stock');
    await expect(page.locator('[data-test="stock-summary"]')).toBeVisible();
    // A part the late supplier delivers: its ledger holds the receipts of the past weeks.
    await page.goto('/stock/DRM-W03');
    await expect(page.getByRole('heading', { level: 1, name: 'DRM-W03' })).toBeVisible();
    await expect(page.locator('[data-test="movement-kind"]').filter({ hasText: 'Received' }).first()).toBeAttached();
    await shoot(page, testInfo, 'receiving-stock');
    // On a phone each movement's quantity and the balance it left fit the screen.
    await page.setViewportSize(PHONE);
    // Measured where it is drawn: scrolling it into view would also scroll the table sideways.
    const balance = page.locator('[data-test="movement-balance"]').first();
    const box = (await balance.boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(PHONE.width);
    await page.setViewportSize(DESKTOP);

    await followStep(page, 'Scan cards', 'Scan cards');
    await expect(new CardScanPage(page).input()).toBeFocused();
    await shoot(page, testInfo, 'receiving-scan');
  });

  test('line: the day at the line end, the sequence and stock', async ({ page }, testInfo) => {
    await signIn(page, 'line@example.com');
    await expectGuide(page, ['Line end', 'Build sequence', 'Stock']);
    await shoot(page, testInfo, 'line-overview');

    await followStep(page, 'Line end', 'Line end');
    await expect(page.locator('[data-test="built-count"]')).toBeVisible();
    if (plantWorksToday) await expect(page.locator('[data-test="line-unit"]').first()).toContainText(/SN\d+/);
    await shoot(page, testInfo, 'line-line-end');

    await followStep(page, 'Build sequence', 'Build sequence');
    await expect(new SequencePage(page).columns().first()).toBeVisible();
    await shoot(page, testInfo, 'line-sequence');

    await followStep(page, 'Stock', 'Stock');
    await expect(page.locator('[data-test="on-hand"]').first()).toBeVisible();
    await shoot(page, testInfo, 'line-stock');
  });

  test('supplier: its own business, releases and scorecard', async ({ page }, testInfo) => {
    await signIn(page, 'oldwick.marcus@example.com');
    await expectGuide(page, ['Your business', 'Releases', 'Supplier performance']);
    await shoot(page, testInfo, 'supplier-overview');

    await followStep(page, 'Your business', 'Oldwick Motor Winding');
    const account = new SupplierAccountPage(page);
    await expect(account.forecastTable()).toBeVisible();
    await expect(page.locator('[data-test="sequence-end"]')).toContainText('build sequence is planned to');
    await expect(page.locator('[data-test="own-releases"]')).toContainText('-OMW');
    await shoot(page, testInfo, 'supplier-business');

    await followStep(page, 'Releases', 'Your releases');
    const rows = new ReleasesPage(page).rows();
    await expect(rows.first()).toBeVisible();
    for (const text of await rows.allInnerTexts()) expect(text).toContain('-OMW');
    await shoot(page, testInfo, 'supplier-releases');

    await followStep(page, 'Supplier performance', 'Supplier performance');
    await expect(page.locator('[data-test="performance-summary"] tr.el-table__row')).toHaveCount(1);
    const [, late] = await earlyAndLate(page, 'OMW');
    expect(late).toBeGreaterThan(0);
    await shoot(page, testInfo, 'supplier-performance');
  });

  test('admin: users, the outbox of sent releases, the calendar and the release job', async ({ page }, testInfo) => {
    await signIn(page, 'admin@example.com');
    await expectGuide(page, ['Users', 'Outbox', 'Calendar', 'Releases']);
    await shoot(page, testInfo, 'admin-overview');

    await followStep(page, 'Users', 'Users');
    await expect(page.getByText('oldwick.marcus@example.com').first()).toBeVisible();
    await expect(page.getByText('planner@example.com').first()).toBeVisible();
    await shoot(page, testInfo, 'admin-users');

    await followStep(page, 'Outbox', 'Outbox');
    const sentReleases = page
      .getByRole('row')
      .filter({ hasText: /Release R\d{6}-[A-Z]+ from / })
      .filter({ hasText: 'Sent' });
    await expect(sentReleases.first()).toBeVisible();
    expect(await sentReleases.count()).toBeGreaterThanOrEqual(10);
    await shoot(page, testInfo, 'admin-outbox');

    await followStep(page, 'Calendar', 'Plant calendar');
    await expect(page.getByRole('button', { name: 'Save calendar' })).toBeVisible();
    await expect(page.getByRole('list', { name: 'Holidays' }).locator('time').first()).toBeVisible();
    await shoot(page, testInfo, 'admin-calendar');

    await followStep(page, 'Releases', 'Releases');
    await expect(new ReleasesPage(page).runButton()).toBeVisible();
    await shoot(page, testInfo, 'admin-releases');
  });

  test('viewer: reads line risk, the dock and the scorecard, then hides the guide for good', async ({
    page,
  }, testInfo) => {
    await signIn(page, 'viewer@example.com');
    await expectGuide(page, ['Line risk', 'Dock', 'Supplier performance']);
    await shoot(page, testInfo, 'viewer-overview');

    await followStep(page, 'Line risk', 'Line risk');
    await expect(new LineRiskPage(page).group('expedite')).toContainText('BAT-06-312');
    await shoot(page, testInfo, 'viewer-line-risk');

    await followStep(page, 'Dock', 'Dock');
    await expect(page.locator('[data-test="overdue"]').first()).toBeVisible();
    await shoot(page, testInfo, 'viewer-dock');

    await followStep(page, 'Supplier performance', 'Supplier performance');
    // Six suppliers delivered in the demo's past weeks; the table waits for its rows before counting.
    await expect(page.locator('[data-test="performance-summary"] tr.el-table__row').nth(3)).toBeVisible();
    await shoot(page, testInfo, 'viewer-supplier-performance');
    // On a phone each supplier is a card: its fill rate and promise kept stay on screen.
    await page.setViewportSize(PHONE);
    const promiseKept = page
      .locator('[data-test="performance-card"]')
      .first()
      .locator('[data-test="rate-band"]')
      .nth(2);
    await expect(promiseKept).toBeVisible();
    const bandBox = (await promiseKept.boundingBox())!;
    expect(bandBox.x + bandBox.width).toBeLessThanOrEqual(PHONE.width);
    await page.setViewportSize(DESKTOP);

    await page.goto('/');
    await guide(page).getByRole('button', { name: 'Hide this guide' }).click();
    await expect(guide(page)).toHaveCount(0);
    await expect(page.getByRole('heading', { name: 'Needs doing now' })).toBeFocused();
    await page.reload();
    await expect(page.getByRole('heading', { name: 'Needs doing now' })).toBeVisible();
    await expect(guide(page)).toHaveCount(0);
  });
});
