import request from 'supertest';
import type { EntityManager } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it, vi, type MockInstance } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { loadLineRiskInputs, type LineRiskInputs } from '../../server/line-risk/line-risk-inputs';
import { LineRiskRunner, type LineRiskPieces } from '../../server/line-risk/line-risk-runner';
import { syncLoops } from '../../server/loops/loop-sync';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { HolidayEntity } from '../../server/calendar/holiday.entity';
import { BomLineEntity } from '../../server/master-data/bom-line.entity';
import { PartEntity } from '../../server/master-data/part.entity';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { plantToday } from '../../server/planning/plan-dates';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { releasesChanged } from '../../server/releases/release-events';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { SequenceEntryEntity } from '../../server/sequence/sequence-entry.entity';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import {
  bumpPlanningVersion,
  PLANNING_PIECES,
  readPlanningPieceVersions,
  readPlanningVersion,
  type PlanningPiece,
  type PlanningPieceVersions,
} from '../../server/settings/versions';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { addWorkingDays, nextWorkingDay } from '../../shared/domain/calendar';
import { cardNumber } from '../../shared/domain/gs1';
import type { PlantCalendar } from '../../shared/domain/types';
import type { LineRiskReport } from '../../shared/schemas/line-risk';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';
import { bomLine } from '../shared/builders';

// A change moves the planning version and the counter of each planning piece it touched (part
// master, BOM, sequence, calendar); a change of stock alone (a count, scrap, a receipt) moves none.
// The line risk then reads again only the pieces whose counter moved, and stock: what it reads must
// be exactly what a full read gives, and the screen must show the change.

const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
const day1 = nextWorkingDay(plantToday(), calendar);
const day2 = addWorkingDays(day1, 1, calendar);
const day3 = addWorkingDays(day1, 2, calendar);
const DAY_MS = 86_400_000;

const versions = (context: TestContext) =>
  context.db.read(async (manager) => ({
    planning: await readPlanningVersion(manager),
    pieces: await readPlanningPieceVersions(manager),
  }));

/** The pieces whose counter differs between two reads. */
const movedPieces = (before: PlanningPieceVersions, after: PlanningPieceVersions): PlanningPiece[] =>
  PLANNING_PIECES.filter((piece) => after[piece] !== before[piece]);

/** Every planning piece at a time, as the counters hand them to the line risk when none moved. */
const everyPiece: ReadonlySet<PlanningPiece> = new Set(PLANNING_PIECES);

/** A release the supplier answered, written straight to the tables and told as release events are. */
async function confirmedRelease(
  context: TestContext,
  number: string,
  lines: { partNumber: string; qty: number; arrivalDate: string; cardId?: number }[],
): Promise<ReleaseLineEntity[]> {
  return context.db.write(async (manager) => {
    const release = await manager.save(
      manager.create(ReleaseEntity, { number, supplierCode: 'SUP-A', releaseDate: plantToday(), status: 'confirmed' }),
    );
    const saved = await manager.save(
      lines.map((line) =>
        manager.create(ReleaseLineEntity, {
          releaseId: release.id,
          partNumber: line.partNumber,
          qty: line.qty,
          confirmedQty: line.qty,
          needDate: line.arrivalDate,
          arrivalDate: line.arrivalDate,
          origin: line.cardId ? 'kanban' : 'plan',
          cardId: line.cardId ?? null,
          receivedQty: 0,
          closed: false,
        }),
      ),
    );
    await releasesChanged(manager);
    return saved;
  });
}

describe('the planning piece versions', () => {
  let context: TestContext;

  beforeAll(async () => {
    context = await createTestContext();
    await context.db.write((manager) => savePartsWithStock(manager, [testPart('P', { onHand: 10 })]));
  });
  afterAll(() => context.close());

  it('moves every piece to the new planning version with a full bump (the default), and none with a stock-only one', async () => {
    const start = await versions(context);

    const full = await context.db.write((manager) => bumpPlanningVersion(manager));
    const afterFull = await versions(context);
    const stock = await context.db.write((manager) => bumpPlanningVersion(manager, 'stock'));
    const afterStock = await versions(context);

    expect(full).toBe(start.planning + 1);
    expect(afterFull).toEqual({ planning: full, pieces: { parts: full, bom: full, sequence: full, calendar: full } });
    expect(stock).toBe(full + 1);
    expect(afterStock).toEqual({ planning: stock, pieces: afterFull.pieces });
  });

  it('moves the one piece a change names, leaving the others standing', async () => {
    for (const piece of PLANNING_PIECES) {
      const before = await versions(context);

      const bumped = await context.db.write((manager) => bumpPlanningVersion(manager, piece));
      const after = await versions(context);

      expect(after.planning).toBe(bumped);
      expect(after.pieces).toEqual({ ...before.pieces, [piece]: bumped });
    }
  });

  it('moves each piece any bump of a unit of work touched, before or after a stock-only one', async () => {
    const start = await versions(context);

    await context.db.write(async (manager) => {
      await bumpPlanningVersion(manager, 'stock');
      await bumpPlanningVersion(manager, 'bom');
    });
    const stockThenBom = await versions(context);
    await context.db.write(async (manager) => {
      await bumpPlanningVersion(manager, 'calendar');
      await bumpPlanningVersion(manager, 'sequence');
      await bumpPlanningVersion(manager, 'stock');
    });
    const calendarSequenceStock = await versions(context);

    expect(stockThenBom).toEqual({
      planning: start.planning + 2,
      pieces: { ...start.pieces, bom: start.planning + 2 },
    });
    expect(calendarSequenceStock).toEqual({
      planning: start.planning + 5,
      pieces: { ...stockThenBom.pieces, calendar: start.planning + 3, sequence: start.planning + 4 },
    });
  });

  it('tells open screens the planning version after a stock-only bump as after any other', async () => {
    const notices: unknown[] = [];
    const stop = context.db.committedHere.subscribe((notice) => notices.push(notice));
    try {
      const version = await context.db.write((manager) => bumpPlanningVersion(manager, 'stock'));

      expect(notices).toContainEqual({ channel: 'planning', payload: { version } });
    } finally {
      stop();
    }
  });
});

describe('line-risk inputs read again with every planning piece standing, after changes of stock alone', () => {
  let context: TestContext;
  let releaseLines: ReleaseLineEntity[];

  // M takes 2 C, 1 D and 1 K; K is a kanban part with a loop and one card on its way. OLD was last
  // counted 200 days ago (past the 90-day interval); NEW-OPEN has only its opening movement.
  beforeAll(async () => {
    context = await createTestContext();
    const longAgo = new Date(Date.now() - 200 * DAY_MS).toISOString();
    await context.db.write(async (manager) => {
      await writeCalendar(manager, calendar);
      await savePartsWithStock(manager, [
        testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
        testPart('C', { onHand: 5, replenishment: 'scheduled' }),
        testPart('D', { onHand: 100, replenishment: 'scheduled', supplierCode: 'SUP-B' }),
        testPart('K', { onHand: 3, replenishment: 'kanban' }),
        testPart('OLD', { onHand: 40, replenishment: 'scheduled' }),
        testPart('NEW-OPEN', { onHand: 8, replenishment: 'scheduled' }),
      ]);
      await manager.update(PartEntity, { partNumber: 'OLD' }, { lastCountedAt: longAgo });
      await replaceBomLines(manager, [bomLine('M', 'C', 2), bomLine('M', 'D', 1), bomLine('M', 'K', 1)]);
      await upsertSequenceEntries(manager, [
        { date: day1, sequence: 1, model: 'M', serial: 'S1', qty: 1 },
        { date: day1, sequence: 2, model: 'M', serial: 'S2', qty: 1 },
        { date: day2, sequence: 1, model: 'M', serial: 'S3', qty: 1 },
      ]);
      await syncLoops(manager);
    });
    const loop = await context.dataSource.getRepository(KanbanLoopEntity).findOneByOrFail({ partNumber: 'K' });
    const card = await context.dataSource.getRepository(KanbanCardEntity).save({
      loopId: loop.id,
      cardIndex: 1,
      cardNumber: cardNumber(loop.id, 1),
      state: 'ordered',
      stateChangedAt: new Date().toISOString(),
      retiredAt: null,
      releaseLineId: null,
    });
    releaseLines = await confirmedRelease(context, 'R-STOCK-1', [
      { partNumber: 'C', qty: 10, arrivalDate: day2 },
      { partNumber: 'K', qty: 6, arrivalDate: day3, cardId: card.id },
    ]);
  });
  afterAll(() => context.close());

  const readFull = () =>
    context.db.read(async (manager) => loadLineRiskInputs(manager, await context.services.loops.listLoops()));
  /** A full read and a read that takes the standing planning pieces from `before`, in one snapshot. */
  const readBoth = (before: LineRiskInputs, now?: Date, standing = everyPiece) =>
    context.db.read(async (manager) => {
      const loops = await context.services.loops.listLoops();
      return {
        full: await loadLineRiskInputs(manager, loops, now),
        reused: await loadLineRiskInputs(manager, loops, now, { before, standing }),
      };
    });
  /** Every piece but one, as the counters hand them over after a change to that one. */
  const allBut = (moved: PlanningPiece): ReadonlySet<PlanningPiece> =>
    new Set(PLANNING_PIECES.filter((piece) => piece !== moved));
  const lineOf = (inputs: LineRiskInputs, component: string) =>
    inputs.bom.find((line) => line.parent === 'M' && line.component === component);
  const byPart = (inputs: LineRiskInputs, partNumber: string) =>
    inputs.parts.find((part) => part.partNumber === partNumber)!;
  /** Reads in full, writes a change to one piece as its writers do, then reads both ways. */
  const changeThenReadBoth = async (piece: PlanningPiece, write: (manager: EntityManager) => Promise<unknown>) => {
    const before = await readFull();
    await context.db.write(async (manager) => {
      await write(manager);
      await bumpPlanningVersion(manager, piece);
    });
    return { before, ...(await readBoth(before, undefined, allBut(piece))) };
  };

  it('equals a full read after scrap, counts and receipts, keeping every piece and part that stood', async () => {
    const before = await readFull();
    const versionsBefore = await versions(context);
    const asReceiving = bearer(context.tokens.receiving);

    const scrap = await request(context.app)
      .post('/api/stock/scrap')
      .set(asReceiving)
      .send({ partNumber: 'D', qty: 3, reason: 'Dropped' });
    const countOld = await request(context.app)
      .post('/api/stock/counts')
      .set(asReceiving)
      .send({ partNumber: 'OLD', counted: 38 });
    const countC = await request(context.app)
      .post('/api/stock/counts')
      .set(asReceiving)
      .send({ partNumber: 'C', counted: 6 });
    const receiveC = await request(context.app)
      .post('/api/receipts')
      .set(asReceiving)
      .set('Idempotency-Key', 'stock-only-c')
      .send({ releaseLineId: releaseLines[0].id, qty: 10 });
    const receiveK = await request(context.app)
      .post('/api/receipts')
      .set(asReceiving)
      .set('Idempotency-Key', 'stock-only-k')
      .send({ releaseLineId: releaseLines[1].id, qty: 6, discrepancy: 'damaged', close: true });
    const versionsAfter = await versions(context);
    const { full, reused } = await readBoth(before);

    expect([scrap.status, countOld.status, countC.status, receiveC.status, receiveK.status]).toEqual([
      201, 201, 201, 201, 201,
    ]);
    // Five stock changes moved the planning version; none moved a piece's counter.
    expect(versionsAfter.planning).toBeGreaterThan(versionsBefore.planning);
    expect(versionsAfter.pieces).toEqual(versionsBefore.pieces);
    // The changes were real: stock, count-due, firm receipts and the loop's card (closed with
    // nothing usable, back to empty) all moved.
    expect(byPart(before, 'OLD').countDue).toBe(true);
    expect(byPart(full, 'OLD')).toMatchObject({ onHand: 38, countDue: false });
    expect(byPart(full, 'C').onHand).toBe(16);
    expect(byPart(full, 'D').onHand).toBe(97);
    expect(before.firmReceipts).toHaveLength(2);
    expect(full.firmReceipts).toEqual([]);
    expect(before.loops).toMatchObject([{ partNumber: 'K', emptyCards: 0 }]);
    expect(full.loops).toMatchObject([{ partNumber: 'K', emptyCards: 1 }]);

    expect(reused).toStrictEqual(full);
    // What stood is kept as it was, object for object.
    expect(reused.bom).toBe(before.bom);
    expect(reused.sequence).toBe(before.sequence);
    expect(reused.calendar).toBe(before.calendar);
    expect(reused.details).toBe(before.details);
    for (const partNumber of ['M', 'K', 'NEW-OPEN'])
      expect(byPart(reused, partNumber)).toBe(byPart(before, partNumber));
    for (const partNumber of ['C', 'D', 'OLD']) expect(byPart(reused, partNumber)).not.toBe(byPart(before, partNumber));
  });

  it('equals a full read after a kanban card is scanned empty at the line', async () => {
    const loop = await context.dataSource.getRepository(KanbanLoopEntity).findOneByOrFail({ partNumber: 'K' });
    const card = await context.dataSource.getRepository(KanbanCardEntity).save({
      loopId: loop.id,
      cardIndex: 2,
      cardNumber: cardNumber(loop.id, 2),
      state: 'full',
      stateChangedAt: new Date().toISOString(),
      retiredAt: null,
      releaseLineId: null,
    });
    const before = await readFull();
    const versionsBefore = await versions(context);

    const scan = await request(context.app)
      .post('/api/kanban/scans')
      .set(bearer(context.tokens.planner))
      .send({ cardNumber: card.cardNumber });
    const versionsAfter = await versions(context);
    const { full, reused } = await readBoth(before);

    expect(scan.status).toBe(201);
    expect(versionsAfter.planning).toBeGreaterThan(versionsBefore.planning);
    expect(versionsAfter.pieces).toEqual(versionsBefore.pieces);
    // The emptied card is one more the loop waits for.
    const emptyBefore = before.loops.find((supply) => supply.partNumber === 'K')!.emptyCards;
    expect(full.loops).toMatchObject([{ partNumber: 'K', emptyCards: emptyBefore + 1 }]);
    expect(reused).toStrictEqual(full);
  });

  it('sees a part that became due a count as time passed, with no change at all', async () => {
    const before = await readFull();
    // NEW-OPEN opened its ledger today: 100 days on, it is past the 90-day interval.
    const later = new Date(Date.now() + 100 * DAY_MS);

    const { full, reused } = await readBoth(before, later);

    expect(byPart(before, 'NEW-OPEN').countDue).toBe(false);
    expect(byPart(full, 'NEW-OPEN').countDue).toBe(true);
    expect(reused).toStrictEqual(full);
  });

  it('reads again only the parts revised since a part-master change, keeping the others and the details', async () => {
    const { before, full, reused } = await changeThenReadBoth('parts', (manager) =>
      manager.update(PartEntity, { partNumber: 'D' }, { leadTimeDays: 9, safetyStock: 2 }),
    );

    expect(byPart(full, 'D')).toMatchObject({ leadTimeDays: 9, safetyStock: 2 });
    expect(reused).toStrictEqual(full);
    expect(reused.partsMark.lastRevision).toBeGreaterThan(before.partsMark.lastRevision);
    for (const partNumber of ['M', 'C', 'K', 'OLD', 'NEW-OPEN'])
      expect(byPart(reused, partNumber)).toBe(byPart(before, partNumber));
    // Neither the lead time nor the safety stock shows beside the figures.
    expect(reused.details).toBe(before.details);
  });

  it('gives only the renamed part new details', async () => {
    const { before, full, reused } = await changeThenReadBoth('parts', (manager) =>
      manager.update(PartEntity, { partNumber: 'C' }, { description: 'Bracket, revised' }),
    );

    expect(full.details.get('C')).toMatchObject({ description: 'Bracket, revised' });
    expect(reused).toStrictEqual(full);
    expect(reused.details).not.toBe(before.details);
    expect(reused.details.get('D')).toBe(before.details.get('D'));
    expect(byPart(reused, 'C')).toBe(byPart(before, 'C'));
  });

  it('sees a part written with no counter moved: the database revises the part itself', async () => {
    const before = await readFull();
    // Written behind the counters' and the ledger's back.
    await context.dataSource.getRepository(PartEntity).update({ partNumber: 'D' }, { onHand: 777, hazardous: true });

    const { full, reused } = await readBoth(before);

    expect(byPart(full, 'D').onHand).toBe(777);
    expect(full.details.get('D')).toMatchObject({ hazardous: true });
    expect(reused).toStrictEqual(full);
    await context.dataSource
      .getRepository(PartEntity)
      .update({ partNumber: 'D' }, { onHand: byPart(before, 'D').onHand, hazardous: false });
  });

  it('reads the parts in full after a supplier is renamed: its name shows beside each of its parts', async () => {
    const { full, reused } = await changeThenReadBoth('parts', (manager) =>
      manager.update(SupplierEntity, { code: 'SUP-B' }, { name: 'Renamed Supplier B' }),
    );

    expect(full.details.get('D')).toMatchObject({ supplierName: 'Renamed Supplier B' });
    expect(reused).toStrictEqual(full);
    expect(reused.partsMark.supplierNames.get('SUP-B')).toBe('Renamed Supplier B');
  });

  it('reads the parts in full when one part gave way to another, though the count stands', async () => {
    await context.dataSource.getRepository(PartEntity).insert(testPart('GONE'));
    const { full, reused } = await changeThenReadBoth('parts', async (manager) => {
      await manager.delete(PartEntity, { partNumber: 'GONE' });
      await manager.insert(PartEntity, testPart('CAME'));
    });

    expect(full.parts.map((part) => part.partNumber)).toContain('CAME');
    expect(full.parts.map((part) => part.partNumber)).not.toContain('GONE');
    expect(reused).toStrictEqual(full);
    await context.dataSource.getRepository(PartEntity).delete({ partNumber: 'CAME' });
  });

  it('reads again only the BOM lines revised since, keeping the others as they were', async () => {
    const { before, full, reused } = await changeThenReadBoth('bom', (manager) =>
      manager.update(BomLineEntity, { parent: 'M', component: 'D' }, { qtyPer: 3 }),
    );

    expect(lineOf(full, 'D')).toMatchObject({ qtyPer: 3 });
    expect(reused).toStrictEqual(full);
    expect(reused.bomMark.lastRevision).toBeGreaterThan(before.bomMark.lastRevision);
    expect(lineOf(reused, 'C')).toBe(lineOf(before, 'C'));
    expect(lineOf(reused, 'K')).toBe(lineOf(before, 'K'));
  });

  it("reads the BOM again after a parent's lines are replaced, and after a line goes", async () => {
    const before = await readFull();
    await context.db.write((manager) =>
      replaceBomLines(manager, [
        bomLine('M', 'C', 2),
        bomLine('M', 'D', 1),
        bomLine('M', 'K', 1),
        bomLine('M', 'OLD', 1),
      ]),
    );
    const replaced = await readBoth(before, undefined, allBut('bom'));
    await context.db.write(async (manager) => {
      await manager.delete(BomLineEntity, { parent: 'M', component: 'OLD' });
      await bumpPlanningVersion(manager, 'bom');
    });
    const removed = await readBoth(replaced.reused, undefined, allBut('bom'));

    expect(replaced.full.bom).toHaveLength(before.bom.length + 1);
    expect(replaced.reused).toStrictEqual(replaced.full);
    expect(removed.full.bom).toHaveLength(before.bom.length);
    expect(removed.reused).toStrictEqual(removed.full);
    expect(removed.reused.bomMark.ids).not.toEqual(before.bomMark.ids);
  });

  it('reads again only the units revised since: moved, built, added or gone', async () => {
    const serialsOf = (inputs: LineRiskInputs) => inputs.sequence.map((slot) => slot.serial);
    const unitOf = (inputs: LineRiskInputs, serial: string) => inputs.sequence.find((slot) => slot.serial === serial);
    const change = async (write: (manager: EntityManager) => Promise<unknown>) => {
      const read = await changeThenReadBoth('sequence', write);
      expect(read.reused).toStrictEqual(read.full);
      return read;
    };

    // S3 moves ahead of S1 and S2, to the first place of day 1.
    const moved = await change((manager) =>
      manager.update(SequenceEntryEntity, { serial: 'S3' }, { date: day1, sequence: 0 }),
    );
    // S1 is built: it leaves the units to build.
    const built = await change((manager) => manager.update(SequenceEntryEntity, { serial: 'S1' }, { status: 'built' }));
    const added = await change((manager) =>
      manager.insert(SequenceEntryEntity, { date: day2, sequence: 5, model: 'M', serial: 'S9', qty: 1 }),
    );
    // Not the last revised: the deletion shows only in the count.
    const gone = await change((manager) => manager.delete(SequenceEntryEntity, { serial: 'S2' }));

    expect(serialsOf(moved.full)).toEqual(['S3', 'S1', 'S2']);
    expect(unitOf(moved.reused, 'S1')).toBe(unitOf(moved.before, 'S1'));
    expect(serialsOf(built.full)).toEqual(['S3', 'S2']);
    expect(unitOf(built.reused, 'S2')).toBe(unitOf(built.before, 'S2'));
    expect(serialsOf(added.full)).toEqual(['S3', 'S2', 'S9']);
    expect(serialsOf(gone.full)).toEqual(['S3', 'S9']);
    expect(gone.reused.sequenceMark.lastRevision).toBe(gone.before.sequenceMark.lastRevision);
    expect(unitOf(gone.reused, 'S9')).toBe(unitOf(gone.before, 'S9'));
    await context.db.write(async (manager) => {
      await manager.delete(SequenceEntryEntity, { serial: 'S9' });
      await manager.insert(SequenceEntryEntity, { date: day1, sequence: 2, model: 'M', serial: 'S2', qty: 1 });
      await manager.update(SequenceEntryEntity, { serial: 'S1' }, { status: 'planned' });
      await manager.update(SequenceEntryEntity, { serial: 'S3' }, { date: day2, sequence: 1 });
      await bumpPlanningVersion(manager, 'sequence');
    });
  });

  it('reads the parts in full when the part list is no longer the one it read, though no counter moved', async () => {
    const before = await readFull();
    // Written with no bump at all: only the part list itself can tell.
    await context.dataSource
      .getRepository(PartEntity)
      .insert({ ...testPart('EXTRA', { hazardous: true }), supplierCode: 'SUP-B', onHand: 4 });

    const { full, reused } = await readBoth(before);

    expect(byPart(full, 'EXTRA')).toMatchObject({ onHand: 4, supplierCode: 'SUP-B' });
    expect(full.details.get('EXTRA')).toMatchObject({ hazardous: true });
    expect(reused).toStrictEqual(full);
    expect(reused.parts).not.toBe(before.parts);
    expect(reused.details).not.toBe(before.details);
    expect(reused.bom).toBe(before.bom);
  });
});

/** M takes 2 × C and 1 × E; C has 5 on hand and nothing on order, E 50. Day 1 builds S1 and S2, day 2 S3 and S4. */
async function twoDaysOfM(): Promise<TestContext> {
  const context = await createTestContext();
  await context.db.write(async (manager) => {
    await writeCalendar(manager, calendar);
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('C', { onHand: 5, replenishment: 'scheduled' }),
      testPart('E', { onHand: 50, replenishment: 'scheduled' }),
    ]);
    await replaceBomLines(manager, [bomLine('M', 'C', 2), bomLine('M', 'E', 1)]);
    await upsertSequenceEntries(manager, [
      { date: day1, sequence: 1, model: 'M', serial: 'S1', qty: 1 },
      { date: day1, sequence: 2, model: 'M', serial: 'S2', qty: 1 },
      { date: day2, sequence: 1, model: 'M', serial: 'S3', qty: 1 },
      { date: day2, sequence: 2, model: 'M', serial: 'S4', qty: 1 },
    ]);
  });
  return context;
}

/** The line risk of days 1 to 3, as the planner's screen asks for it. */
async function lineRiskOf(context: TestContext): Promise<LineRiskReport> {
  const response = await request(context.app)
    .get('/api/line-risk')
    .query({ from: day1, to: day3 })
    .set(bearer(context.tokens.planner));
  expect(response.status).toBe(200);
  return response.body as LineRiskReport;
}

const shortOf = (report: LineRiskReport, partNumber: string) =>
  report.shortages.find((shortage) => shortage.partNumber === partNumber);

describe('GET /api/line-risk after changes of stock and of the sequence', () => {
  let context: TestContext;

  beforeAll(async () => {
    context = await twoDaysOfM();
  });
  afterAll(() => context.close());

  const lineRisk = () => lineRiskOf(context);

  it('shows the counted on-hand at once, reading only stock again', async () => {
    const walks = vi.spyOn(LineRiskRunner.prototype, 'compute');
    try {
      const before = await lineRisk();
      const count = await request(context.app)
        .post('/api/stock/counts')
        .set(bearer(context.tokens.receiving))
        .send({ partNumber: 'C', counted: 6 });
      const after = await lineRisk();

      // Projected on-hand, day by day (on hand less what the day's units take, the netting of
      // material requirements planning; common practice): C 5 − 4 = 1, then 1 − 4 = −3 → 3 short.
      expect(shortOf(before, 'C')).toMatchObject({ firstShortDate: day2, shortQty: 3 });
      expect(count.status).toBe(201);
      // Counted 6: 6 − 4 = 2, then 2 − 4 = −2 → 2 short.
      expect(shortOf(after, 'C')).toMatchObject({ firstShortDate: day2, shortQty: 2 });
      // The walk after the count was given E's part as read before the count: only stock was read again.
      expect(walks).toHaveBeenCalledTimes(2);
      const [first, second] = walks.mock.calls.map((call) => call[1] as LineRiskPieces);
      const partOf = (pieces: LineRiskPieces, partNumber: string) =>
        pieces.parts.find((part) => part.partNumber === partNumber);
      expect(partOf(second, 'E')).toBe(partOf(first, 'E'));
      expect(partOf(second, 'C')).toMatchObject({ onHand: 6 });
      expect(second.bom).toBe(first.bom);
    } finally {
      walks.mockRestore();
    }
  });

  it('reads the sequence again after a build, which also moves stock', async () => {
    const before = await lineRisk();
    const versionsBefore = await versions(context);

    const built = await request(context.app)
      .post('/api/builds')
      .set(bearer(context.tokens.line))
      .set('Idempotency-Key', 'build-s1')
      .send({ serial: 'S1' });
    const after = await lineRisk();

    expect(built.status).toBe(201);
    // The stock it took moved no counter; the units it marked built moved the sequence's alone.
    expect(movedPieces(versionsBefore.pieces, (await versions(context)).pieces)).toEqual(['sequence']);
    // S1 took its 2 C from stock (6 → 4) and left the units to build: 4 − 2 = 2 on day 1, then
    // 2 − 4 = −2 on day 2, still 2 short. Had the sequence not been read again, S1 would be
    // counted twice: 4 − 4 = 0, then −4.
    expect(before.unitsInHorizon).toBe(4);
    expect(after.unitsInHorizon).toBe(3);
    expect(shortOf(after, 'C')).toMatchObject({ firstShortDate: day2, shortQty: 2 });
  });

  it('reads the sequence again after a build is undone', async () => {
    const versionsBefore = await versions(context);

    const undone = await request(context.app)
      .delete('/api/builds/S1')
      .query({ reason: 'Reported the wrong serial' })
      .set(bearer(context.tokens.planner));
    const after = await lineRisk();

    expect(undone.status).toBe(200);
    expect(movedPieces(versionsBefore.pieces, (await versions(context)).pieces)).toEqual(['sequence']);
    // S1 is to build again and its 2 C are back (4 → 6): as after the count.
    expect(after.unitsInHorizon).toBe(4);
    expect(shortOf(after, 'C')).toMatchObject({ firstShortDate: day2, shortQty: 2 });
  });
});

describe('GET /api/line-risk after a change to one planning piece', () => {
  let context: TestContext;
  let walks: MockInstance<LineRiskRunner['compute']>;
  // Far past the horizon, so what is written there changes no figure on the screen.
  const farDay = addWorkingDays(day1, 60, calendar);

  beforeAll(async () => {
    context = await twoDaysOfM();
    walks = vi.spyOn(LineRiskRunner.prototype, 'compute');
  });
  afterAll(async () => {
    walks.mockRestore();
    await context.close();
  });

  const lineRisk = () => lineRiskOf(context);
  /** The pieces of the last walk: those of the result the screen was just given, walked or kept. */
  const lastWalk = () => walks.mock.calls.at(-1)![1] as LineRiskPieces;
  const readFull = () =>
    context.db.read(async (manager) => loadLineRiskInputs(manager, await context.services.loops.listLoops()));

  it('reads the BOM alone again after a BOM edit, walking it with the parts, sequence and calendar of the walk before', async () => {
    const before = await lineRisk();
    const first = lastWalk();
    const versionsBefore = await versions(context);
    // Written behind the counters' back (no bump): a read of the sequence or the calendar would
    // see them, so the walk after the edit must not.
    await context.dataSource
      .getRepository(SequenceEntryEntity)
      .insert({ date: farDay, sequence: 1, model: 'M', serial: 'S-UNSEEN', qty: 1 });
    await context.dataSource.getRepository(HolidayEntity).insert({ date: farDay, name: '' });

    const edit = await request(context.app)
      .put('/api/bom/M')
      .set(bearer(context.tokens.buyer))
      .send({
        lines: [
          { component: 'C', qtyPer: 3 },
          { component: 'E', qtyPer: 1 },
        ],
      });
    const versionsAfter = await versions(context);
    const after = await lineRisk();
    const second = lastWalk();
    const full = await readFull();

    expect(edit.status).toBe(200);
    expect(movedPieces(versionsBefore.pieces, versionsAfter.pieces)).toEqual(['bom']);
    // Projected on-hand, day by day (on hand less what the day's units take, the netting of
    // material requirements planning; common practice). 2 C a unit: 5 − 4 = 1, then 1 − 4 = −3,
    // short from day 2 by 3. 3 C a unit: 5 − 6 = −1 on day 1, then −1 − 6 = −7: 1 + 6 = 7 must
    // arrive, short from day 1.
    expect(shortOf(before, 'C')).toMatchObject({ firstShortDate: day2, shortQty: 3 });
    expect(shortOf(after, 'C')).toMatchObject({ firstShortDate: day1, shortQty: 7 });
    expect(second).not.toBe(first);
    expect(second.parts).toBe(first.parts);
    expect(second.details).toBe(first.details);
    expect(second.sequence).toBe(first.sequence);
    expect(second.calendar).toBe(first.calendar);
    expect(second.bom).not.toEqual(first.bom);
    expect(second.bom).toStrictEqual(full.bom);
    // What was written behind the counters' back is there for a full read to see.
    expect(full.sequence).toContainEqual(expect.objectContaining({ serial: 'S-UNSEEN' }));
    expect(full.calendar.holidays).toContain(farDay);
  });

  it('reads the calendar alone again after a calendar change', async () => {
    await lineRisk();
    const first = lastWalk();
    const versionsBefore = await versions(context);
    const shutdown = addWorkingDays(farDay, 5, calendar);
    // As in the BOM edit: seen by a read of the sequence, so not here.
    await context.dataSource
      .getRepository(SequenceEntryEntity)
      .insert({ date: shutdown, sequence: 1, model: 'M', serial: 'S-UNSEEN-2', qty: 1 });

    const change = await request(context.app)
      .put('/api/calendar')
      .set(bearer(context.tokens.planner))
      .send({ workingWeekdays: [1, 2, 3, 4, 5], holidays: [shutdown] });
    const versionsAfter = await versions(context);
    await lineRisk();
    const second = lastWalk();

    expect(change.status).toBe(200);
    expect(movedPieces(versionsBefore.pieces, versionsAfter.pieces)).toEqual(['calendar']);
    expect(second.calendar).toEqual({ workingWeekdays: [1, 2, 3, 4, 5], holidays: [shutdown] });
    expect(second.parts).toBe(first.parts);
    expect(second.details).toBe(first.details);
    expect(second.bom).toBe(first.bom);
    expect(second.sequence).toBe(first.sequence);
  });

  it('reads every piece again after a change that names none', async () => {
    await lineRisk();
    const first = lastWalk();

    await context.db.write((manager) => bumpPlanningVersion(manager, 'any'));
    await lineRisk();
    const second = lastWalk();
    const full = await readFull();

    // The changes written behind the counters' back in the tests before are read at last.
    expect(full.sequence).toContainEqual(expect.objectContaining({ serial: 'S-UNSEEN-2' }));
    expect(second.parts).toStrictEqual(full.parts);
    expect(second.details).toStrictEqual(full.details);
    expect(second.sequence).toStrictEqual(full.sequence);
    expect(second.sequence).not.toBe(first.sequence);
  });
});
