import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  addMonths,
  isYearMonth,
  lastDayOf,
  median,
  monthSpan,
  summarisePerformance,
  supplierPerformance,
  type PerformanceInput,
  type PerformanceLine,
} from '../../shared/domain/supplier-performance';

// Definitions checked here (see the module's comment):
// - on-time delivery: share of deliveries received on or before the date required
//   (APICS Dictionary, "on-time delivery", from memory), counted per release line, in full;
// - fill rate: share of the ordered quantity delivered (APICS Dictionary, "fill rate", from memory),
//   quantity based, usable goods only, by the need date.

const base = { from: '2026-03', to: '2026-04', today: '2026-05-10', releases: [] } satisfies Partial<PerformanceInput>;
const line = (
  needDate: string,
  orderedQty: number,
  receipts: PerformanceLine['receipts'],
  supplierCode = 'SUP-A',
): PerformanceLine => ({
  supplierCode,
  needDate,
  orderedQty,
  receipts,
});

describe('supplierPerformance — hand-worked months', () => {
  it('counts a line on time only when the usable quantity by the need date reaches the ordered quantity', () => {
    const input: PerformanceInput = {
      ...base,
      lines: [
        // L1: 100 ordered, 100 usable on the need date → on time, fills 100.
        line('2026-03-10', 100, [{ qty: 100, receivedOn: '2026-03-10', usable: true }]),
        // L2: 50 ordered, 30 by the need date, 20 a day late → late, fills 30.
        line('2026-03-12', 50, [
          { qty: 30, receivedOn: '2026-03-11', usable: true },
          { qty: 20, receivedOn: '2026-03-13', usable: true },
        ]),
        // L3: 40 ordered, 40 arrived early but 10 damaged → 30 usable, late, fills 30.
        line('2026-03-20', 40, [
          { qty: 30, receivedOn: '2026-03-18', usable: true },
          { qty: 10, receivedOn: '2026-03-18', usable: false },
        ]),
        // L4: 10 ordered, 25 arrived on time (over) → on time, fills only 10 (capped).
        line('2026-03-25', 10, [{ qty: 25, receivedOn: '2026-03-24', usable: true }]),
      ],
    };

    const [march] = supplierPerformance(input);

    // On-time: 2 of 4 lines (L1, L4) → 2 / 4 = 0.5.
    // Fill: (100 + 30 + 30 + 10) / (100 + 50 + 40 + 10) = 170 / 200 = 0.85.
    expect(march).toMatchObject({ supplierCode: 'SUP-A', month: '2026-03', lines: 4, onTimeLines: 2, onTimeRate: 0.5 });
    expect(march).toMatchObject({ orderedQty: 200, filledQty: 170, fillRate: 0.85 });
  });

  it('leaves out need dates outside the months and those not yet passed', () => {
    const input: PerformanceInput = {
      from: '2026-05',
      to: '2026-05',
      today: '2026-05-10',
      releases: [],
      lines: [
        line('2026-04-30', 10, []), // month before the range
        line('2026-05-09', 10, [{ qty: 10, receivedOn: '2026-05-09', usable: true }]), // yesterday: measured
        line('2026-05-10', 10, []), // today: not yet decided
        line('2026-05-20', 10, []), // future
      ],
    };

    const rows = supplierPerformance(input);

    // Only the 2026-05-09 line counts: 1 line, on time, 10 / 10 filled.
    expect(rows).toEqual([
      expect.objectContaining({
        month: '2026-05',
        lines: 1,
        onTimeLines: 1,
        onTimeRate: 1,
        orderedQty: 10,
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
        line('2026-03-05', 100, [{ qty: 100, receivedOn: '2026-03-05', usable: true }]),
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
      orderedQty: 130,
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
  needDate: dayArb,
  orderedQty: fc.integer({ min: 1, max: 500 }),
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
    ...parts,
  }));

describe('supplierPerformance — properties', () => {
  it('keeps every rate within 0 and 1, and null (never NaN) only when nothing is measured', () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        for (const row of [...supplierPerformance(input), ...summarisePerformance(supplierPerformance(input))]) {
          for (const [rate, base] of [
            [row.onTimeRate, row.lines],
            [row.fillRate, row.orderedQty],
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
          receipts: [{ qty: l.orderedQty, receivedOn: l.needDate, usable: true }],
        }));

        const rows = supplierPerformance({
          from: '2026-03',
          to: '2026-03',
          today: '2026-04-01',
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
        const rows = supplierPerformance({ from: '2026-03', to: '2026-03', today: '2026-04-01', lines: [], releases });
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
