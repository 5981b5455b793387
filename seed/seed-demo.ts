import type { Database } from '../server/db/database';
import { recordAudit } from '../server/audit/audit.service';
import { hashPassword } from '../server/users/passwords';
import { DEMO_ACCOUNTS } from '../server/users/bootstrap';
import { writeCalendar } from '../server/calendar/calendar.service';
import { syncLoops } from '../server/loops/loop-sync';
import { writeSequenceSettings } from '../server/sequence/sequence-settings';
import { replaceBomLines, upsertParts, upsertSuppliers } from '../server/master-data/master-data.writer';
import { postMovements, type NewMovement } from '../server/stock/stock-ledger';
import { upsertSequenceEntries } from '../server/sequence/sequence.writer';
import { writeSetting } from '../server/settings/settings';
import { UserEntity } from '../server/users/user.entity';
import { PartEntity } from '../server/master-data/part.entity';
import { SequenceEntryEntity } from '../server/sequence/sequence-entry.entity';
import { backflush, bomByParent } from '../shared/domain/backflush';
import { roundQty } from '../shared/domain/quantity';
import type { EntityManager } from 'typeorm';
import { LoopsService } from '../server/loops/loops.service';
import { KanbanCardEntity } from '../server/loops/kanban-card.entity';
import { PlanningService } from '../server/planning/planning.service';
import { bumpPlanningVersion } from '../server/settings/versions';
import { cardNumber } from '../shared/domain/gs1';
import { buildDemoScenario, type DemoScenario } from './scenario';
import { OPEN_KANBAN, openKanbanDeliveries, pastReleases } from './scenario-history';
import { addWorkingDays } from '../shared/domain/calendar';
import { COUNT_TO_CHECK, DUE_FOR_COUNT, OVERSIZED_LOOP, UNDERSIZED_LOOP } from './scenario-stock';
import {
  instantOn,
  receiptMovements,
  writeEmptiedCard,
  writeOpenKanbanDeliveries,
  writePastReleases,
  writeSentReleaseMail,
} from './seed-history';

const DEFAULT_APP_URL = 'http://localhost:3000';

/** Every demo account shares this password; it exists only in the demo database. */
export const DEMO_PASSWORD = 'cardloop-demo';

/**
 * The weeks before the sequence: every unit was built and backflushed, one every 18 minutes from
 * 07:00, and the past releases were received at the dock. Stock opened on the first of those days
 * with what the plant holds now plus what those units consumed less what came in, so the ledger has
 * history and on-hand is exactly what its movements say. Made subassemblies were made for those
 * units just in time: their stock is the opening one.
 */
async function seedBuiltHistory(manager: EntityManager, scenario: DemoScenario): Promise<void> {
  await upsertSequenceEntries(manager, scenario.history);
  const bom = bomByParent(scenario.bom);
  const sources = new Map(scenario.parts.map((part) => [part.partNumber, { source: part.source }]));
  const consumedInTotal = new Map<string, number>();
  const unitMovements: NewMovement[] = [];
  const builtAt = new Map<string, string>();
  for (const unit of scenario.history) {
    const at = instantOn(unit.date, 7 * 60 + unit.sequence * 18);
    builtAt.set(unit.serial, at);
    for (const [partNumber, qty] of backflush(unit.model, unit.qty, unit.date, bom, sources, new Map())) {
      consumedInTotal.set(partNumber, roundQty((consumedInTotal.get(partNumber) ?? 0) + qty));
      unitMovements.push({
        partNumber,
        qty: -qty,
        kind: 'backflush',
        userEmail: 'line@example.com',
        reason: `Built ${unit.serial} (${unit.model})`,
        refType: 'serial',
        ref: unit.serial,
        at,
      });
    }
  }
  const historyStart = scenario.history[0]?.date ?? scenario.sequence[0].date;
  const opened = instantOn(historyStart, 6 * 60);
  const past = pastReleases(
    scenario.parts,
    scenario.suppliers,
    scenario.calendar,
    historyStart,
    scenario.sequence[0].date,
    consumedInTotal,
  );
  const receipts = receiptMovements(past);
  const receivedInTotal = new Map<string, number>();
  for (const receipt of receipts) {
    receivedInTotal.set(receipt.partNumber, roundQty((receivedInTotal.get(receipt.partNumber) ?? 0) + receipt.qty));
  }
  const opening: NewMovement[] = scenario.parts.map((part) => ({
    partNumber: part.partNumber,
    qty: roundQty(
      part.onHand + (consumedInTotal.get(part.partNumber) ?? 0) - (receivedInTotal.get(part.partNumber) ?? 0),
    ),
    kind: 'opening',
    userEmail: null,
    reason: 'On-hand when the plant started with Cardloop, as its last cycle count left it',
    at: opened,
  }));
  // In time order, so each movement's balance is the part's on-hand at that moment.
  const movements = [...opening, ...unitMovements, ...receipts].sort((a, b) => a.at!.localeCompare(b.at!));
  const posted = await postMovements(manager, movements);
  await writePastReleases(manager, past, posted);
  for (const [serial, at] of builtAt) {
    await manager.update(SequenceEntryEntity, { serial }, { status: 'built', builtAt: at });
  }
  await seedCountHistory(manager, scenario, opened);
}

/**
 * The opening figures came from the plant's rolling cycle count, so each stocked part carries the
 * date it was last counted: spread over the 55 days before the opening (some three weeks ago), so
 * on whatever day the demo starts, only the parts planted for it are past the 90-day interval.
 */
async function seedCountHistory(manager: EntityManager, scenario: DemoScenario, opened: string): Promise<void> {
  const stocked = scenario.parts.filter((part) => part.source !== 'end_item');
  for (const [index, part] of stocked.entries()) {
    // The part planted for Line risk's count story was counted well past the interval.
    const due = DUE_FOR_COUNT.indexOf(part.partNumber);
    const daysBefore = part.partNumber === COUNT_TO_CHECK ? 120 : due >= 0 ? 95 + 3 * due : 1 + ((index * 37) % 55);
    const counted = new Date(new Date(opened).getTime() - daysBefore * 86_400_000);
    // Counts are taken on working days: a Saturday or Sunday becomes the Friday before.
    const weekend = counted.getUTCDay() === 6 ? 1 : counted.getUTCDay() === 0 ? 2 : 0;
    const countedAt = new Date(counted.getTime() - weekend * 86_400_000).toISOString();
    await manager.update(PartEntity, { partNumber: part.partNumber }, { lastCountedAt: countedAt });
  }
}

const CARD_INSERT_CHUNK = 200;

/**
 * The buyer printed every kanban loop's recommended cards when the plant started, all full, so
 * each loop supplies its part; the one planted loop lost two cards on the floor that were never
 * replaced, and runs short. Another kept two cards from before its demand fell: a loop to shrink.
 */
async function seedLoopCards(db: Database): Promise<void> {
  const loops = await new LoopsService(db, new PlanningService(db)).listLoops();
  const now = new Date().toISOString();
  const rows = loops.flatMap((loop) => {
    const lost = loop.partNumber === UNDERSIZED_LOOP.partNumber ? UNDERSIZED_LOOP.lostCards : 0;
    const extra = loop.partNumber === OVERSIZED_LOOP.partNumber ? OVERSIZED_LOOP.extraCards : 0;
    const count = Math.max(0, loop.recommendedCards - lost + extra);
    return Array.from({ length: count }, (_, offset) => ({
      loopId: loop.id,
      cardIndex: offset + 1,
      cardNumber: cardNumber(loop.id, offset + 1),
      state: 'full',
      stateChangedAt: now,
      retiredAt: null,
      releaseLineId: null,
    }));
  });
  await db.write(async (manager) => {
    for (let start = 0; start < rows.length; start += CARD_INSERT_CHUNK) {
      await manager.insert(KanbanCardEntity, rows.slice(start, start + CARD_INSERT_CHUNK));
    }
    await bumpPlanningVersion(manager);
  });
}

/** Where e-mailed links of the demo's past releases pointed. */
interface SeedOptions {
  appUrl?: string;
}

/**
 * Writes the invented demo plant into an empty database in one transaction, then issues its kanban
 * cards, the containers still on their way and the release mail already sent.
 */
export async function seedDemoScenario(db: Database, seedDay: string, options: SeedOptions = {}): Promise<void> {
  const scenario = buildDemoScenario(seedDay);
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.write(async (manager) => {
    await writeCalendar(
      manager,
      scenario.calendar,
      new Map(scenario.shutdowns.map((shutdown) => [shutdown.date, shutdown.name])),
    );
    await upsertSuppliers(manager, scenario.suppliers);
    await upsertParts(manager, scenario.parts);
    await replaceBomLines(manager, scenario.bom);
    await upsertSequenceEntries(manager, scenario.sequence);
    await seedBuiltHistory(manager, scenario);
    await syncLoops(manager);
    // The demo line can take 26 units a day against a plan of about 24, so a planner can move units.
    await writeSequenceSettings(manager, { frozenWindowDays: 3, dailyCapacity: 26 });
    await manager.insert(
      UserEntity,
      scenario.users.map((user) => ({ ...user, passwordHash, active: true })),
    );
    // The start banner lists these accounts beside the demo password, and never anyone added later.
    await writeSetting(
      manager,
      DEMO_ACCOUNTS,
      scenario.users.map((user) => user.email),
    );
    await recordAudit(manager, {
      actorEmail: null,
      action: 'seed',
      entity: 'scenario',
      entityKey: seedDay,
      changes: {
        suppliers: scenario.suppliers.length,
        parts: scenario.parts.length,
        units: scenario.sequence.length,
        built: scenario.history.length,
      },
    });
  });
  await seedLoopCards(db);
  await writeOpenKanbanDeliveries(
    db,
    openKanbanDeliveries(scenario.parts, scenario.suppliers, scenario.calendar, scenario.sequence[0].date),
  );
  await writeEmptiedCard(db, OPEN_KANBAN.emptied, addWorkingDays(scenario.sequence[0].date, -1, scenario.calendar));
  await writeSentReleaseMail(db, options.appUrl ?? DEFAULT_APP_URL);
}
