import { expect, test } from '@playwright/test';
import { settleForScreenshot } from './pages/loops-page';
import { LoginPage } from './pages/login-page';
import { AuditPage, BomPage, PartPage, PartsPage } from './pages/master-data-page';
import { DEMO_PASSWORD } from './pages/demo-api';

test.describe('Master data', () => {
  test('on a phone, a new part added with fields missing puts the cursor in the first of them', async ({ page }) => {
    await page.setViewportSize({ width: 390, height: 844 });
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('buyer@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    await page.goto('/parts');
    await page.getByRole('button', { name: 'New part' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByRole('button', { name: 'Add part' }).click();

    // The message sits at the top of a dialog taller than the screen, far above the button.
    const partNumber = dialog.getByLabel('Part number');
    await expect(partNumber).toBeFocused();
    await expect(dialog.getByText('Give the part number')).toBeInViewport();
    await page.screenshot({ path: 'test-results/master-data-new-part-missing-390.png' });
  });

  test('a buyer changes a part’s lead time and makes an engineering change on a model’s BOM', async ({ page }) => {
    await page.setViewportSize({ width: 1440, height: 900 });
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('buyer@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);

    const parts = new PartsPage(page);
    await parts.openFromRail();
    await parts.openPart('BLT-M8-25');
    const part = new PartPage(page);
    await part.editLeadTime(9);

    await expect(page.getByText('Part BLT-M8-25 saved.')).toBeVisible();
    await expect(part.fact('Lead time (working days)')).toHaveText('9 working days');
    await page.reload();
    await expect(part.fact('Lead time (working days)')).toHaveText('9 working days');
    await expect(page.locator('[data-test="end-items"]')).toContainText('FS-20W');
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/master-data-part-1440.png', fullPage: true });

    await page.getByRole('link', { name: 'FS-20W', exact: true }).first().click();
    await expect(page.getByRole('heading', { name: 'FS-20W', level: 1 })).toBeVisible();
    await part.openBom();
    await expect(page.getByRole('heading', { name: 'BOM of FS-20W' })).toBeVisible();
    const bom = new BomPage(page);
    await expect(bom.componentLink('FRM-20W')).toBeVisible();
    await expect(bom.componentLink('STL-SHT-30').first()).toBeVisible();

    // The dialog opens on the line as it is: the same part and its quantity per.
    await page.getByRole('button', { name: 'Engineering change of BLT-M8-25' }).first().click();
    const change = page.getByRole('dialog', { name: /^Engineering change on / });
    await expect(change.locator('.el-select')).toContainText('BLT-M8-25');
    await expect(change.getByLabel('Qty per')).toHaveValue('12');
    await change.getByRole('button', { name: 'Cancel' }).click();
    await expect(change).toBeHidden();

    await bom.changeFromDate('BLT-M8-25', 'BLT-M10-30', '2028-06-01', 12);

    await expect(page.getByText('Engineering change on FS-20W made.')).toBeVisible();
    await bom.showDate('2028-05-31');
    await expect(bom.componentLink('BLT-M8-25')).toBeVisible();
    await bom.showDate('2028-06-01');
    await expect(bom.componentLink('BLT-M8-25')).toHaveCount(0);
    await expect(bom.componentLink('BLT-M10-30').first()).toBeVisible();
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/master-data-bom-1440.png', fullPage: true });

    await page.setViewportSize({ width: 390, height: 844 });
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/master-data-bom-390.png', fullPage: true });
    await page.goto('/parts/BLT-M8-25');
    await expect(part.fact('Lead time (working days)')).toHaveText('9 working days');
    await page.screenshot({ path: 'test-results/master-data-part-390.png', fullPage: true });

    // The planner reads who changed the lead time, from what to what.
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.getByRole('button', { name: 'Sign out' }).click();
    await login.signIn('planner@example.com', DEMO_PASSWORD);
    const audit = new AuditPage(page);
    await audit.openFromRail();
    await audit.filterSubject('BLT-M8-25');
    await expect(audit.rows().filter({ hasText: 'buyer@example.com' }).filter({ hasText: '→ 9' })).toHaveCount(1);
    await settleForScreenshot(page);
    await page.screenshot({ path: 'test-results/master-data-audit-1440.png' });
  });
});
