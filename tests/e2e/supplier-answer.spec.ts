import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { animationsFinished, seriousViolations, sidewaysOverflow } from './pages/accessibility-checks';
import { LoginPage } from './pages/login-page';
import { SupplierAccountPage } from './pages/supplier-account-page';
import { DEMO_PASSWORD, plantToday, tokenOf } from './pages/demo-api';

/** No serious WCAG A/AA problem and nothing sideways, at a desk and at a phone's width. */
async function readableEverywhere(page: Page, what: string): Promise<void> {
  for (const viewport of [
    { width: 1440, height: 900 },
    { width: 390, height: 844 },
  ]) {
    await page.setViewportSize(viewport);
    await animationsFinished(page);
    expect.soft(await seriousViolations(page), `${what} at ${viewport.width} px`).toEqual([]);
    expect.soft(await sidewaysOverflow(page), `${what} at ${viewport.width} px`).toBeLessThanOrEqual(1);
  }
  await page.setViewportSize({ width: 1366, height: 860 });
}

interface LoopRow {
  id: number;
  supplierCode: string | null;
  kind: string;
}

/**
 * A supplier not yet released today gets a release of its own: one of its full kanban cards is
 * signalled empty at the line, and today's run orders it. Not the battery supplier (FBS), whose
 * deliveries carry the demo's planted line-risk story.
 */
async function freshSentRelease(request: APIRequestContext): Promise<{ number: string; supplierCode: string }> {
  const buyer = { Authorization: `Bearer ${await tokenOf(request, 'buyer@example.com')}` };
  const today = plantToday();
  const released = (await (await request.get('/api/releases', { headers: buyer })).json()) as {
    releaseDate: string;
    supplierCode: string;
  }[];
  const releasedToday = new Set(released.filter((row) => row.releaseDate === today).map((row) => row.supplierCode));
  const loops = (await (await request.get('/api/kanban/loops', { headers: buyer })).json()) as LoopRow[];
  for (const loop of loops) {
    if (loop.kind !== 'supplier' || !loop.supplierCode || loop.supplierCode === 'FBS') continue;
    if (releasedToday.has(loop.supplierCode)) continue;
    const cards = (await (await request.get(`/api/kanban/loops/${loop.id}/cards`, { headers: buyer })).json()) as {
      cardNumber: string;
      state: string;
    }[];
    const full = cards.find((card) => card.state === 'full');
    if (!full) continue;
    const scan = await request.post('/api/kanban/scans', { headers: buyer, data: { cardNumber: full.cardNumber } });
    expect(scan.ok()).toBe(true);
    const run = await request.post('/api/releases/run', { headers: buyer, data: { date: today } });
    expect(run.status()).toBe(200);
    const made = ((await run.json()) as { releases: { number: string; supplierCode: string }[] }).releases.find(
      (release) => release.supplierCode === loop.supplierCode,
    );
    expect(made, `today's release of ${loop.supplierCode}`).toBeDefined();
    return made!;
  }
  throw new Error('no supplier with a full kanban card is left unreleased today');
}

test('a supplier signed in answers a release from its own page, and the e-mailed link is spent with it', async ({
  page,
  request,
}) => {
  const release = await freshSentRelease(request);
  const admin = { Authorization: `Bearer ${await tokenOf(request, 'admin@example.com')}` };
  const users = (await (await request.get('/api/users', { headers: admin })).json()) as {
    email: string;
    role: string;
    supplierCode: string | null;
  }[];
  const contact = users.find((user) => user.role === 'supplier' && user.supplierCode === release.supplierCode);
  expect(contact, `a contact of ${release.supplierCode}`).toBeDefined();

  const login = new LoginPage(page);
  await login.open();
  await login.signIn(contact!.email, DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/$/);
  const account = new SupplierAccountPage(page);
  await account.openFromRail();
  await expect(account.releaseRow(release.number)).toContainText('Sent');

  await account.answer(release.number);

  await expect(page).toHaveURL(new RegExp(`/releases/${release.number}/confirm$`));
  await expect(page.getByRole('heading', { name: release.number })).toBeVisible();
  // Inside the app, with its menu: signed in, not the bare page behind the e-mailed link.
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  await expect(page.getByText('You answer once; the link in the release e-mail then stops working.')).toBeVisible();
  await page.screenshot({ path: 'test-results/supplier-answer-1366.png', fullPage: true });
  await readableEverywhere(page, 'the answer page');
  await page.getByRole('button', { name: 'Confirm all as requested' }).click();

  await expect(page.getByRole('status')).toContainText('Thank you — release confirmed');
  await expect(page.getByRole('link', { name: 'send a ship notice' })).toHaveAttribute(
    'href',
    `/releases/${release.number}/ship-notice`,
  );
  await page.getByRole('link', { name: 'send a ship notice' }).click();
  await expect(page).toHaveURL(new RegExp(`/releases/${release.number}/ship-notice$`));
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  await readableEverywhere(page, 'the ship-notice page');

  const stored = await request.get(`/api/releases/${release.number}`, { headers: admin });
  expect(((await stored.json()) as { status: string }).status).toBe('confirmed');
  // The release mail's link now says the release was answered.
  let link = '';
  await expect(async () => {
    const mails = (await (await request.get('/api/dev/mail', { headers: admin })).json()) as {
      subject: string;
      text: string;
    }[];
    const mail = mails.find((candidate) => candidate.subject.includes(release.number));
    expect(mail, `the mail of ${release.number}`).toBeDefined();
    link = /\/confirm\/[A-Za-z0-9_-]+/.exec(mail!.text)![0];
    expect((await request.get(`/api${link}`)).status()).toBe(409);
  }).toPass({ timeout: 40_000, intervals: [1_000] });
  // The page behind the spent link says so, as readably as the rest.
  await page.goto(link);
  await expect(page.getByRole('status')).toContainText('This link was already used');
  await readableEverywhere(page, 'the spent link');
});
