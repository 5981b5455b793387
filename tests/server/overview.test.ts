import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import type { Overview } from '../../shared/schemas/overview';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { writeSetting } from '../../server/settings/settings';
import { DEMO_ACCOUNTS } from '../../server/users/bootstrap';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';
import { createMemoryHistory, createRouter } from 'vue-router';
import { ROLES } from '../../shared/schemas/user';
import { routes } from '../../src/router/routes';
import { mayEnter } from '../../src/router/access';

let context: TestContext;

beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction(async (manager) => {
    await savePartsWithStock(manager, [
      testPart('P1', { replenishment: 'scheduled' }),
      testPart('P2', { replenishment: 'scheduled' }),
    ]);
    const insertRelease = async (number: string, supplierCode: string, status: string, releaseDate: string) => {
      const release = await manager.save(manager.create(ReleaseEntity, { number, supplierCode, releaseDate, status }));
      await manager.insert(ReleaseLineEntity, [
        { releaseId: release.id, partNumber: 'P1', qty: 4, needDate: '2026-12-07', origin: 'plan' },
        { releaseId: release.id, partNumber: 'P2', qty: 2, needDate: '2026-12-07', origin: 'plan' },
      ]);
    };
    await insertRelease('R-A1', 'SUP-A', 'exception', '2026-11-27');
    await insertRelease('R-A2', 'SUP-A', 'sent', '2026-11-30');
    await insertRelease('R-B1', 'SUP-B', 'sent', '2026-11-27');
    await insertRelease('R-B2', 'SUP-B', 'confirmed', '2026-11-30');
  });
});
afterAll(() => context.close());

async function overviewOf(role: keyof TestContext['tokens']): Promise<Overview> {
  const response = await request(context.app).get('/api/overview').set(bearer(context.tokens[role]));
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body;
}

const figure = (overview: Overview, key: string) => overview.figures.find((candidate) => candidate.key === key);

describe('GET /api/overview', () => {
  it('gives the buyer the answers waiting, expedites and loops to resize', async () => {
    const overview = await overviewOf('buyer');

    expect(overview.role).toBe('buyer');
    expect(overview.figures.map((candidate) => candidate.key)).toEqual([
      'exceptionsWaiting',
      'expedites',
      'loopsToResize',
    ]);
    expect(figure(overview, 'exceptionsWaiting')).toMatchObject({ value: 1, attention: true, to: '/releases' });
  });

  it('gives a supplier only its own lines to confirm and to ship', async () => {
    // The test supplier account belongs to SUP-A: its sent release has 2 open lines, nothing confirmed.
    const overview = await overviewOf('supplier');

    expect(figure(overview, 'linesToConfirm')).toMatchObject({ value: 2 });
    expect(figure(overview, 'linesToShip')).toMatchObject({ value: 0 });
  });

  it('gives the planner and the viewer the frozen window, the first stop and capacity use', async () => {
    const planner = await overviewOf('planner');
    const viewer = await overviewOf('viewer');

    expect(planner.figures.map((candidate) => candidate.key)).toEqual([
      'unitsAtRiskFrozen',
      'daysToFirstStop',
      'capacityUse',
    ]);
    // No unit in the test plant's sequence: nothing at risk and no first stop.
    expect(figure(planner, 'unitsAtRiskFrozen')).toMatchObject({ value: 0, attention: false });
    expect(figure(planner, 'daysToFirstStop')).toMatchObject({ value: null });
    expect(viewer.figures).toEqual(planner.figures);
  });

  it("links every role's figures to a screen of the app that role may open", async () => {
    const router = createRouter({ history: createMemoryHistory(), routes });
    let checked = 0;
    for (const role of ROLES) {
      for (const { key, to } of (await overviewOf(role)).figures) {
        const target = router.resolve(to);
        expect(target.name, `${role}: ${key} → ${to}`).not.toBe('not-found');
        expect(mayEnter(target.meta.roles, role), `${role}: ${key} → ${to}`).toBe(true);
        checked += 1;
      }
    }
    expect(checked).toBeGreaterThan(ROLES.length);
  });

  it('answers 401 without a sign-in', async () => {
    expect((await request(context.app).get('/api/overview')).status).toBe(401);
  });
});

describe('the first-run guide', () => {
  beforeAll(async () => {
    // The demo seed lists its own accounts; these two stand for them.
    await context.dataSource.transaction((manager) =>
      writeSetting(manager, DEMO_ACCOUNTS, ['buyer@example.com', 'line@example.com']),
    );
  });

  it('shows on a demo account’s Overview and never on an account the demo did not create', async () => {
    expect((await overviewOf('buyer')).firstRunGuide).toBe(true);
    expect((await overviewOf('line')).firstRunGuide).toBe(true);
    expect((await overviewOf('admin')).firstRunGuide).toBe(false);
  });

  it('stays away for the user who put it away, twice or not, and only for that user', async () => {
    const dismiss = () =>
      request(context.app).post('/api/overview/first-run-guide/dismiss').set(bearer(context.tokens.buyer));

    expect((await dismiss()).status).toBe(204);
    expect((await dismiss()).status).toBe(204);

    expect((await overviewOf('buyer')).firstRunGuide).toBe(false);
    expect((await overviewOf('line')).firstRunGuide).toBe(true);
    expect((await request(context.app).post('/api/overview/first-run-guide/dismiss')).status).toBe(401);
  });
});
