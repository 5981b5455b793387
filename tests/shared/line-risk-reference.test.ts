import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { backflush, bomByParent } from '../../shared/domain/backflush';
import { addCalendarDays } from '../../shared/domain/calendar';
import {
  computeLineRisk,
  LineRiskWalker,
  walkLineRisk,
  WALKS_BEFORE_FULL,
  type WalkKind,
  type LineRiskInput,
  type LineRiskPart,
  type LoopSupply,
} from '../../shared/domain/line-risk';
import {
  flatEntries,
  flattenQueueJob,
  ownEntries,
  walkFlatQueueJob,
  type Memory,
  type QueueHelper,
} from '../../shared/domain/line-risk-queue';
import { roundQty } from '../../shared/domain/quantity';
import type { DayOrder } from '../../shared/domain/sequence';
import { resequenced, sequenceOutlook, tryResequence } from '../../shared/domain/sequence-what-if';
import type { PlanningBomLine, PlantCalendar, SequenceSlot } from '../../shared/domain/types';
import { referenceLineRisk } from './line-risk-reference';
import { bomLine, boughtPart, sequenceUnit } from './builders';

/*
 * The engine keeps explosions between units, walks flat arrays and keeps its slots as records; the
 * reference (line-risk-reference.ts) explodes every unit afresh with plain objects. On any plant
 * they must give exactly the same answer — the rules themselves are checked in line-risk.test.ts
 * against worked cases and published definitions; this only checks that the fast path changes
 * nothing. No outside source: the reference is the plain form of the same walk.
 */

const FROM = '2026-03-02';
const TO = '2026-03-20';
const CALENDAR: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-03-10'] };
/** Quantities per: whole, binary fractions and one (0.3) that is not exact in binary. */
const QTY_PER = [1, 2, 3, 0.5, 0.25, 1.5, 0.3];
const UOMS = ['H87', 'KGM', 'SET'];

/**
 * A small plant: models M…, made parts F… (with stock, so units take them in turn), bought parts
 * B…; a line may point from any part to one later in the order models, made, bought — so models
 * can be components of models, made parts of made parts, and a part can be reached along several
 * paths and at several levels of one unit, and the structure stays acyclic.
 */
const plantArbitrary = fc
  .record({
    models: fc.integer({ min: 1, max: 3 }),
    made: fc.array(fc.record({ lead: fc.integer({ min: 0, max: 3 }), stock: fc.integer({ min: 0, max: 4 }) }), {
      maxLength: 4,
    }),
    bought: fc.array(
      fc.record({
        lead: fc.integer({ min: 0, max: 6 }),
        stock: fc.integer({ min: -2, max: 12 }),
        uom: fc.constantFrom(...UOMS),
        countDue: fc.boolean(),
        loop: fc.option(
          fc.record({
            cards: fc.integer({ min: 1, max: 4 }),
            container: fc.integer({ min: 1, max: 6 }),
            days: fc.integer({ min: 1, max: 4 }),
            empty: fc.integer({ min: 0, max: 2 }),
          }),
          { freq: 4 },
        ),
      }),
      { minLength: 1, maxLength: 6 },
    ),
    lines: fc.array(
      fc.record({
        from: fc.nat(),
        to: fc.nat(),
        qtyPer: fc.constantFrom(...QTY_PER),
        effective: fc.option(fc.record({ day: fc.integer({ min: -3, max: 20 }), until: fc.boolean() }), {
          freq: 5,
        }),
      }),
      { minLength: 1, maxLength: 24 },
    ),
    slots: fc.array(
      fc.record({
        // Mostly the first two weeks, so several units of a model often share a day.
        day: fc.oneof(fc.integer({ min: -3, max: 9 }), fc.integer({ min: 10, max: 18 })),
        model: fc.nat(),
        qty: fc.constantFrom(1, 1, 1, 2, 0.5),
      }),
      { maxLength: 40 },
    ),
    receipts: fc.array(
      fc.record({ part: fc.nat(), day: fc.integer({ min: -3, max: 20 }), qty: fc.integer({ min: 1, max: 8 }) }),
      { maxLength: 8 },
    ),
    today: fc.integer({ min: -2, max: 4 }),
    frozenWindowDays: fc.integer({ min: 0, max: 4 }),
  })
  .map((raw): LineRiskInput => {
    const models = Array.from({ length: raw.models }, (_, index) => `M${index}`);
    const made = raw.made.map((_, index) => `F${index}`);
    const bought = raw.bought.map((_, index) => `B${index}`);
    const names = [...models, ...made, ...bought];
    const parents = models.length + made.length;
    const bom: PlanningBomLine[] = [];
    for (const line of raw.lines) {
      const parent = line.from % parents;
      const component = parent + 1 + (line.to % (names.length - parent - 1));
      const date = line.effective ? addCalendarDays(FROM, line.effective.day) : null;
      bom.push({
        parent: names[parent]!,
        component: names[component]!,
        qtyPer: line.qtyPer,
        scrapPct: 0,
        effectiveFrom: line.effective && !line.effective.until ? date : null,
        effectiveTo: line.effective?.until ? date : null,
      });
    }
    const parts: LineRiskPart[] = [
      ...models.map((partNumber) => ({
        partNumber,
        source: 'end_item' as const,
        leadTimeDays: 0,
        packQty: 1,
        onHand: 0,
        safetyStock: 0,
      })),
      ...raw.made.map((fields, index) => ({
        partNumber: made[index]!,
        source: 'make' as const,
        leadTimeDays: fields.lead,
        packQty: 1,
        onHand: fields.stock,
        safetyStock: 0,
      })),
      ...raw.bought.map((fields, index) => ({
        partNumber: bought[index]!,
        source: 'buy' as const,
        supplierCode: 'SUP',
        leadTimeDays: fields.lead,
        packQty: 1,
        onHand: fields.stock,
        safetyStock: 0,
        uom: fields.uom,
        countDue: fields.countDue,
        replenishment: fields.loop ? ('kanban' as const) : ('scheduled' as const),
      })),
    ];
    const loops: LoopSupply[] = raw.bought.flatMap((fields, index) =>
      fields.loop
        ? [
            {
              partNumber: bought[index]!,
              activeCards: fields.loop.cards,
              recommendedCards: fields.loop.cards + 1,
              containerQty: fields.loop.container,
              replenishmentDays: fields.loop.days,
              emptyCards: fields.loop.empty,
            },
          ]
        : [],
    );
    const sequence: SequenceSlot[] = raw.slots.map((slot, index) => ({
      date: addCalendarDays(FROM, slot.day),
      sequence: index + 1,
      model: models[slot.model % models.length]!,
      serial: `SN${index}`,
      qty: slot.qty,
    }));
    const firmReceipts = raw.receipts.map((receipt) => ({
      partNumber: bought[receipt.part % bought.length]!,
      date: addCalendarDays(FROM, receipt.day),
      qty: receipt.qty,
    }));
    return {
      parts,
      bom,
      sequence,
      firmReceipts,
      loops,
      calendar: CALENDAR,
      from: FROM,
      to: TO,
      today: addCalendarDays(FROM, raw.today),
      frozenWindowDays: raw.frozenWindowDays,
    };
  });

describe('computeLineRisk against the plain walk', () => {
  it('gives exactly the answer of exploding every unit afresh, on any small plant', () => {
    fc.assert(
      fc.property(plantArbitrary, (input) => {
        expect(computeLineRisk(input)).toEqual(referenceLineRisk(input));
      }),
      { numRuns: 400 },
    );
  }, 60_000);

  it('pages units and slots at risk exactly as the whole answer lists them', () => {
    fc.assert(
      fc.property(plantArbitrary, fc.nat({ max: 6 }), fc.integer({ min: 1, max: 5 }), (input, offset, limit) => {
        const run = walkLineRisk(input);
        const whole = referenceLineRisk(input);

        expect(run.unitsAtRiskCount).toBe(whole.unitsAtRisk.length);
        expect(run.unitsAtRisk(offset, limit)).toEqual(whole.unitsAtRisk.slice(offset, offset + limit));
        whole.shortages.forEach((shortage, index) => {
          expect(run.shortageIndex(shortage.partNumber)).toBe(index);
          expect(run.slotsAtRiskCount(index)).toBe(shortage.slotsAtRisk.length);
          expect(run.slotsAtRisk(index, offset, limit)).toEqual(shortage.slotsAtRisk.slice(offset, offset + limit));
        });
      }),
      { numRuns: 200 },
    );
  }, 60_000);

  it('finds the generated plants at risk often enough to compare something', () => {
    // Guards the generator: were no unit ever short, the comparisons above would prove little.
    const samples = fc.sample(plantArbitrary, { numRuns: 200, seed: 7 });
    const atRisk = samples.filter((input) => referenceLineRisk(input).unitsAtRisk.length > 0).length;
    const taking = samples.filter((input) =>
      input.parts.some(
        (part) =>
          part.source === 'make' && part.onHand > 0 && input.bom.some((line) => line.component === part.partNumber),
      ),
    ).length;

    expect(atRisk).toBeGreaterThan(50);
    expect(taking).toBeGreaterThan(50);
  });

  it('walks again after stock, BOM changes and builds exactly as a walk afresh would', () => {
    // The walker keeps its last walk and, after a change to bought parts' supply or to lines of
    // bought components alone, or after the first units were built, walks only the parts that
    // changed again; any other change is walked in full. Every answer must be the plain walk's.
    const change = fc.record({
      kind: fc.constantFrom(
        'stock',
        'stock',
        'stock',
        'count',
        'receipt',
        'dropReceipt',
        'loop',
        'made',
        'sequence',
        'lineQty',
        'lineQty',
        'lineAdd',
        'lineDrop',
        'lineDates',
        'lineScrap',
        'build',
        'build',
        'build',
        'move',
        'move',
        'addUnit',
        'dropUnit',
        'leadTime',
        'leadTime',
        'uom',
        'replenishment',
        'rename',
        'holiday',
        'holiday',
      ),
      pick: fc.nat(),
      qty: fc.integer({ min: -4, max: 9 }),
      day: fc.integer({ min: -2, max: 18 }),
    });
    const kinds: Record<WalkKind, number> = { full: 0, parts: 0, bom: 0, built: 0, judged: 0, kept: 0 };
    fc.assert(
      fc.property(plantArbitrary, fc.array(change, { minLength: 1, maxLength: 6 }), (plant, changes) => {
        const walker = new LineRiskWalker();
        let input = plant;
        expect(walker.walk(input).result()).toEqual(referenceLineRisk(input));
        for (const step of changes) {
          input = changed(input, step);
          expect(walker.walk(input).result()).toEqual(referenceLineRisk(input));
          kinds[walker.lastKind] += 1;
        }
      }),
      { numRuns: 1000 },
    );
    // Guards the generator: each way of walking again must have been compared, and often.
    console.log(kinds);
    expect(kinds.parts).toBeGreaterThan(100);
    expect(kinds.bom).toBeGreaterThan(100);
    expect(kinds.built).toBeGreaterThan(100);
    expect(kinds.judged).toBeGreaterThan(100);
    expect(kinds.kept).toBeGreaterThan(50);
    expect(kinds.full).toBeGreaterThan(50);
  }, 120_000);
  it('walks alike with the queue view walked from a flat copy of its job, as the helper thread walks it', () => {
    // The server has the queue view of a large walk afresh walked in another thread, from the job
    // copied into flat arrays (shared memory there, plain here); a later walk keeps its entries.
    let handed = 0;
    const memory: Memory = (bytes) => new ArrayBuffer(bytes);
    const flatHelper: QueueHelper = (job) => {
      handed += 1;
      const flat = flattenQueueJob(job, memory);
      const entries = flatEntries(flat, memory);
      walkFlatQueueJob(flat, entries);
      return { ready: () => entries, keep: () => ownEntries(entries) };
    };
    const change = fc.record({
      kind: fc.constantFrom('stock', 'made', 'leadTime', 'move', 'build', 'holiday'),
      pick: fc.nat(),
      qty: fc.integer({ min: -4, max: 9 }),
      day: fc.integer({ min: -2, max: 18 }),
    });
    const kinds: Record<WalkKind, number> = { full: 0, parts: 0, bom: 0, built: 0, judged: 0, kept: 0 };
    fc.assert(
      fc.property(plantArbitrary, change, (plant, step) => {
        const walker = new LineRiskWalker(flatHelper);
        expect(walker.walk(plant).result()).toEqual(referenceLineRisk(plant));
        // The worker groups the units' needs ahead a slice at a time while idle: the next walk may
        // find some of them grouped, all, or none.
        for (let slice = 0; slice < step.pick % 4; slice += 1) walker.groupAhead(2);
        const after = changed(plant, step);
        expect(walker.walk(after).result()).toEqual(referenceLineRisk(after));
        kinds[walker.lastKind] += 1;
      }),
      { numRuns: 300 },
    );
    expect(handed).toBeGreaterThanOrEqual(300);
    // Walks after one the helper walked go on as after any other: part by part after a stock change.
    expect(kinds.parts).toBeGreaterThan(20);
    expect(kinds.judged).toBeGreaterThan(50);
  });
  it('works the resequence rescue out again when a unit it tried needs a changed part', () => {
    // M0 on Tuesday lacks B1; M1 on Wednesday needs one B0. With one B0 on hand M1 could take M0's
    // place; with none on hand (one arrives on Wednesday) it is still built on its own day, but can
    // no longer move forward. Every unit keeps its verdict, only the rescue changes.
    const before: LineRiskInput = {
      ...smallPlant(
        [model('M0'), model('M1'), bought('B0', { onHand: 1 }), bought('B1')],
        [bomLine('M0', 'B1'), bomLine('M1', 'B0')],
        [unit('2026-03-03', 1, 'M0', 'SN1'), unit('2026-03-04', 2, 'M1', 'SN2')],
      ),
      firmReceipts: [{ partNumber: 'B0', date: '2026-03-04', qty: 1 }],
    };
    const after = { ...before, parts: before.parts.map((p) => (p.partNumber === 'B0' ? { ...p, onHand: 0 } : p)) };
    const walker = new LineRiskWalker();

    expect(walker.walk(before).unitsAtRisk()[0]!.resequence?.candidate.serial).toBe('SN2');
    expect(walker.walk(after).unitsAtRisk()[0]!.resequence).toBeNull();
    expect(walker.walk(after).result()).toEqual(referenceLineRisk(after));
    // And back: M1 lacked only the changed part when it was tried, so now it fits.
    const back = new LineRiskWalker();
    back.walk(after);
    expect(back.walk(before).unitsAtRisk()[0]!.resequence?.candidate.serial).toBe('SN2');
  });
  it('groups the last walk ahead a slice of units at a time, and says when none are left', () => {
    const plant = smallPlant(
      [model('M0'), bought('B0')],
      [bomLine('M0', 'B0')],
      [unit(FROM, 1, 'M0', 'SN1'), unit(FROM, 2, 'M0', 'SN2'), unit(FROM, 3, 'M0', 'SN3')],
    );
    const walker = new LineRiskWalker();
    expect(walker.groupAhead(2)).toBe(false);
    walker.walk(plant);

    expect([walker.groupAhead(2), walker.groupAhead(2), walker.groupAhead(2)]).toEqual([true, false, false]);
    // A new walk starts from its first unit again.
    walker.walk(plant);
    expect(walker.groupAhead(3)).toBe(false);
  });
  it('keeps each unit its own lacks when walked again', () => {
    // Found by the property above: M0 needs B0 twice (through M1 on two lines), M1 once; a unit's
    // lacks must not take another unit's after its search is made again.
    const before = smallPlant(
      [model('M0'), model('M1'), bought('B0')],
      [bomLine('M0', 'M1'), bomLine('M1', 'B0'), bomLine('M0', 'M1')],
      [unit(FROM, 1, 'M1', 'SN0'), unit(FROM, 2, 'M0', 'SN1')],
    );
    const after = { ...before, parts: [before.parts[0]!, before.parts[1]!, bought('B0', { onHand: -1 })] };
    const walker = new LineRiskWalker();
    walker.walk(before);

    expect(walker.walk(after).result()).toEqual(referenceLineRisk(after));
    expect(walker.lastKind).toBe('parts');
  });
  it('walks a change to lines of bought components part by part, and judges every unit again after one to a made component', () => {
    // M0 takes one B1 and one F0 (made, none in stock), which takes one B0. Only B1 is on hand.
    const made: LineRiskPart = { ...bought('F0'), source: 'make' };
    const before = smallPlant(
      [model('M0'), made, bought('B0'), bought('B1', { onHand: 3 })],
      [bomLine('M0', 'B1'), bomLine('M0', 'F0'), bomLine('F0', 'B0')],
      [unit('2026-03-03', 1, 'M0', 'SN1'), unit('2026-03-04', 2, 'M0', 'SN2')],
    );
    const withLines = (lines: PlanningBomLine[]) => ({ ...before, bom: lines });
    const walker = new LineRiskWalker();
    walker.walk(before);

    // Two B1 a unit: the second unit lacks it too.
    const boughtQty = withLines([bomLine('M0', 'B1', 2), before.bom[1]!, before.bom[2]!]);
    expect(walker.walk(boughtQty).result()).toEqual(referenceLineRisk(boughtQty));
    expect(walker.lastKind).toBe('bom');
    // The scrap allowance is for ordering: nothing the walk reads changed.
    const scrap = withLines([{ ...boughtQty.bom[0]!, scrapPct: 10 }, before.bom[1]!, before.bom[2]!]);
    expect(walker.walk(scrap).result()).toEqual(referenceLineRisk(scrap));
    expect(walker.lastKind).toBe('kept');
    // Two F0 a unit: made parts are taken in turn, so every unit is judged again, those of M0 exploded anew.
    const madeQty = withLines([scrap.bom[0]!, bomLine('M0', 'F0', 2), before.bom[2]!]);
    expect(walker.walk(madeQty).result()).toEqual(referenceLineRisk(madeQty));
    expect(walker.lastKind).toBe('judged');
  });
  it('judges every unit again when a BOM change moves made stock another model takes', () => {
    // M0 and M1 each take one F0 (made, two in stock, made from B0 of which there is none). At two
    // F0 a unit, SN1 (M0) takes both and SN2 (M1) lacks B0 for the F0 it must now make.
    const made: LineRiskPart = { ...bought('F0', { onHand: 2 }), source: 'make' };
    const before = smallPlant(
      [model('M0'), model('M1'), made, bought('B0')],
      [bomLine('M0', 'F0'), bomLine('M1', 'F0'), bomLine('F0', 'B0')],
      [unit('2026-03-03', 1, 'M0', 'SN1'), unit('2026-03-04', 2, 'M1', 'SN2')],
    );
    const after = { ...before, bom: [bomLine('M0', 'F0', 2), before.bom[1]!, before.bom[2]!] };
    const walker = new LineRiskWalker();

    expect(walker.walk(before).unitsAtRiskCount).toBe(0);
    const run = walker.walk(after);

    expect(run.result()).toEqual(referenceLineRisk(after));
    expect(run.unitsAtRisk(0, 5).map((unit) => unit.serial)).toEqual(['SN2']);
    expect(walker.lastKind).toBe('judged');
  });
  it('takes units built at the head of the sequence out, and judges the others again after a unit at risk was built', () => {
    // Three units of M0, one B0 each; two B0 on hand. The third lacks B0.
    const before = smallPlant(
      [model('M0'), bought('B0', { onHand: 2 })],
      [bomLine('M0', 'B0')],
      [unit(FROM, 1, 'M0', 'SN1'), unit(FROM, 2, 'M0', 'SN2'), unit('2026-03-03', 3, 'M0', 'SN3')],
    );
    const walker = new LineRiskWalker();
    walker.walk(before);

    // SN1 built: its B0 was backflushed (one left), and SN3 still lacks it.
    const first = built(before, 1);
    expect(first.parts[1]!.onHand).toBe(1);
    expect(walker.walk(first).result()).toEqual(referenceLineRisk(first));
    expect(walker.lastKind).toBe('built');
    // SN2 built too, then SN3 (at risk in the walk) built anyway: on-hand goes below zero.
    const second = built(first, 1);
    expect(walker.walk(second).result()).toEqual(referenceLineRisk(second));
    expect(walker.lastKind).toBe('built');
    const third = built(second, 1);
    expect(third.parts[1]!.onHand).toBe(-1);
    expect(walker.walk(third).result()).toEqual(referenceLineRisk(third));
    expect(walker.lastKind).toBe('judged');
  });
  it('judges the units again after a unit at risk took made stock, exploding again a unit whose made stock moved', () => {
    // M0 takes one S (made, one on hand, else made from one B0) and one B1 (none on hand): SN1 is
    // at risk for B1 but takes the S in stock; SN2 must have its S made, so it needs a B0.
    const before = smallPlant(
      [model('M0'), bought('S', { source: 'make', onHand: 1 }), bought('B0', { onHand: 5 }), bought('B1')],
      [bomLine('M0', 'S'), bomLine('S', 'B0'), bomLine('M0', 'B1')],
      [unit(FROM, 1, 'M0', 'SN1'), unit(FROM, 2, 'M0', 'SN2')],
    );
    const walker = new LineRiskWalker();
    expect(
      walker
        .walk(before)
        .unitsAtRisk()
        .map((slot) => slot.serial),
    ).toEqual(['SN1', 'SN2']);

    // SN1 built anyway: the backflush took the S it was to take, and a B1 that was not there.
    const first = built(before, 1);
    expect(first.parts.map((part) => part.onHand)).toEqual([0, 0, 5, -1]);
    expect(walker.walk(first).result()).toEqual(referenceLineRisk(first));
    expect(walker.lastKind).toBe('judged');
    // The same build with an S counted as well: SN2 now takes it from stock, so it is exploded again.
    const counted = {
      ...first,
      parts: first.parts.map((part) => (part.partNumber === 'S' ? { ...part, onHand: 1 } : part)),
    };
    const again = new LineRiskWalker();
    again.walk(before);
    expect(again.walk(counted).result()).toEqual(referenceLineRisk(counted));
    expect(again.lastKind).toBe('judged');
  });
  it('judges every unit again after the lead time of a made part moved, exploding anew the units that pass it', () => {
    // M0 takes one S (made, none in stock), which takes one B0; one B0 arrives on Wednesday. SN1 is
    // built on Thursday: made the same day, S finds the B0; made two working days ahead (Tuesday),
    // it does not.
    const before: LineRiskInput = {
      ...smallPlant(
        [model('M0'), bought('S', { source: 'make', leadTimeDays: 0 }), bought('B0')],
        [bomLine('M0', 'S'), bomLine('S', 'B0')],
        [unit('2026-03-05', 1, 'M0', 'SN1')],
      ),
      firmReceipts: [{ partNumber: 'B0', date: '2026-03-04', qty: 1 }],
    };
    const after = { ...before, parts: before.parts.map((p) => (p.partNumber === 'S' ? { ...p, leadTimeDays: 2 } : p)) };
    const walker = new LineRiskWalker();

    expect(walker.walk(before).unitsAtRisk()).toEqual([]);
    expect(walker.walk(after).result()).toEqual(referenceLineRisk(after));
    expect(walker.lastKind).toBe('judged');
    expect(
      walker
        .walk(after)
        .unitsAtRisk()
        .map((slot) => slot.serial),
    ).toEqual(['SN1']);
  });
  it('judges the units again after a holiday weeks ahead, and walks in full after one on a day the walk reads', () => {
    // M0 takes one S (made, none in stock, two working days to make), which takes one B0 (none) by a
    // line effective from Thursday 26 February. SN1 on Monday 2 March starts S on Thursday: it needs
    // the B0 and is at risk. A holiday on Friday 27 February moves the start to Wednesday, before
    // the line: SN1 builds.
    const before = smallPlant(
      [model('M0'), bought('S', { source: 'make', leadTimeDays: 2 }), bought('B0')],
      [bomLine('M0', 'S'), { ...bomLine('S', 'B0'), effectiveFrom: '2026-02-26' }],
      [unit(FROM, 1, 'M0', 'SN1')],
    );
    const withHoliday = (date: string): LineRiskInput => ({
      ...before,
      calendar: { ...before.calendar, holidays: [...before.calendar.holidays, date] },
    });
    const weeksAhead = withHoliday('2026-04-15');
    const beforeStart = withHoliday('2026-02-27');
    const inside = withHoliday('2026-03-12');
    const walker = new LineRiskWalker();
    const serials = (input: LineRiskInput) =>
      walker
        .walk(input)
        .unitsAtRisk()
        .map((slot) => slot.serial);

    expect(serials(before)).toEqual(['SN1']);
    expect(walker.walk(weeksAhead).result()).toEqual(referenceLineRisk(weeksAhead));
    expect(walker.lastKind).toBe('judged');
    expect(serials(beforeStart)).toEqual([]);
    expect(walker.lastKind).toBe('full');
    expect(walker.walk(inside).result()).toEqual(referenceLineRisk(inside));
    expect(walker.lastKind).toBe('full');
  });
  it("judges the units again after a part's unit or replenishment changed", () => {
    // B0 in kilograms: SN1 lacks half a kilogram. Counted in pieces, it lacks a whole one.
    const before = smallPlant(
      [model('M0'), bought('B0', { uom: 'KGM', replenishment: 'scheduled' })],
      [bomLine('M0', 'B0', 0.5)],
      [unit('2026-03-03', 1, 'M0', 'SN1')],
    );
    const inPieces = { ...before, parts: [before.parts[0]!, { ...before.parts[1]!, uom: 'H87' }] };
    const onLoop: LineRiskInput = {
      ...inPieces,
      parts: [inPieces.parts[0]!, { ...inPieces.parts[1]!, replenishment: 'kanban' }],
      loops: [
        { partNumber: 'B0', activeCards: 2, recommendedCards: 2, containerQty: 1, replenishmentDays: 1, emptyCards: 1 },
      ],
    };
    const walker = new LineRiskWalker();
    const lack = (input: LineRiskInput) => walker.walk(input).unitsAtRisk()[0]!.lacks[0]!.qty;

    expect(lack(before)).toBe(0.5);
    expect(lack(inPieces)).toBe(1);
    expect(walker.lastKind).toBe('judged');
    expect(walker.walk(onLoop).result()).toEqual(referenceLineRisk(onLoop));
    expect(walker.lastKind).toBe('judged');
  });
  it('walks in full once in so many walks, however the changes could be walked again', () => {
    const before = smallPlant(
      [model('M0'), bought('B0', { onHand: 5 })],
      [bomLine('M0', 'B0')],
      [unit(FROM, 1, 'M0', 'SN1'), unit('2026-03-03', 1, 'M0', 'SN2')],
    );
    const walker = new LineRiskWalker();
    walker.walk(before);
    const kinds: WalkKind[] = [];
    let input = before;
    for (let change = 1; change <= WALKS_BEFORE_FULL + 1; change += 1) {
      input = {
        ...input,
        parts: input.parts.map((p) => (p.partNumber === 'B0' ? { ...p, onHand: 5 + (change % 3) } : p)),
      };
      walker.walk(input);
      kinds.push(walker.lastKind);
    }

    expect(kinds.slice(0, WALKS_BEFORE_FULL).every((kind) => kind !== 'full')).toBe(true);
    expect(kinds[WALKS_BEFORE_FULL]).toBe('full');
    expect(walker.walk(input).result()).toEqual(referenceLineRisk(input));
  });
  it('walks in full when a part gains or loses a field, whatever the count of fields', () => {
    // Found in review: a part that drops its uom (so counts in pieces) and gains countDue has as
    // many fields as before; it is not a change of stock alone.
    const kilos = bought('B0', { uom: 'KGM' });
    const before = smallPlant([model('M0'), kilos], [bomLine('M0', 'B0', 0.5)], [unit('2026-03-03', 1, 'M0', 'SN1')]);
    const { uom: _uom, ...withoutUom } = kilos;
    const after = { ...before, parts: [before.parts[0]!, { ...withoutUom, countDue: false }] };
    const walker = new LineRiskWalker();
    walker.walk(before);

    expect(walker.walk(after).result()).toEqual(referenceLineRisk(after));
    expect(walker.lastKind).toBe('full');
  });

  it("tries the board's moves from its walker exactly as afresh, with the plain walk's units at risk", () => {
    // The Build sequence board keeps one walker: each move it tries is walked from the last walk.
    const move = fc.record({ pick: fc.nat(), to: fc.nat(), place: fc.nat() });
    let moved = 0;
    fc.assert(
      fc.property(plantArbitrary, fc.array(move, { minLength: 1, maxLength: 4 }), (input, moves) => {
        const walker = new LineRiskWalker();
        const before = sequenceOutlook(input, walker);
        expect(before.unitsAtRisk).toEqual(referenceLineRisk(input).unitsAtRisk);
        for (const step of moves) {
          const orders = movedOrders(input.sequence, step);
          if (!orders) continue;
          const tried = tryResequence(input, before, orders, walker);
          expect(tried).toEqual(tryResequence(input, before, orders));
          const after = { ...input, sequence: resequenced(input.sequence, orders) };
          expect(tried.after.unitsAtRisk).toEqual(referenceLineRisk(after).unitsAtRisk);
          if (tried.becomeAtRisk.length + tried.stopAtRisk.length > 0) moved += 1;
        }
      }),
      { numRuns: 300 },
    );
    // Guards the generator: moves that change which units are at risk must have been compared.
    expect(moved).toBeGreaterThan(30);
  }, 60_000);
});

/** One unit of the sequence moved to a place on a day, as the board's day orders; null without units. */
function movedOrders(
  sequence: readonly SequenceSlot[],
  { pick, to, place }: { pick: number; to: number; place: number },
): DayOrder[] | null {
  if (sequence.length === 0) return null;
  const unit = sequence[pick % sequence.length]!;
  const dates = [...new Set(sequence.map((slot) => slot.date))].sort();
  const toDate = dates[to % dates.length]!;
  const dayOf = (date: string) =>
    sequence
      .filter((slot) => slot.date === date && slot.serial !== unit.serial)
      .sort((a, b) => a.sequence - b.sequence)
      .map((slot) => slot.serial);
  const target = dayOf(toDate);
  target.splice(place % (target.length + 1), 0, unit.serial);
  const orders = [{ date: toDate, serials: target }];
  if (unit.date !== toDate) orders.push({ date: unit.date, serials: dayOf(unit.date) });
  return orders;
}

/** Parts, lines and units of the worked cases, with nothing but what each case is about. */
const bought = boughtPart;
const model = (partNumber: string): LineRiskPart => bought(partNumber, { source: 'end_item' });
const unit = sequenceUnit;
const smallPlant = (parts: LineRiskPart[], bom: PlanningBomLine[], sequence: SequenceSlot[]): LineRiskInput => ({
  parts,
  bom,
  sequence,
  firmReceipts: [],
  calendar: CALENDAR,
  from: FROM,
  to: TO,
});

/** The input after one change; unchanged pieces stay the same objects, as the server's worker keeps them. */
function changed(input: LineRiskInput, step: { kind: string; pick: number; qty: number; day: number }): LineRiskInput {
  const indices = (source: string) => input.parts.flatMap((part, index) => (part.source === source ? [index] : []));
  const withPart = (index: number, fields: Partial<LineRiskPart>) =>
    input.parts.map((part, at) => (at === index ? { ...part, ...fields } : part));
  const bought = indices('buy');
  const someBought = bought[step.pick % bought.length]!;
  switch (step.kind) {
    case 'stock':
      return { ...input, parts: withPart(someBought, { onHand: input.parts[someBought]!.onHand + step.qty }) };
    case 'count':
      return { ...input, parts: withPart(someBought, { countDue: !input.parts[someBought]!.countDue }) };
    case 'receipt':
      return {
        ...input,
        firmReceipts: [
          ...input.firmReceipts,
          {
            partNumber: input.parts[someBought]!.partNumber,
            date: addCalendarDays(FROM, step.day),
            qty: Math.abs(step.qty) + 1,
          },
        ],
      };
    case 'dropReceipt':
      return { ...input, firmReceipts: input.firmReceipts.filter((_, index) => index !== step.pick % 3) };
    case 'loop': {
      const loops = input.loops ?? [];
      if (loops.length === 0) return input;
      const at = step.pick % loops.length;
      return {
        ...input,
        loops: loops.map((loop, index) =>
          index === at
            ? { ...loop, emptyCards: Math.abs(step.qty) % 3, activeCards: loop.activeCards + (step.qty > 4 ? 1 : 0) }
            : loop,
        ),
      };
    }
    case 'made': {
      const made = indices('make');
      if (made.length === 0) return input;
      const part = made[step.pick % made.length]!;
      return { ...input, parts: withPart(part, { onHand: Math.max(0, input.parts[part]!.onHand + step.qty) }) };
    }
    case 'lineQty':
    case 'lineDates':
    case 'lineScrap': {
      // One line changed in place (quantity, effectivity, or the scrap allowance, which building ignores).
      if (input.bom.length === 0) return input;
      const at = step.pick % input.bom.length;
      const line = input.bom[at]!;
      const date = addCalendarDays(FROM, step.day);
      const edited: PlanningBomLine =
        step.kind === 'lineQty'
          ? { ...line, qtyPer: QTY_PER[Math.abs(step.qty) % QTY_PER.length]! }
          : step.kind === 'lineDates'
            ? {
                ...line,
                effectiveFrom: step.qty % 2 === 0 ? date : null,
                effectiveTo: step.qty % 2 === 0 ? null : date,
              }
            : { ...line, scrapPct: line.scrapPct + 5 };
      return { ...input, bom: input.bom.map((each, index) => (index === at ? edited : each)) };
    }
    case 'lineAdd': {
      // A new line from a model or made part to any part after it (acyclic, as the generator's).
      const parents = input.parts.filter((part) => part.source !== 'buy');
      const parent = step.pick % parents.length;
      const after = input.parts.slice(input.parts.indexOf(parents[parent]!) + 1);
      if (after.length === 0) return input;
      const component = after[Math.abs(step.qty * 7 + step.day) % after.length]!;
      const line = bomLine(parents[parent]!.partNumber, component.partNumber, QTY_PER[step.pick % QTY_PER.length]);
      return { ...input, bom: [...input.bom, line] };
    }
    case 'lineDrop':
      return { ...input, bom: input.bom.filter((_, index) => index !== step.pick % Math.max(1, input.bom.length)) };
    case 'build':
      return built(input, 1 + (step.pick % 2));
    case 'move':
    case 'addUnit': {
      // A unit moved to (or a new unit of its model added on) the day of another, at a place of its own.
      const { sequence } = input;
      if (sequence.length === 0) return input;
      const from = step.pick % sequence.length;
      const to = sequence[Math.abs(step.qty * 3 + step.day) % sequence.length]!;
      const place = to.sequence + (step.day % 2 === 0 ? 0.5 : -0.5);
      const moved = { ...sequence[from]!, date: to.date, sequence: place };
      if (step.kind === 'move') return { ...input, sequence: sequence.map((slot, at) => (at === from ? moved : slot)) };
      return { ...input, sequence: [...sequence, { ...moved, serial: `${moved.serial}-NEW${sequence.length}` }] };
    }
    case 'leadTime': {
      // The part master: a part's lead time changed.
      const part = step.pick % input.parts.length;
      return { ...input, parts: withPart(part, { leadTimeDays: Math.abs(step.qty) % 4 }) };
    }
    case 'uom': {
      // A part now counted in kilograms, or back in pieces: what is short by a fraction changes.
      const part = step.pick % input.parts.length;
      return { ...input, parts: withPart(part, { uom: input.parts[part]!.uom === 'KGM' ? 'H87' : 'KGM' }) };
    }
    case 'rename': {
      // A bought part given a new number that sorts first or last (the plant renumbered it): the
      // order parts are listed in by number changes, with the same count of parts.
      const from = input.parts[someBought]!.partNumber;
      const to = step.qty > 2 ? `A${from}` : `Z${from}`;
      const renamed = (partNumber: string) => (partNumber === from ? to : partNumber);
      return {
        ...input,
        parts: withPart(someBought, { partNumber: to }),
        bom: input.bom.map((line) => (line.component === from ? { ...line, component: to } : line)),
        firmReceipts: input.firmReceipts.map((receipt) => ({ ...receipt, partNumber: renamed(receipt.partNumber) })),
        loops: input.loops?.map((loop) => ({ ...loop, partNumber: renamed(loop.partNumber) })),
      };
    }
    case 'replenishment':
      // A bought part taken off its kanban loop (then ordered as scheduled), or put on one.
      return {
        ...input,
        parts: withPart(someBought, {
          replenishment: input.parts[someBought]!.replenishment === 'kanban' ? 'scheduled' : 'kanban',
        }),
      };
    case 'holiday': {
      // A holiday set or lifted: before the horizon (where subassemblies start), inside it, or weeks past it.
      const date = addCalendarDays(FROM, step.day * 3 - 12);
      const { holidays } = input.calendar;
      return {
        ...input,
        calendar: {
          ...input.calendar,
          holidays: holidays.includes(date) ? holidays.filter((holiday) => holiday !== date) : [...holidays, date],
        },
      };
    }
    case 'dropUnit':
      return {
        ...input,
        sequence: input.sequence.filter((_, at) => at !== step.pick % Math.max(1, input.sequence.length)),
      };
    default:
      return { ...input, sequence: input.sequence.slice(1) };
  }
}

/**
 * The input after the first `count` units in build order were reported built on the first day of
 * the horizon, as the server does it: each backflushed in turn (sharing subassembly stock), its
 * consumption taken from on-hand, and the unit gone from the units to build.
 */
function built(input: LineRiskInput, count: number): LineRiskInput {
  const inOrder = [...input.sequence]
    .filter((slot) => slot.qty > 0 && slot.date <= input.to)
    .sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.sequence - b.sequence));
  const units = inOrder.slice(0, count);
  if (units.length === 0) return input;
  const bom = bomByParent(input.bom);
  const sources = new Map(input.parts.map((part) => [part.partNumber, { source: part.source }]));
  const subassemblyStock = new Map(
    input.parts
      .filter((part) => part.source !== 'buy' && part.onHand > 0)
      .map((part) => [part.partNumber, part.onHand]),
  );
  const onHand = new Map(input.parts.map((part) => [part.partNumber, part.onHand]));
  for (const unit of units) {
    for (const [partNumber, qty] of backflush(unit.model, unit.qty, input.from, bom, sources, subassemblyStock)) {
      onHand.set(partNumber, roundQty(onHand.get(partNumber)! - qty));
    }
  }
  return {
    ...input,
    parts: input.parts.map((part) =>
      onHand.get(part.partNumber) === part.onHand ? part : { ...part, onHand: onHand.get(part.partNumber)! },
    ),
    sequence: input.sequence.filter((slot) => !units.includes(slot)),
  };
}
