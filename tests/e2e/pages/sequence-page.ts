import { expect, type Locator, type Page } from '@playwright/test';

/** The Build sequence board: one column per working day, unit cards with a grip and a menu. */
export class SequencePage {
  constructor(private readonly page: Page) {}

  async open(): Promise<void> {
    await this.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Build sequence' }).click();
    await expect(this.columns().first()).toBeVisible();
  }

  heading(): Locator {
    return this.page.getByRole('heading', { name: 'Build sequence', level: 1 });
  }

  columns(): Locator {
    return this.page.locator('[data-test="day-column"]');
  }

  /** The columns outside the frozen window, in date order. */
  openColumns(): Locator {
    return this.columns().filter({ hasNot: this.page.locator('[data-test="frozen-flag"]') });
  }

  cards(column: Locator): Locator {
    return column.locator('[data-test="unit-card"]');
  }

  card(serial: string): Locator {
    return this.page.locator(`[data-test="unit-card"][data-serial="${serial}"]`);
  }

  /** The units the column's header counts, e.g. 24 of "24 / 24 units". */
  async load(column: Locator): Promise<number> {
    const text = await column.locator('[data-test="day-load"]').innerText();
    return Number(text.split('/')[0]!.trim());
  }

  /** The daily capacity the column's header counts against. */
  async capacity(column: Locator): Promise<number> {
    const text = await column.locator('[data-test="day-load"]').innerText();
    return Number(text.split('/')[1]!.replace('units', '').trim());
  }

  async serials(column: Locator): Promise<string[]> {
    return this.cards(column).evaluateAll((cards) => cards.map((card) => card.getAttribute('data-serial') ?? ''));
  }

  /**
   * Drags a card by its grip onto another card. SortableJS starts a native drag only after the
   * pointer has moved a little with the button down, so the pointer travels in small steps.
   */
  async dragCard(card: Locator, onto: Locator): Promise<void> {
    // Centred: a grip near the board's edge would scroll the board while dragging, and the drop
    // would land a column off.
    await card.evaluate((element) => element.scrollIntoView({ block: 'center', inline: 'center' }));
    const grip = await card.locator('[data-test="drag-handle"]').boundingBox();
    const target = await onto.boundingBox();
    if (!grip || !target) throw new Error('the card or its target is not on screen');
    await this.page.mouse.move(grip.x + grip.width / 2, grip.y + grip.height / 2);
    await this.page.mouse.down();
    await this.page.mouse.move(grip.x + grip.width / 2 + 6, grip.y + grip.height / 2 + 6, { steps: 3 });
    await this.page.mouse.move(target.x + target.width / 2, target.y + target.height / 2, { steps: 12 });
    await this.page.mouse.up();
  }

  /** Opens a card's menu with the keyboard and picks an item, the way a keyboard user does. */
  async chooseWithKeyboard(serial: string, item: string): Promise<void> {
    const button = this.page.getByRole('button', { name: `Actions for ${serial}` });
    await button.focus();
    await this.page.keyboard.press('Enter');
    const menu = this.page.getByRole('menu', { name: `Actions for ${serial}` });
    await expect(menu).toBeVisible();
    const wanted = menu.getByRole('menuitem', { name: item });
    for (
      let step = 0;
      step < 5 && !(await wanted.evaluate((element) => element === document.activeElement));
      step += 1
    ) {
      await this.page.keyboard.press('ArrowDown');
    }
    await expect(wanted).toBeFocused();
    await this.page.keyboard.press('Enter');
  }

  /** What a move would do, shown before it is saved. */
  whatIf(): Locator {
    return this.page.getByRole('dialog', { name: 'Before you save' });
  }

  /** Saves the move; inside the frozen window the button says the move is made anyway. */
  async saveWhatIf(): Promise<void> {
    await this.whatIf()
      .getByRole('button', { name: /^(Save the change|Move it anyway)$/ })
      .click();
    await expect(this.whatIf()).toBeHidden();
  }

  async cancelWhatIf(): Promise<void> {
    await this.whatIf().getByRole('button', { name: 'Cancel' }).click();
    await expect(this.whatIf()).toBeHidden();
  }

  /** Cards marked at risk of not being built for want of a part. */
  atRiskCards(): Locator {
    return this.page.locator('[data-test="unit-card"]').filter({ has: this.page.locator('[data-test="unit-risk"]') });
  }

  /** The line that says what the last change did. */
  status(): Locator {
    return this.page.locator('[data-test="sequence-summary"]').getByRole('status');
  }
}
