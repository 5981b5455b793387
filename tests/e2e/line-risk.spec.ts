import { expect, test } from '@playwright/test';
import { LineRiskPage } from './pages/line-risk-page';
import { LoginPage } from './pages/login-page';

const DEMO_PASSWORD = 'cardloop-demo';

test.describe('Line risk', () => {
  test('a planner sees which units the demo plant cannot build, what stops them and how to rescue the first', async ({
    page,
  }) => {
    const login = new LoginPage(page);
    await login.open();
    await login.signIn('planner@example.com', DEMO_PASSWORD);
    await expect(page).toHaveURL(/\/$/);
    const lineRisk = new LineRiskPage(page);

    await lineRisk.open();

    await expect(lineRisk.heading()).toBeVisible();
    await expect(lineRisk.summary()).toContainText(/\d+ units? at risk/);
    // The demo runs four bought parts short inside its first two working weeks.
    await expect(lineRisk.partRows().first()).toBeVisible();
    expect(await lineRisk.partRows().count()).toBeGreaterThanOrEqual(1);
    const firstPart = (await lineRisk
      .partRows()
      .first()
      .locator('.line-risk-table__part-number')
      .textContent())!.trim();
    await expect(lineRisk.rescue(firstPart)).toContainText(
      new RegExp(`Expedite \\d[\\d,.]* \\w+ of ${firstPart} from \\w+`),
    );
    await expect(lineRisk.rescue(firstPart)).toContainText(
      /Build SN\d+ \([\w-]+\) in slot \d+ of (Mon|Tue|Wed|Thu|Fri|Sat|Sun) \d{1,2} [A-Z][a-z]{2} instead of SN\d+: all its parts are present\./,
    );
    await expect(lineRisk.unitsLacking(firstPart).first()).toContainText(/SN\d+/);
    await expect(page.getByText('Hazardous', { exact: true }).first()).toBeVisible();
    await page.screenshot({ path: 'test-results/line-risk.png', animations: 'disabled' });

    await lineRisk.chooseHorizon('Next week');
    await expect(page).toHaveURL(/weeks=1/);
    await lineRisk.showUnits();
    await expect(lineRisk.unitRows().first()).toContainText(/SN\d+/);
    await page.screenshot({ path: 'test-results/line-risk-units.png', animations: 'disabled' });
  });
});
