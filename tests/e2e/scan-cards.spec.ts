import { expect, test, type APIRequestContext } from '@playwright/test';
import { DockPage } from './pages/dock-page';
import { LoginPage } from './pages/login-page';
import { DEMO_PASSWORD, tokenOf } from './pages/demo-api';

/** A kanban card of the demo that is on order: a release line asked its supplier for it. */
async function orderedCard(
  request: APIRequestContext,
  token: string,
): Promise<{ cardNumber: string; partNumber: string }> {
  const headers = { Authorization: `Bearer ${token}` };
  const loops = (await (await request.get('/api/kanban/loops', { headers })).json()) as {
    id: number;
    partNumber: string;
    kind: string;
    cardStates: Record<string, number>;
  }[];
  for (const loop of loops) {
    if (loop.kind !== 'supplier' || !loop.cardStates.ordered) continue;
    const cards = (await (await request.get(`/api/kanban/loops/${loop.id}/cards`, { headers })).json()) as {
      cardNumber: string;
      state: string;
    }[];
    const ordered = cards.find((card) => card.state === 'ordered');
    if (ordered) return { cardNumber: ordered.cardNumber, partNumber: loop.partNumber };
  }
  throw new Error('the demo has no kanban card on order');
}

test('a card on order is counted in at the dock, never made full by a scan', async ({ page, request }) => {
  const receiving = await tokenOf(request, 'receiving@example.com');
  const card = await orderedCard(request, receiving);

  // The server refuses the scan that would make a card full without stock behind it.
  const refused = await request.post('/api/kanban/scans', {
    headers: { Authorization: `Bearer ${receiving}` },
    data: { cardNumber: card.cardNumber, event: 'receive' },
  });
  expect(refused.status()).toBe(409);
  expect(((await refused.json()) as { error: { message: string } }).error.message).toMatch(/dock/i);

  const login = new LoginPage(page);
  await login.open();
  await login.signIn('receiving@example.com', DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);
  await page.goto('/scan');
  await page.locator('.el-radio-button', { hasText: 'Count in at the dock' }).click();
  await expect(page.getByRole('radio', { name: 'Count in at the dock' })).toBeChecked();
  await page.getByLabel('Card number').fill(card.cardNumber);
  await page.getByLabel('Card number').press('Enter');

  // The scan opens the dock check-in of the card's delivery; nothing is counted until the clerk records it.
  await expect(page).toHaveURL(/\/dock$/);
  const dock = new DockPage(page);
  await expect(dock.checkInDialog()).toBeVisible();
  await expect(dock.lines().first()).toHaveAttribute('data-part', card.partNumber);
  await page.screenshot({ path: 'test-results/scan-to-dock-check-in.png' });
});
