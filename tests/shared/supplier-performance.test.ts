import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  addMonths,
  arrivalTiming,
  isYearMonth,
  lastDayOf,
  median,
  monthSpan,
  onTimeWindow,
  summarisePerformance,
  supplierPerformance,
  type PerformanceInput,
  type PerformanceLine,
  type PerformancePromise,
} from '../../shared/domain/supplier-performance';

// Definitions checked here (see the module's comment):
// - on-time against the date first asked for, and apart from it the promise kept against the
//   supplier's committed date: SCOR model, Reliability attribute, "delivery performance to customer
//   request date" beside "to customer commit date", and "% of orders delivered in full" (from memory);
// - fill rate: share of the quantity asked for that was delivered (Chopra & Meindl, Supply Chain
//   Management: Strategy, Planning, and Operation, 6th ed., ch. 3, inventory-related metrics —
//   from memory), usable goods only, capped per line.
// Dates: March 2026 on a Monday–Friday calendar (2026-03-02 is a Monday).

const calendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
const base = {
  from: '2026-03',
  to: '2026-04',
  today: '2026-05-10',
  calendar,
  tolerances: new Map(),
  releases: [],
} satisfies Partial<PerformanceInput>;
const line = (
  requestedDate: string,
  requestedQty: number,
  receipts: PerformanceLine['receipts'],
  supplierCode = 'SUP-A',
  promise: PerformancePromise | null = null,
): PerformanceLine => ({ supplierCode, requestedDate, requestedQty, promise, receipts });
const good = (qty: number, receivedOn: string) => ({ qty, receivedOn, usable: true });

describe('supplierPerformance — hand-worked lines', () => {
  it('fills against what was first asked and keeps the promise apart: asked 48, confirmed 36, delivered 36', () => {
    const input: PerformanceInput = {
      ...base,
      lines: [line('2026-03-10', 48, [good(36, '2026-03-10')], 'SUP-A', { qty: 36, arrivalDate: '2026-03-10' })],
    };

    const [march] = supplierPerformance(input);

    // Fill 36 ÷ 48 = 0.75; the promise (36 on 03-10) was kept in full and on the day: 1 of 1.
    expect(march).toMatchObject({ requestedQty: 48, filledQty: 36, fillRate: 0.75 });
    expect(march).toMatchObject({ promisedLines: 1, promiseKeptLines: 1, promiseKeptRate: 1 });
    expect(march).toMatchObject({ lines: 1, onTimeLines: 1, onTimeRate: 1 });
  });

  it('counts goods nine working days early as early, not on time', () => {
    // Asked for Friday 03-20; received Monday 03-09: 10, 11, 12, 13, 16, 17, 18, 19, 20 = nine working days early.
    const input: PerformanceInput = { ...base, lines: [line('2026-03-20', 20, [good(20, '2026-03-09')])] };

    const [march] = supplierPerformance(input);

    expect(march).toMatchObject({ lines: 1, onTimeLines: 0, earlyLines: 1, lateLines: 0, onTimeRate: 0 });
    // Early goods still fill: timing is the on-time figure's business.
    expect(march.fillRate).toBe(1);
  });

  it('measures on-time inside [requested − early, requested + late] working days', () => {
    const input: PerformanceInput = {
      ...base,
      tolerances: new Map([['SUP-B', { earlyToleranceDays: 0, lateToleranceDays: 2 }]]),
      lines: [
        // Default window (1 early, 0 late): Monday 03-16 opens on Friday 03-13 across the weekend.
        line('2026-03-16', 10, [good(10, '2026-03-13')]), // on time
        line('2026-03-24', 10, [good(10, '2026-03-25')]), // a day late
        line('2026-03-26', 10, [good(4, '2026-03-26'), good(6, '2026-03-27')]), // the rest a day late → late
        line('2026-03-30', 10, []), // nothing came → late
        // SUP-B: 0 early, 2 late. Thursday 03-12 + 2 working days = Monday 03-16.
        line('2026-03-12', 10, [good(10, '2026-03-16')], 'SUP-B'), // on time
        line('2026-03-12', 10, [good(10, '2026-03-11')], 'SUP-B'), // a day early
      ],
    };

    const [supA, supB] = supplierPerformance(input);

    expect(supA).toMatchObject({ lines: 4, onTimeLines: 1, earlyLines: 0, lateLines: 3, onTimeRate: 0.25 });
    // Fill: (10 + 10 + 10 + 0) / 40.
    expect(supA).toMatchObject({ requestedQty: 40, filledQty: 30, fillRate: 0.75 });
    expect(supB).toMatchObject({ lines: 2, onTimeLines: 1, earlyLines: 1, lateLines: 0 });
  });

  it('caps fill per line, leaves out damaged goods and breaks a promise delivered short', () => {
    const input: PerformanceInput = {
      ...base,
      lines: [
        // Over: 25 against 10 fills 10 only.
        line('2026-03-25', 10, [good(25, '2026-03-25')]),
        // 30 good and 10 damaged against 40 confirmed for 03-20: short of the promise → not kept.
        line(
          '2026-03-20',
          40,
          [good(30, '2026-03-20'), { qty: 10, receivedOn: '2026-03-20', usable: false }],
          'SUP-A',
          {
            qty: 40,
            arrivalDate: '2026-03-20',
          },
        ),
        // Asked for 03-10, answered 03-17 and came on 03-17: late to the request, promise kept.
        line('2026-03-10', 5, [good(5, '2026-03-17')], 'SUP-A', { qty: 5, arrivalDate: '2026-03-17' }),
      ],
    };

    const [march] = supplierPerformance(input);

    // Fill (10 + 30 + 5) / (10 + 40 + 5) = 45 / 55; on time 2 of 3; promise kept 1 of 2.
    expect(march).toMatchObject({ requestedQty: 55, filledQty: 45, onTimeLines: 2, lateLines: 1 });
    expect(march).toMatchObject({ promisedLines: 2, promiseKeptLines: 1, promiseKeptRate: 0.5 });
  });
});

describe('onTimeWindow and arrivalTiming', () => {
  it('opens the window on working days and calls nothing received late', () => {
    const window = onTimeWindow('2026-03-16', { earlyToleranceDays: 1, lateToleranceDays: 1 }, calendar);

    expect(window).toEqual({ from: '2026-03-13', to: '2026-03-17' });
    expect(arrivalTiming([], window)).toBe('late');
    expect(arrivalTiming([{ qty: 1, receivedOn: '2026-03-16', usable: false }], window)).toBe('late');
    expect(arrivalTiming([good(1, '2026-03-12')], window)).toBe('early');
    expect(arrivalTiming([good(1, '2026-03-13'), good(1, '2026-03-17')], window)).toBe('on-time');
  });
});

describe('supplierPerformance — rows', () => {
  it('leaves out requested dates outside the months and windows not yet closed', () => {
    const input: PerformanceInput = {
      ...base,
      from: '2026-05',
      to: '2026-05',
      tolerances: new Map([['SUP-B', { earlyToleranceDays: 1, lateToleranceDays: 1 }]]),
      lines: [
        line('2026-04-30', 10, []), // month before the range
        line('2026-05-08', 10, [good(10, '2026-05-08')]), // Friday, window closed: measured
        line('2026-05-10', 10, []), // today: not yet decided
        line('2026-05-09', 10, [], 'SUP-B'), // SUP-B's window runs to 05-11: not yet decided
        line('2026-05-20', 10, []), // future
      ],
    };

    const rows = supplierPerformance(input);

    // Only the 2026-05-08 line counts: 1 line, on time, 10 / 10 filled.
    expect(rows).toEqual([
      expect.objectContaining({
        month: '2026-05',
        lines: 1,
        onTimeLines: 1,
        onTimeRate: 1,
        requestedQty: 10,
        filledQty: 10,
        fillRate: 1,
      }),
    ]);
  });

  it('measures confirmation latency per release and keeps unanswered releases apart', () => {
    const input: PerformanceInput = {
      ...base,
      lines: [],
      releases: [
        // 06:00 → 08:00 the same day = 2 h.
        {
          supplierCode: 'SUP-B',
          firstNeedDate: '2026-04-02',
          sentAt: '2026-03-30T06:00:00.000Z',
          confirmedAt: '2026-03-30T08:00:00.000Z',
        },
        // 06:00 → 12:00 next day = 30 h.
        {
          supplierCode: 'SUP-B',
          firstNeedDate: '2026-04-06',
          sentAt: '2026-04-01T06:00:00.000Z',
          confirmedAt: '2026-04-02T12:00:00.000Z',
        },
        // 06:00 → 10:00 = 4 h.
        {
          supplierCode: 'SUP-B',
          firstNeedDate: '2026-04-09',
          sentAt: '2026-04-03T06:00:00.000Z',
          confirmedAt: '2026-04-03T10:00:00.000Z',
        },
        { supplierCode: 'SUP-B', firstNeedDate: '2026-04-14', sentAt: '2026-04-07T06:00:00.000Z', confirmedAt: null },
        // Never sent: not a release the supplier could answer.
        { supplierCode: 'SUP-B', firstNeedDate: '2026-04-15', sentAt: null, confirmedAt: null },
      ],
    };

    const [april] = supplierPerformance(input);

    // Answered: 2, 30, 4 h → sorted 2, 4, 30 → median 4; mean (2 + 30 + 4) / 3 = 12.
    expect(april).toMatchObject({
      supplierCode: 'SUP-B',
      month: '2026-04',
      releases: 4,
      confirmedReleases: 3,
      unansweredReleases: 1,
    });
    expect(april.confirmationHoursMedian).toBe(4);
    expect(april.confirmationHoursMean).toBe(12);
    // No lines: the line rates have nothing to measure.
    expect(april).toMatchObject({ lines: 0, onTimeRate: null, fillRate: null });
  });

  it('splits rows by supplier and by month, sorted by supplier then month', () => {
    const input: PerformanceInput = {
      ...base,
      lines: [line('2026-04-01', 5, [], 'SUP-B'), line('2026-04-01', 5, []), line('2026-03-31', 5, [])],
    };

    const rows = supplierPerformance(input);

    expect(rows.map((row) => `${row.supplierCode} ${row.month} ${row.lines}`)).toEqual([
      'SUP-A 2026-03 1',
      'SUP-A 2026-04 1',
      'SUP-B 2026-04 1',
    ]);
  });
});

describe('summarisePerformance', () => {
  it('weights the range by lines and quantity, not by averaging monthly rates', () => {
    const rows = supplierPerformance({
      ...base,
      lines: [
        // March: 1 line of 100, fully on time → rate 1.
        line('2026-03-05', 100, [good(100, '2026-03-05')]),
        // April: 3 lines of 10, none received → rate 0.
        line('2026-04-01', 10, []),
        line('2026-04-02', 10, []),
        line('2026-04-03', 10, []),
      ],
    });

    const [summary] = summarisePerformance(rows);

    // On-time 1 / 4 = 0.25 (the mean of monthly rates would be 0.5).
    // Fill 100 / 130 (the mean of monthly fill rates would be 0.5).
    expect(summary).toMatchObject({
      supplierCode: 'SUP-A',
      months: 2,
      lines: 4,
      onTimeLines: 1,
      onTimeRate: 0.25,
      requestedQty: 130,
      filledQty: 100,
    });
    expect(summary.fillRate).toBeCloseTo(100 / 130, 12);
  });
});

describe('median', () => {
  // Wikipedia, "Median", introduction (from memory): 1, 3, 3, 6, 7, 8, 9 → 6; 1, 2, 3, 4, 5, 6, 8, 9 → 4.5.
  it('takes the middle value of an odd count and the mean of the two middle values of an even count', () => {
    expect(median([9, 1, 3, 8, 3, 7, 6])).toBe(6);
    expect(median([1, 2, 3, 4, 5, 6, 8, 9])).toBe(4.5);
    expect(median([])).toBeNull();
  });
});

describe('months', () => {
  it('steps across year ends and knows month lengths', () => {
    // Gregorian calendar: 2024 is a leap year (divisible by 4, not by 100), 2100 is not.
    expect(lastDayOf('2024-02')).toBe('2024-02-29');
    expect(lastDayOf('2100-02')).toBe('2100-02-28');
    expect(addMonths('2026-01', -1)).toBe('2025-12');
    expect(monthSpan('2025-11', '2026-04')).toBe(6);
    expect(isYearMonth('2026-13')).toBe(false);
    expect(isYearMonth('2026-1')).toBe(false);
  });
});

// --- Properties ---

const dayArb = fc.integer({ min: 1, max: 28 }).map((day) => `2026-03-${String(day).padStart(2, '0')}`);
const receiptArb = fc.record({ qty: fc.integer({ min: 0, max: 500 }), receivedOn: dayArb, usable: fc.boolean() });
const lineArb = fc.record({
  supplierCode: fc.constantFrom('SUP-A', 'SUP-B'),
  requestedDate: dayArb,
  requestedQty: fc.integer({ min: 1, max: 500 }),
  promise: fc.option(fc.record({ qty: fc.integer({ min: 1, max: 500 }), arrivalDate: dayArb })),
  receipts: fc.array(receiptArb, { maxLength: 4 }),
});
const instantArb = fc.integer({ min: Date.UTC(2026, 0, 1), max: Date.UTC(2026, 5, 1) });
const releaseArb = fc
  .record({
    supplierCode: fc.constantFrom('SUP-A', 'SUP-B'),
    firstNeedDate: dayArb,
    sent: instantArb,
    lag: fc.option(fc.integer({ min: 0, max: 500 * 3_600_000 })),
  })
  .map(({ supplierCode, firstNeedDate, sent, lag }) => ({
    supplierCode,
    firstNeedDate,
    sentAt: new Date(sent).toISOString(),
    confirmedAt: lag === null ? null : new Date(sent + lag).toISOString(),
  }));
const inputArb = fc
  .record({ lines: fc.array(lineArb, { maxLength: 30 }), releases: fc.array(releaseArb, { maxLength: 10 }) })
  .map((parts) => ({
    from: '2026-03',
    to: '2026-03',
    today: '2026-04-01',
    calendar,
    tolerances: new Map(),
    ...parts,
  }));

describe('supplierPerformance — properties', () => {
  it('keeps every rate within 0 and 1, and null (never NaN) only when nothing is measured', () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        for (const row of [...supplierPerformance(input), ...summarisePerformance(supplierPerformance(input))]) {
          for (const [rate, base] of [
            [row.onTimeRate, row.lines],
            [row.fillRate, row.requestedQty],
            [row.promiseKeptRate, row.promisedLines],
          ] as const) {
            if (base === 0) {
              expect(rate).toBeNull();
            } else {
              expect(rate).toBeGreaterThanOrEqual(0);
              expect(rate).toBeLessThanOrEqual(1);
            }
          }
        }
      }),
    );
  });

  it('gives on-time and fill rate 1 when every line is received on time in full', () => {
    fc.assert(
      fc.property(fc.array(lineArb, { minLength: 1, maxLength: 30 }), (lines) => {
        const full = lines.map((l) => ({
          ...l,
          receipts: [good(l.requestedQty, l.requestedDate)],
        }));

        const rows = supplierPerformance({
          from: '2026-03',
          to: '2026-03',
          today: '2026-04-01',
          calendar,
          tolerances: new Map(),
          lines: full,
          releases: [],
        });

        expect(rows.reduce((sum, row) => sum + row.lines, 0)).toBe(lines.length);
        for (const row of rows) expect([row.onTimeRate, row.fillRate]).toEqual([1, 1]);
      }),
    );
  });

  it('reports the latency median a plain sort would give', () => {
    fc.assert(
      fc.property(fc.array(releaseArb, { maxLength: 15 }), (releases) => {
        const rows = supplierPerformance({
          from: '2026-03',
          to: '2026-03',
          today: '2026-04-01',
          calendar,
          tolerances: new Map(),
          lines: [],
          releases,
        });
        for (const row of rows) {
          const hours = releases
            .filter((r) => r.supplierCode === row.supplierCode && r.confirmedAt)
            .map((r) => (Date.parse(r.confirmedAt!) - Date.parse(r.sentAt)) / 3_600_000)
            .sort((a, b) => a - b);
          const n = hours.length;
          const expected = n === 0 ? null : n % 2 ? hours[(n - 1) / 2] : (hours[n / 2 - 1] + hours[n / 2]) / 2;
          expect(row.confirmationHoursMedian).toBe(expected);
          expect(row.confirmedReleases + row.unansweredReleases).toBe(row.releases);
        }
      }),
    );
  });
});
