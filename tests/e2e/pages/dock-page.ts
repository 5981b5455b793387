import { expect, type Locator, type Page } from '@playwright/test';

/** The Dock board: four columns of cards (a shipment, or a day expected without a ship notice), a scan box, and the check-in dialog. */
export class DockPage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Dock' }).click();
    await expect(this.heading()).toBeVisible();
    await expect(this.page.locator('[data-test="dock-board"]')).toBeVisible();
  }

  heading(): Locator {
    return this.page.getByRole('heading', { name: 'Dock', level: 1 });
  }

  /** A column by its API value: expected, at_dock, counted or to_line. */
  column(column: string): Locator {
    return this.page.locator(`[data-test="dock-column"][data-column="${column}"]`);
  }

  cards(column: Locator): Locator {
    return column.locator('[data-test="dock-card"]');
  }

  /** A card by its key: `shipment-<notice id>` or `expected-<release id>-<day>`. */
  card(key: string): Locator {
    return this.page.locator(`[data-test="dock-card"][data-card="${key}"]`);
  }

  /** Every card of a release: its shipments and its days expected without a ship notice. */
  cardsOf(releaseNumber: string): Locator {
    return this.page.locator(`[data-test="dock-card"][data-release="${releaseNumber}"]`);
  }

  /**
   * Drags a card into another column. SortableJS starts a drag only after the pointer has moved
   * a little with the button down, so the pointer is nudged first and then travels in steps.
   */
  async dragCard(card: Locator, toColumn: Locator): Promise<void> {
    await card.scrollIntoViewIfNeeded();
    const grip = await card.locator('.dock-board-card__supplier').boundingBox();
    const target = await toColumn.locator('.dock-board-column__cards').boundingBox();
    if (!grip || !target) throw new Error('the card or the column is not on screen');
    const startX = grip.x + grip.width / 2;
    const startY = grip.y + grip.height / 2;
    await this.page.mouse.move(startX, startY);
    await this.page.mouse.down();
    await this.page.mouse.move(startX + 6, startY + 6, { steps: 3 });
    // Level with the card (the columns run as long as the longest), so a card far down a long
    // column is dropped on the part of the target column that is on screen.
    const dropY = Math.min(Math.max(startY, target.y + 40), target.y + target.height - 20);
    await this.page.mouse.move(target.x + target.width / 2, dropY, { steps: 15 });
    await this.page.mouse.up();
  }

  async openCheckIn(card: Locator): Promise<Locator> {
    await card.getByRole('button', { name: 'Check in', exact: true }).click();
    const dialog = this.checkInDialog();
    await expect(dialog).toBeVisible();
    return dialog;
  }

  checkInDialog(): Locator {
    return this.page.getByRole('dialog', { name: /^Check in / });
  }

  /** The form of each open line in the dialog. */
  lines(): Locator {
    return this.checkInDialog().locator('[data-test="check-in-line"]');
  }

  /** What the line brings on its card, e.g. 36 of "36 pcs". */
  async orderedQty(line: Locator): Promise<number> {
    return Number((await line.locator('[data-test="ordered-qty"]').innerText()).split(' ')[0]);
  }

  async count(line: Locator, qty: number): Promise<void> {
    await line.getByLabel(/^Counted/).fill(String(qty));
  }

  async recordCounts(): Promise<void> {
    await this.checkInDialog().getByRole('button', { name: 'Record counts' }).click();
  }

  /** The on-hand a recorded line reports, e.g. 84 of "On hand now: 84 pcs". */
  async onHandShown(line: Locator): Promise<number> {
    const text = await line.locator('[data-test="on-hand"]').innerText();
    return Number(/On hand now: ([\d.]+)/.exec(text)?.[1]);
  }

  scanBox(): Locator {
    return this.page.getByLabel('Scan a release or kanban card');
  }

  status(): Locator {
    return this.page.locator('.dock-view__status');
  }
}
