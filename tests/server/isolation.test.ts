import request from 'supertest';
import type { EntitySubscriberInterface } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addWorkingDays, nextWorkingDay } from '../../shared/domain/calendar';
import type { PlantCalendar } from '../../shared/domain/types';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { upsertSuppliers } from '../../server/master-data/master-data.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { startFakeSmtp, type FakeSmtp } from '../../server/outbox/fake-smtp';
import { enqueueMail, OutboxDispatcher } from '../../server/outbox/outbox.service';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { plantToday } from '../../server/planning/plan-dates';
import { SequenceEntryEntity } from '../../server/sequence/sequence-entry.entity';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';
import { SUPPLIER_DEFAULT_TERMS } from '../../shared/schemas/master-data';

// Three faults seen when one SQLite connection served every request: a read saw rows of an import
// that later rolled back, a read saw a two-day swap half applied, and a mail marked sent inside
// another request's transaction was marked pending again by its rollback and went out twice.

let context: TestContext;
beforeAll(async () => {
  context = await createTestContext();
});
afterAll(() => context.close());

/** Opens a write unit that has written and waits; `fail()` rolls it back, as a killed import would. */
function holdWriteUnit(write: Parameters<TestContext['db']['write']>[0]) {
  let fail!: () => void;
  const failed = new Promise<void>((resolve) => (fail = resolve));
  let written!: () => void;
  const hasWritten = new Promise<void>((resolve) => (written = resolve));
  const unit = context.db
    .write(async (manager) => {
      await write(manager);
      written();
      await failed;
      throw new Error('import killed');
    })
    .catch((error: Error) => error.message);
  return { hasWritten, fail, unit };
}

describe('request isolation', () => {
  it('never shows suppliers of an import that is still running and later rolls back', async () => {
    const committed = (await request(context.app).get('/api/suppliers').set(bearer(context.tokens.buyer))).body.length;
    const importing = holdWriteUnit((manager) =>
      upsertSuppliers(
        manager,
        Array.from({ length: 500 }, (_, index) => ({
          code: `IMP-${index}`,
          name: `Imported ${index}`,
          email: `imp${index}@example.com`,
          leadTimeDays: 3,
          ...SUPPLIER_DEFAULT_TERMS,
        })),
      ),
    );
    await importing.hasWritten;

    const during = await Promise.all(
      Array.from({ length: 10 }, () => request(context.app).get('/api/suppliers').set(bearer(context.tokens.buyer))),
    );
    importing.fail();
    const outcome = await importing.unit;
    const after = await request(context.app).get('/api/suppliers').set(bearer(context.tokens.buyer));

    expect(outcome).toBe('import killed');
    expect(during.map((response) => response.body.length)).toEqual(during.map(() => committed));
    expect(after.body).toHaveLength(committed);
  });

  it('never shows a two-day swap half applied', async () => {
    const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
    // Days after the frozen window, so the planner may swap them freely.
    const first = addWorkingDays(nextWorkingDay(plantToday(), calendar), 5, calendar);
    const second = addWorkingDays(first, 1, calendar);
    const dayA = Array.from({ length: 6 }, (_, index) => `SA-${index}`);
    const dayB = Array.from({ length: 6 }, (_, index) => `SB-${index}`);
    await context.db.write(async (manager) => {
      await writeCalendar(manager, calendar);
      await savePartsWithStock(manager, [
        testPart('MDL', { source: 'end_item', supplierCode: null, replenishment: null }),
      ]);
      await upsertSequenceEntries(manager, [
        ...dayA.map((serial, index) => ({ date: first, sequence: index + 1, model: 'MDL', serial, qty: 1 })),
        ...dayB.map((serial, index) => ({ date: second, sequence: index + 1, model: 'MDL', serial, qty: 1 })),
      ]);
    });
    const swap = (to: 'swapped' | 'back') =>
      request(context.app)
        .put('/api/sequence/days')
        .set(bearer(context.tokens.planner))
        .send({
          days:
            to === 'swapped'
              ? [
                  { date: first, serials: dayB },
                  { date: second, serials: dayA },
                ]
              : [
                  { date: first, serials: dayA },
                  { date: second, serials: dayB },
                ],
        });
    const read = async () => {
      const response = await request(context.app)
        .get('/api/sequence')
        .query({ from: first, to: second })
        .set(bearer(context.tokens.viewer));
      const days = response.body.days as { date: string; units: { serial: string }[] }[];
      return days.map((day) => day.units.map((unit) => unit.serial).join(',')).join(' | ');
    };
    const whole = [`${dayA.join(',')} | ${dayB.join(',')}`, `${dayB.join(',')} | ${dayA.join(',')}`];

    // Pause the swap right after its first unit has moved, as a slow disk or a busy CPU would.
    let paused!: () => void;
    const hasPaused = new Promise<void>((resolve) => (paused = resolve));
    let goOn!: () => void;
    const gate = new Promise<void>((resolve) => (goOn = resolve));
    let armed = true;
    const pauseOnce: EntitySubscriberInterface = {
      listenTo: () => SequenceEntryEntity,
      afterUpdate: async () => {
        if (!armed) return;
        armed = false;
        paused();
        await gate;
      },
    };
    context.dataSource.subscribers.push(pauseOnce);

    // A supertest request is sent only once something waits for it.
    const swapping = swap('swapped').then((response) => response);
    await hasPaused;
    const during = await Promise.all(Array.from({ length: 5 }, read));
    goOn();
    const response = await swapping;
    const afterwards = await read();
    context.dataSource.subscribers.splice(context.dataSource.subscribers.indexOf(pauseOnce), 1);

    expect(response.status).toBe(200);
    expect(during).toEqual(during.map(() => whole[0]));
    expect(afterwards).toBe(whole[1]);
  });

  it('sends a notice once when the dispatcher marks it while another unit rolls back', async () => {
    const smtp: FakeSmtp = await startFakeSmtp();
    const dispatcher = new OutboxDispatcher(context.db, smtp.url, 'Cardloop <cardloop@example.com>');
    try {
      await context.db.write((manager) =>
        enqueueMail(manager, { to: 'orders@supplier-a.example.com', subject: 'Release R1', text: 'Please confirm.' }),
      );
      const importing = holdWriteUnit((manager) =>
        upsertSuppliers(manager, [
          {
            code: 'KILLED',
            name: 'Never committed',
            email: 'killed@example.com',
            leadTimeDays: 1,
            ...SUPPLIER_DEFAULT_TERMS,
          },
        ]),
      );
      await importing.hasWritten;

      const dispatching = dispatcher.dispatchDue();
      // Give the dispatcher every chance to send and mark the notice while the other unit is open.
      const deadline = Date.now() + 1000;
      while (smtp.messages.length === 0 && Date.now() < deadline)
        await new Promise((resolve) => setTimeout(resolve, 20));
      await new Promise((resolve) => setTimeout(resolve, 200));
      importing.fail();
      await importing.unit;
      const firstRound = await dispatching;
      const secondRound = await dispatcher.dispatchDue();

      expect(firstRound).toBe(1);
      expect(secondRound).toBe(0);
      expect(smtp.messages.filter((message) => message.subject === 'Release R1')).toHaveLength(1);
      const stored = await context.db.manager.findOneByOrFail(OutboxMessageEntity, { subject: 'Release R1' });
      expect(stored.status).toBe('sent');
    } finally {
      dispatcher.close();
      await smtp.close();
    }
  });
});
