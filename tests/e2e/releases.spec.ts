import { expect, test, type APIRequestContext } from '@playwright/test';
import { LoginPage } from './pages/login-page';
import { ConfirmPage, ReleasesPage, settleReleasesScreen } from './pages/releases-page';
import { DEMO_PASSWORD } from './pages/demo-api';

async function apiToken(request: APIRequestContext, email: string): Promise<string> {
  const response = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(response.ok()).toBe(true);
  return ((await response.json()) as { token: string }).token;
}

interface LoopRow {
  id: number;
  partNumber: string;
  supplierCode: string | null;
  kind: string;
  recommendedCards: number;
  activeCards: number;
}

/**
 * The demo starts its loops with full cards: signal one card of a supplier loop empty at the line,
 * so today's run has a kanban line as well as planned ones.
 */
async function emptyOneKanbanCard(request: APIRequestContext, token: string): Promise<LoopRow> {
  const headers = { Authorization: `Bearer ${token}` };
  const loops = (await (await request.get('/api/kanban/loops', { headers })).json()) as LoopRow[];
  const loop = loops.find(
    (candidate) => candidate.kind === 'supplier' && candidate.supplierCode && candidate.activeCards > 0,
  );
  expect(loop, 'a supplier loop with cards in circulation').toBeDefined();
  const cards = (await (await request.get(`/api/kanban/loops/${loop!.id}/cards`, { headers })).json()) as {
    cardNumber: string;
    state: string;
  }[];
  const full = cards.find((card) => card.state === 'full');
  expect(full, 'a full card of that loop').toBeDefined();
  const scan = await request.post('/api/kanban/scans', { headers, data: { cardNumber: full!.cardNumber } });
  expect(scan.ok()).toBe(true);
  return loop!;
}

/** The confirmation link of a release, as the demo mail server caught it (the outbox sends every 10 s). */
async function confirmationLink(request: APIRequestContext, adminToken: string, number: string): Promise<string> {
  let link = '';
  await expect(async () => {
    const response = await request.get('/api/dev/mail', { headers: { Authorization: `Bearer ${adminToken}` } });
    const mails = (await response.json()) as { subject: string; text: string }[];
    const mail = mails.find((candidate) => candidate.subject.includes(number));
    expect(mail, `the mail of ${number}`).toBeDefined();
    link = mail!.text.match(/https?:\/\/\S+\/confirm\/[A-Za-z0-9_-]+/)![0];
  }).toPass({ timeout: 40_000, intervals: [1_000] });
  return link;
}

test('a buyer runs today’s releases, the supplier proposes a change from the e-mailed link, and the buyer accepts it', async ({
  page,
  browser,
  request,
}) => {
  const buyerToken = await apiToken(request, 'buyer@example.com');
  const loop = await emptyOneKanbanCard(request, buyerToken);

  const login = new LoginPage(page);
  await login.open();
  await login.signIn('buyer@example.com', DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);
  const releases = new ReleasesPage(page);
  await releases.open();
  await expect(releases.heading()).toBeVisible();

  const run = await releases.runNow();

  const kanbanRelease = run.releases.find((release) => release.supplierCode === loop.supplierCode);
  expect(kanbanRelease, `a release to ${loop.supplierCode}`).toBeDefined();
  await expect(page.getByText(/releases? with \d+ lines? sent for/)).toBeVisible();
  for (const release of run.releases) await expect(releases.row(release.number)).toContainText('Sent');
  await releases.expand(kanbanRelease!.number);
  await expect(page.getByText(loop.partNumber).first()).toBeVisible();

  // The same day again makes nothing new.
  await releases.runNow();
  await expect(page.getByText(/^Nothing new for /)).toBeVisible();

  const adminToken = await apiToken(request, 'admin@example.com');
  const link = await confirmationLink(request, adminToken, kanbanRelease!.number);

  // The supplier opens the link on a phone, signed in to nothing.
  const phone = await browser.newContext({ viewport: { width: 375, height: 812 }, isMobile: true, hasTouch: true });
  const supplierPage = await phone.newPage();
  await supplierPage.goto(link);
  const confirm = new ConfirmPage(supplierPage);
  await expect(confirm.heading()).toHaveText(kanbanRelease!.number);
  await expect(supplierPage.getByRole('navigation', { name: 'Main' })).toHaveCount(0);
  const firstQty = Number(await confirm.quantityInputs().first().inputValue());
  // A typo is refused under its line and stays in the box as typed; nothing is sent.
  await confirm.setQuantity(0, -2);
  await confirm.send();
  await expect(supplierPage.getByText('Must be 0 or more')).toBeVisible();
  await expect(confirm.quantityInputs().first()).toHaveValue('-2');
  await expect(confirm.heading()).toHaveText(kanbanRelease!.number);
  await confirm.setQuantity(0, firstQty - 1);
  await expect(confirm.summary()).toHaveText(/1 line differs from the request/);
  await supplierPage.evaluate(() => window.scrollTo(0, 0));
  await supplierPage.screenshot({ path: 'test-results/confirm-mobile.png', animations: 'disabled' });
  await confirm.send();
  await expect(confirm.outcome()).toContainText('sent as a proposal for the buyer');
  await supplierPage.reload();
  await expect(confirm.outcome()).toContainText('This link was already used');
  await phone.close();

  // Back at the desk, the exception waits at the top with the difference spelt out.
  await page.reload();
  await expect(releases.decisions()).toBeVisible();
  await expect(releases.decision(kanbanRelease!.number)).toContainText(/1 \w+ short/);
  await expect(releases.row(kanbanRelease!.number)).toContainText('Exception');
  await releases.expand(kanbanRelease!.number);
  await expect(page.getByText(/^Card \d{12}$/).first()).toBeVisible();
  await settleReleasesScreen(page);
  await page.screenshot({ path: 'test-results/releases.png', fullPage: true, animations: 'disabled' });

  await releases.acceptChanges(kanbanRelease!.number);

  await expect(page.getByText(`${kanbanRelease!.number} is confirmed with the supplier’s changes.`)).toBeVisible();
  await expect(releases.row(kanbanRelease!.number)).toContainText('Confirmed');
  await expect(releases.decision(kanbanRelease!.number)).toHaveCount(0);
});
