import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { animationsFinished, seriousViolations, sidewaysOverflow } from './pages/accessibility-checks';
import { tokenOf } from './pages/demo-api';

const PHONE = { width: 390, height: 844 };
const DESK = { width: 1440, height: 900 };

interface Screen {
  name: string;
  path: (ids: DemoIds) => string;
  /** Opens a dialog or drawer after the screen has loaded; the check then covers it too. */
  open?: (page: Page) => Promise<void>;
  /** File name for a screenshot at each width, kept with the test results for a person to look at. */
  shot?: string;
}

interface DemoIds {
  partNumber: string;
  loopId: string;
  /** A made part, whose BOM the BOM screen shows. */
  madePart: string;
}

async function demoIds(request: APIRequestContext, token: string): Promise<DemoIds> {
  const headers = { Authorization: `Bearer ${token}` };
  const stock = (await (await request.get('/api/stock', { headers })).json()) as { partNumber: string }[];
  const loops = (await (await request.get('/api/kanban/loops', { headers })).json()) as { id: string | number }[];
  const parts = (await (await request.get('/api/parts', { headers })).json()) as {
    partNumber: string;
    source: string;
  }[];
  return {
    partNumber: stock[0]!.partNumber,
    loopId: String(loops[0]!.id),
    madePart: parts.find((part) => part.source !== 'buy')!.partNumber,
  };
}

/** Signs the browser in by handing it a token, as the sign-in page would leave it. */
async function signInAs(page: Page, token: string): Promise<void> {
  await page.addInitScript((value) => localStorage.setItem('cardloop.token', value), token);
}

/** Waits until the screen has its heading and no loading mask is left. */
async function settle(page: Page): Promise<void> {
  await expect(page.locator('h1').first()).toBeVisible();
  await expect(page.locator('.el-loading-mask:visible')).toHaveCount(0);
  await expect(page.locator('.el-skeleton:visible')).toHaveCount(0);
}

const staffScreens: Screen[] = [
  { name: 'Overview', path: () => '/', shot: 'shell-overview' },
  { name: 'Build sequence', path: () => '/sequence' },
  { name: 'Line end', path: () => '/line-end' },
  { name: 'Kit sheets', path: () => '/line-end/kits' },
  { name: 'Stock', path: () => '/stock', shot: 'stock' },
  { name: 'Part stock', path: (ids) => `/stock/${encodeURIComponent(ids.partNumber)}` },
  { name: 'Line risk', path: () => '/line-risk' },
  { name: 'Horizon', path: () => '/horizon' },
  { name: 'Loops', path: () => '/loops' },
  { name: 'Card labels', path: (ids) => `/loops/${ids.loopId}/print` },
  { name: 'Releases', path: () => '/releases', shot: 'releases' },
  { name: 'Supplier performance', path: () => '/suppliers/performance' },
  { name: 'Scan cards', path: () => '/scan' },
  { name: 'Dock', path: () => '/dock' },
  { name: 'Parts', path: () => '/parts' },
  { name: 'Part', path: (ids) => `/parts/${encodeURIComponent(ids.partNumber)}` },
  { name: 'Suppliers', path: () => '/suppliers' },
  { name: 'Supplier', path: () => '/suppliers/FBS' },
  { name: 'BOM', path: (ids) => `/bom/${encodeURIComponent(ids.madePart)}` },
  { name: 'Audit trail', path: () => '/admin/audit' },
  { name: 'Imports', path: () => '/imports' },
  { name: 'Plant calendar', path: () => '/calendar' },
  {
    name: 'Users with the add dialog',
    path: () => '/admin/users',
    open: async (page) => {
      await page.getByRole('button', { name: /add/i }).first().click();
      await expect(page.getByRole('dialog')).toBeVisible();
    },
  },
  { name: 'Outbox', path: () => '/admin/outbox' },
  {
    name: 'Outbox with a mail open',
    path: () => '/admin/outbox',
    shot: 'outbox-preview',
    open: async (page) => {
      await page.getByRole('tab', { name: 'Captured by the demo mail server' }).click();
      // The forecast queued before the tests goes out with the outbox job's next run.
      const forecast = page.getByRole('button', { name: /Demand forecast/ }).first();
      await expect(async () => {
        await page.getByRole('button', { name: 'Refresh' }).click();
        await expect(forecast).toBeVisible({ timeout: 1000 });
      }).toPass({ timeout: 60_000 });
      await forecast.click();
      // A forecast mail has a plain-text part only; release mails add the formatted one.
      await expect(page.getByRole('article', { name: 'Selected message' })).toContainText('Demand forecast');
      await expect(page.getByRole('list', { name: 'Attachments' })).toContainText('.csv');
    },
  },
  {
    name: 'Account menu with the password dialog',
    path: () => '/',
    open: async (page) => {
      await page.getByRole('button', { name: /account/i }).click();
      await page.getByRole('menuitem', { name: /password/i }).click();
      await expect(page.getByRole('dialog')).toBeVisible();
    },
  },
  { name: 'Page not found', path: () => '/no-such-page' },
];

const supplierScreens: Screen[] = [
  { name: 'Overview', path: () => '/' },
  { name: 'Your business', path: () => '/supplier' },
  { name: 'Scorecard', path: () => '/suppliers/performance' },
  { name: 'Releases', path: () => '/releases' },
];

function checkEveryScreen(role: string, email: string, screens: Screen[]): void {
  test.describe(`as ${role}`, () => {
    let token = '';
    let ids: DemoIds = { partNumber: '', loopId: '', madePart: '' };

    test.beforeAll(async ({ request }) => {
      token = await tokenOf(request, email);
      const adminToken = await tokenOf(request, 'admin@example.com');
      ids = await demoIds(request, adminToken);
      if (screens.some((screen) => screen.name.startsWith('Outbox with'))) {
        const queued = await request.post('/api/demand/forecast-mail', {
          headers: { Authorization: `Bearer ${adminToken}` },
          // Not HSS: the forecast-mail journey looks for its own mail to that supplier.
          data: { supplier: 'FBS' },
        });
        expect(queued.status()).toBe(202);
      }
    });

    for (const screen of screens) {
      test(`${screen.name}: no serious WCAG A/AA problem at a desk or a phone, nothing scrolls sideways`, async ({
        page,
      }) => {
        await signInAs(page, token);
        for (const viewport of [DESK, PHONE]) {
          await page.setViewportSize(viewport);
          await page.goto(screen.path(ids));
          await settle(page);
          if (screen.open) await screen.open(page);
          await animationsFinished(page);

          if (screen.shot && role === 'admin') {
            await page.mouse.move(0, viewport.height - 1);
            await page.screenshot({
              path: `test-results/a11y-${screen.shot}-${viewport.width}.png`,
              fullPage: true,
              animations: 'disabled',
            });
          }
          expect.soft(await seriousViolations(page), `${screen.name} at ${viewport.width} px`).toEqual([]);
          // One pixel of slack for sub-pixel rounding.
          expect.soft(await sidewaysOverflow(page), `${screen.name} at ${viewport.width} px`).toBeLessThanOrEqual(1);
        }
      });
    }
  });
}

test.describe('Accessibility and phone width', () => {
  checkEveryScreen('admin', 'admin@example.com', staffScreens);
  checkEveryScreen('a supplier', 'ferncombe.lena@example.net', supplierScreens);
});

test('the sign-in page has no serious WCAG A/AA problem and fits a phone', async ({ page }) => {
  await page.setViewportSize(PHONE);
  await page.goto('/login');
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeVisible();

  expect(await seriousViolations(page)).toEqual([]);
  expect(await sidewaysOverflow(page)).toBeLessThanOrEqual(1);
});

test('a password-reset link that is not known says so readably, on a phone too', async ({ page }) => {
  await page.setViewportSize(PHONE);
  await page.goto('/reset-password/not-a-real-token');
  await expect(page.locator('h1').first()).toBeVisible();
  await animationsFinished(page);

  expect(await seriousViolations(page)).toEqual([]);
  expect(await sidewaysOverflow(page)).toBeLessThanOrEqual(1);
});

test('at a phone’s width the rail folds into a menu that opens, goes to a screen and closes', async ({
  page,
  request,
}) => {
  await signInAs(page, await tokenOf(request, 'planner@example.com'));
  await page.setViewportSize(PHONE);
  await page.goto('/');
  await settle(page);
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeHidden();

  await page.getByRole('button', { name: 'Menu' }).click();
  const menu = page.getByRole('navigation', { name: 'Menu' });
  await expect(menu.getByRole('link', { name: 'Stock' })).toBeVisible();
  await page.screenshot({ path: 'test-results/a11y-shell-menu-390.png', animations: 'disabled' });
  expect(await seriousViolations(page)).toEqual([]);
  await menu.getByRole('link', { name: 'Stock' }).click();

  await expect(page).toHaveURL(/\/stock$/);
  await expect(menu).toBeHidden();
  await expect(page.getByRole('heading', { level: 1, name: 'Stock' })).toBeVisible();
});
