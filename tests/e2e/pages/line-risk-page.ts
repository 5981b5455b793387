import type { Locator, Page } from '@playwright/test';

type HorizonLabel = 'Next week' | '2 weeks' | '4 weeks';

/** The planner's Line risk screen: headline figures, short parts with their rescues, units at risk. */
export class LineRiskPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation').getByRole('link', { name: 'Line risk' }).click();
  }

  heading(): Locator {
    return this.page.getByRole('heading', { name: 'Line risk', level: 1 });
  }

  summary(): Locator {
    return this.page.getByRole('list', { name: 'Line risk in numbers' });
  }

  /** Rows of the short-parts table (not of the units table inside an opened row). */
  partRows(): Locator {
    return this.page.locator('tr.el-table__row').filter({ has: this.page.locator('.line-risk-table__part-number') });
  }

  /** The opened part's rescue: expedite and resequence suggestions in words. */
  rescue(partNumber: string): Locator {
    return this.page.getByRole('region', { name: `Rescue for ${partNumber}` });
  }

  /** The exact units an opened part stops. */
  unitsLacking(partNumber: string): Locator {
    return this.page.getByRole('region', { name: `Units that lack ${partNumber}` }).locator('.el-table__body tr');
  }

  /** How many units an opened part stops, and how many are listed. */
  unitsTitle(partNumber: string): Locator {
    return this.page
      .getByRole('region', { name: `Units that lack ${partNumber}` })
      .locator('[data-test="units-title"]');
  }

  /** The button that lists every unit an opened part stops (the report lists the first few). */
  showAllUnits(partNumber: string): Locator {
    return this.page
      .getByRole('region', { name: `Units that lack ${partNumber}` })
      .getByRole('button', { name: /^Show all/ });
  }

  /** The short parts grouped by action, in the order shown. */
  actionGroups(): Locator {
    return this.page.locator('[data-test="action-group"]');
  }

  group(action: 'expedite' | 'loop' | 'count' | 'release'): Locator {
    return this.page.locator(`[data-test="action-group"][data-action="${action}"]`);
  }

  /** An opened part's schedule: how much must arrive by each date. */
  needBy(): Locator {
    return this.page.locator('[data-test="need-by"]');
  }

  async chooseHorizon(label: HorizonLabel): Promise<void> {
    await this.page.getByRole('radiogroup', { name: 'Horizon' }).getByText(label, { exact: true }).click();
  }

  horizonOption(label: HorizonLabel): Locator {
    return this.page.getByRole('radiogroup', { name: 'Horizon' }).getByRole('radio', { name: label, exact: true });
  }

  async showUnits(): Promise<void> {
    await this.page.getByRole('tab', { name: /^Units at risk/ }).click();
  }

  /** Rows of the units-at-risk list, one per unit, in build order. */
  unitRows(): Locator {
    return this.page.locator('.line-risk-units .el-table__body tr');
  }
}
