import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { nextWorkingDay } from '../../shared/domain/calendar';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { alertFrozenWindowShortages } from '../../server/line-risk/frozen-window-alerts';
import { LineRiskService } from '../../server/line-risk/line-risk.service';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { postCounts, savePartsWithStock } from '../../server/stock/stock.service';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { plantToday } from '../../server/planning/plan-dates';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { bumpPlanningVersion } from '../../server/settings/versions';
import { createTestContext, testPart, type TestContext } from './helpers';

const calendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
let context: TestContext;
let lineRisk: LineRiskService;

// The first working day from today is inside the default frozen window of 3 working days. One
// unit of M needs 2 of P; with 1 on hand and nothing confirmed to arrive, that unit is at risk, and
// P's lead time of 2 working days leaves no release time to bring it: an expedite.
beforeAll(async () => {
  context = await createTestContext();
  lineRisk = context.services.lineRisk;
  const buildDay = nextWorkingDay(plantToday(), calendar);
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, calendar);
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('P', { onHand: 1, leadTimeDays: 2, description: 'Drive motor' }),
    ]);
    await replaceBomLines(manager, [
      { parent: 'M', component: 'P', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
    await upsertSequenceEntries(manager, [{ date: buildDay, sequence: 1, model: 'M', serial: 'S-1', qty: 1 }]);
  });
});
afterAll(() => context.close());

const alertsTo = async (email: string) =>
  (await context.dataSource.getRepository(OutboxMessageEntity).find({ order: { id: 'ASC' } })).filter(
    (message) => message.to === email,
  );

describe('frozen-window shortage alerts', () => {
  it('e-mails every planner once when a shortage enters the frozen window, naming the unit', async () => {
    const first = await alertFrozenWindowShortages(context.db, lineRisk, 'http://plant.example.com');
    const again = await alertFrozenWindowShortages(context.db, lineRisk, 'http://plant.example.com');

    expect(first).toEqual(['P']);
    expect(again).toEqual([]);
    const mails = await alertsTo('planner@example.com');
    expect(mails).toHaveLength(1);
    expect(mails[0].text).toContain('S-1 (M)');
    // Quantities in the words the screens use, never the unit code.
    // Dates in the screens' style ("Mon 7 Dec"), never ISO.
    expect(mails[0].text).toMatch(/Short from (Mon|Tue|Wed|Thu|Fri) \d{1,2} [A-Z][a-z]{2} by \d+ pcs?;/);
    expect(mails[0].subject).toMatch(/P short on (Mon|Tue|Wed|Thu|Fri) \d{1,2} [A-Z][a-z]{2}, inside/);
    expect(mails[0].text).not.toContain('H87');
    expect(mails[0].text).toContain('http://plant.example.com/line-risk');
    expect(await alertsTo('buyer@example.com')).toHaveLength(0);
  });

  it('alerts again after the part has left the window and comes back, naming a request still unanswered', async () => {
    await context.db.write((manager) => postCounts(manager, [{ partNumber: 'P', counted: 5 }], null, 'Count'));
    const cleared = await alertFrozenWindowShortages(context.db, lineRisk, 'http://plant.example.com');
    await context.db.write(async (manager) => {
      await postCounts(manager, [{ partNumber: 'P', counted: 0 }], null, 'Count');
      // Sent to the supplier, not yet confirmed: no supply yet, but the planner must not ask twice.
      const release = await manager.save(
        ReleaseEntity,
        manager.create(ReleaseEntity, {
          number: 'R-ASKED',
          supplierCode: 'SUP-A',
          releaseDate: plantToday(),
          status: 'sent',
        }),
      );
      await manager.insert(ReleaseLineEntity, {
        releaseId: release.id,
        partNumber: 'P',
        qty: 4,
        needDate: nextWorkingDay(plantToday(), calendar),
        origin: 'plan',
      });
      await bumpPlanningVersion(manager);
    });

    const back = await alertFrozenWindowShortages(context.db, lineRisk, 'http://plant.example.com');

    expect(cleared).toEqual([]);
    expect(back).toEqual(['P']);
    const mails = await alertsTo('planner@example.com');
    expect(mails).toHaveLength(2);
    expect(mails[1].text).toContain('Already asked for: 4 pcs on R-ASKED, not yet confirmed by Supplier A.');
    expect(mails[0].text).not.toContain('Already asked for');
  });
});
