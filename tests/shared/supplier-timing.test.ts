import { describe, expect, it } from 'vitest';
import {
  arrivalOf,
  cycleContradiction,
  deliveryDayOnOrBefore,
  earliestArrival,
  effectiveCycle,
  isInsideLeadTime,
  partTerms,
  replenishmentDays,
  type SupplierTerms,
} from '../../shared/domain/supplier-timing';
import type { PlantCalendar } from '../../shared/domain/types';

const week: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };

function terms(overrides: Partial<SupplierTerms>): SupplierTerms {
  return { leadTimeDays: 5, transitDays: 0, deliveryWeekdays: [], cycle: null, ...overrides };
}

describe('the kanban replenishment time T from supplier terms', () => {
  it('reads a stated cycle 1-4-2 as three quarters of a day', () => {
    // Monden, "Toyota Production System", chapter on the supplier kanban (from memory): cycle a-b-c
    // is b deliveries every a days, a kanban collected at one delivery filled c deliveries later,
    // so T = a(1 + c)/b = 1 × 3 / 4 = 0.75 day. Lead time 0.5 day keeps the cycle consistent.
    expect(replenishmentDays(terms({ leadTimeDays: 0, cycle: { days: 1, deliveries: 4, delay: 2 } }))).toBe(0.75);
  });

  it('derives the cycle from daily deliveries and a 10-day lead time: T is the lead time plus one delivery interval', () => {
    // Same formula (Monden, from memory): a supplier delivering every working day of a 5-day week
    // whose goods take 10 working days is 5-5-10, so T = 5 × (1 + 10) / 5 = 11 working days.
    const daily = terms({ leadTimeDays: 10 });
    expect(effectiveCycle(daily, week)).toEqual({ days: 5, deliveries: 5, delay: 10 });
    expect(replenishmentDays(daily, week)).toBe(11);
  });

  it('derives a weekly cycle for a supplier that delivers on Tuesdays only', () => {
    // One delivery a week (5-1-c): the delay must cover 7 working days of lead time, so c = ⌈7/5⌉ = 2
    // deliveries and T = 5 × (1 + 2) / 1 = 15 working days (formula as above, from memory).
    const weekly = terms({ leadTimeDays: 7, deliveryWeekdays: [2] });
    expect(effectiveCycle(weekly, week)).toEqual({ days: 5, deliveries: 1, delay: 2 });
    expect(replenishmentDays(weekly, week)).toBe(15);
  });

  it('refuses a stated cycle whose delay is shorter than the lead time and accepts one that covers it', () => {
    // 1-1-1 brings a container back 1 working day after its card leaves: a 10-day lead time cannot.
    const contradicted = terms({ leadTimeDays: 10, cycle: { days: 1, deliveries: 1, delay: 1 } });
    expect(cycleContradiction(contradicted)).toContain('at least 10 deliveries');
    // 5-2-2: two deliveries a week, each two deliveries (5 working days) after its signal.
    expect(cycleContradiction(terms({ leadTimeDays: 5, cycle: { days: 5, deliveries: 2, delay: 2 } }))).toBeNull();
  });

  it('gives a part whose lead time outgrows its supplier’s stated cycle the derived cycle', () => {
    const supplier = terms({ leadTimeDays: 5, deliveryWeekdays: [1, 4], cycle: { days: 5, deliveries: 2, delay: 2 } });
    expect(effectiveCycle(partTerms(supplier, 5), week)).toEqual({ days: 5, deliveries: 2, delay: 2 });
    expect(effectiveCycle(partTerms(supplier, 8), week)).toEqual({ days: 5, deliveries: 2, delay: 4 });
  });
});

describe('delivery days, transit and arrival', () => {
  // ISO 8601-1:2019 numbers the days of the week 1 (Monday) to 7 (Sunday) (from memory).
  // 2026-12-04 is a Friday and 2026-12-08 a Tuesday in the Gregorian calendar (ISO 8601's calendar).
  const tuesdays = terms({ leadTimeDays: 3, deliveryWeekdays: [2], transitDays: 2 });

  it('brings a need forward to the supplier’s last delivery day on or before it', () => {
    expect(deliveryDayOnOrBefore('2026-12-11', tuesdays, week)).toBe('2026-12-08');
    expect(deliveryDayOnOrBefore('2026-12-08', tuesdays, week)).toBe('2026-12-08');
  });

  it('counts transit in working days from the ship date', () => {
    // Shipped Friday 4 Dec with two working days on the road: Monday, Tuesday → arrives Tuesday 8 Dec.
    expect(arrivalOf('2026-12-04', tuesdays, week)).toBe('2026-12-08');
    expect(arrivalOf('2026-12-04', { transitDays: 0 }, week)).toBe('2026-12-04');
  });

  it('puts the earliest arrival of an order on the first delivery day after the lead time', () => {
    // Released Wednesday 2 Dec, 3 working days (Thu, Fri, Mon 7 Dec), then the next Tuesday: 8 Dec.
    expect(earliestArrival('2026-12-02', tuesdays, week)).toBe('2026-12-08');
    expect(isInsideLeadTime('2026-12-04', '2026-12-02', tuesdays, week)).toBe(true);
    expect(isInsideLeadTime('2026-12-07', '2026-12-02', tuesdays, week)).toBe(false);
  });

  it('skips the plant’s holidays when counting the lead time', () => {
    const withHoliday: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-12-07'] };
    // Thu 3, Fri 4, (Mon 7 off) Tue 8 → a Tuesday delivery day.
    expect(earliestArrival('2026-12-02', tuesdays, withHoliday)).toBe('2026-12-08');
    expect(earliestArrival('2026-12-02', terms({ leadTimeDays: 4 }), withHoliday)).toBe('2026-12-09');
  });
});
