import { chromium, type Page } from '@playwright/test';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../server/app';
import { ensureClientBuilt } from '../../server/client-build';
import type { Database } from '../../server/db/database';
import { createServices } from '../../server/services';
import { hashPassword } from '../../server/users/passwords';
import { UserEntity } from '../../server/users/user.entity';

const SECRET = 'bench-secret-bench-secret-bench-secret-bench';
const PASSWORD = 'bench-password-long-enough';

export interface BrowserBench {
  base: string;
  /** Chromium at 1440 × 900, not yet signed in (so a printout can watch from the first byte). */
  page: Page;
  /** Signs the bench user in through the sign-in page and waits for the Overview. */
  signIn(): Promise<void>;
  close(): Promise<void>;
}

/**
 * Serves the whole app (client build included) over a plant already written to `db`, with a user of
 * `role`, and opens Chromium on it: the start of every browser printout of the bench.
 */
export async function openBrowserBench(db: Database, role: 'admin' | 'buyer'): Promise<BrowserBench> {
  const email = `bench-${role}@example.com`;
  await db.dataSource.getRepository(UserEntity).save({
    email,
    name: `Bench ${role}`,
    role,
    passwordHash: await hashPassword(PASSWORD),
    supplierCode: null,
  });
  const clientDir = await ensureClientBuilt(process.cwd());
  const services = createServices(db, { jwtSecret: SECRET });
  const server = createApp(db, { jwtSecret: SECRET, clientDir }, services).listen(0);
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium' });
  const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
  return {
    base,
    page,
    async signIn() {
      await page.goto(`${base}/login`);
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(`${base}/`);
    },
    async close() {
      await browser.close();
      server.closeAllConnections();
      server.close();
      await services.lineRisk.close();
    },
  };
}
