import { describe, expect, it } from 'vitest';
import { buildDemoScenario, type DemoBomLine, type DemoScenario } from '../../seed/scenario';
import { easterSunday } from '../../seed/scenario-calendar';
import { supplierSchema } from '../../shared/schemas/master-data';

/*
 * Structural checks of the invented demo data. Everything the demo asserts about itself is
 * recomputed here independently (own calendar arithmetic, own BOM explosion) rather than through
 * the generator's helpers.
 */

const SATURDAY = '2026-03-07';
const WEDNESDAY = '2026-03-11';
const MS_PER_DAY = 86_400_000;

function dayNumber(date: string): number {
  return Date.UTC(Number(date.slice(0, 4)), Number(date.slice(5, 7)) - 1, Number(date.slice(8, 10))) / MS_PER_DAY;
}

function isoDateOf(day: number): string {
  return new Date(day * MS_PER_DAY).toISOString().slice(0, 10);
}

/** ISO 8601 weekday (1 = Monday … 7 = Sunday) from ECMA-262 getUTCDay (0 = Sunday … 6 = Saturday). */
function isoWeekday(date: string): number {
  const day = new Date(dayNumber(date) * MS_PER_DAY).getUTCDay();
  return day === 0 ? 7 : day;
}

function distinctDays(scenario: DemoScenario): string[] {
  return [...new Set(scenario.sequence.map((slot) => slot.date))].sort();
}

function effective(line: DemoBomLine, date: string): boolean {
  return (
    (line.effectiveFrom === null || line.effectiveFrom <= date) &&
    (line.effectiveTo === null || date <= line.effectiveTo)
  );
}

/** Gross need per part and build day: parent qty × qty per × (1 + scrap % / 100), level by level. */
function explode(scenario: DemoScenario): Map<string, Map<string, number>> {
  const need = new Map<string, Map<string, number>>();
  const visit = (parent: string, qty: number, date: string): void => {
    for (const line of scenario.bom) {
      if (line.parent !== parent || !effective(line, date)) continue;
      const componentQty = qty * line.qtyPer * (1 + line.scrapPct / 100);
      const byDay = need.get(line.component) ?? new Map<string, number>();
      byDay.set(date, (byDay.get(date) ?? 0) + componentQty);
      need.set(line.component, byDay);
      visit(line.component, componentQty, date);
    }
  };
  for (const slot of scenario.sequence) visit(slot.model, slot.qty, slot.date);
  return need;
}

/** Longest parent → component chain below `part`, counting the part itself as one level. */
function depth(part: string, children: Map<string, string[]>, trail: string[] = []): number {
  if (trail.includes(part)) throw new Error(`BOM cycle through ${[...trail, part].join(' → ')}`);
  const below = (children.get(part) ?? []).map((child) => depth(child, children, [...trail, part]));
  return 1 + Math.max(0, ...below);
}

describe('buildDemoScenario', () => {
  const scenario = buildDemoScenario(SATURDAY);
  const partByNumber = new Map(scenario.parts.map((part) => [part.partNumber, part]));
  const days = distinctDays(scenario);

  it('is deterministic: two calls with the same seed day give equal data', () => {
    expect(buildDemoScenario(SATURDAY)).toEqual(scenario);
  });

  it('has at least twelve suppliers with lead times of 2–10 working days and terms that hold together', () => {
    expect(scenario.suppliers.length).toBeGreaterThanOrEqual(12);
    expect(new Set(scenario.suppliers.map((supplier) => supplier.code)).size).toBe(scenario.suppliers.length);
    for (const supplier of scenario.suppliers) {
      expect(supplier.leadTimeDays).toBeGreaterThanOrEqual(2);
      expect(supplier.leadTimeDays).toBeLessThanOrEqual(10);
      // Terms that hold together: the shared schema refuses a cycle that contradicts the lead time.
      expect(supplierSchema.safeParse(supplier).error?.issues ?? []).toEqual([]);
    }
  });

  it('has at least 150 parts with unique part numbers, four of them end items', () => {
    expect(scenario.parts.length).toBeGreaterThanOrEqual(150);
    expect(partByNumber.size).toBe(scenario.parts.length);
    expect(scenario.parts.filter((part) => part.source === 'end_item')).toHaveLength(4);
  });

  it('uses only the UN/ECE Recommendation 20 codes H87, KGM, MTR and LTR, sheet steel in kilograms', () => {
    // UN/ECE Recommendation 20, Annex I: H87 piece, KGM kilogram, MTR metre, LTR litre.
    for (const part of scenario.parts) expect(['H87', 'KGM', 'MTR', 'LTR']).toContain(part.uom);
    const steelLines = scenario.bom.filter((line) => partByNumber.get(line.component)?.uom === 'KGM');
    expect(steelLines.some((line) => !Number.isInteger(line.qtyPer))).toBe(true);
  });

  it('gives every bought part an existing supplier and a replenishment method, made parts kanban or none, end items none', () => {
    const supplierCodes = new Set(scenario.suppliers.map((supplier) => supplier.code));
    for (const part of scenario.parts) {
      if (part.source === 'buy') {
        expect(supplierCodes.has(part.supplierCode ?? '')).toBe(true);
        expect(['kanban', 'scheduled']).toContain(part.replenishment);
        expect(part.leadTimeDays).toBeGreaterThanOrEqual(2);
        expect(part.leadTimeDays).toBeLessThanOrEqual(10);
      } else if (part.source === 'make') {
        expect(part.supplierCode).toBeNull();
        expect([null, 'kanban']).toContain(part.replenishment);
      } else {
        expect(part.supplierCode).toBeNull();
        expect(part.replenishment).toBeNull();
      }
      expect(part.packQty).toBeGreaterThan(0);
      expect(part.safetyStock).toBeGreaterThanOrEqual(0);
    }
    const bought = scenario.parts.filter((part) => part.source === 'buy');
    expect(bought.some((part) => part.replenishment === 'kanban')).toBe(true);
    // In-plant supermarket loops need at least one made part on kanban.
    expect(scenario.parts.some((part) => part.source === 'make' && part.replenishment === 'kanban')).toBe(true);
    expect(bought.some((part) => part.replenishment === 'scheduled')).toBe(true);
    expect(bought.some((part) => part.safetyStock > 0)).toBe(true);
  });

  it('makes sub-assemblies in-house with a lead time of 1–3 working days', () => {
    const made = scenario.parts.filter((part) => part.source === 'make');
    expect(made.length).toBeGreaterThanOrEqual(3);
    for (const part of made) {
      expect(part.leadTimeDays).toBeGreaterThanOrEqual(1);
      expect(part.leadTimeDays).toBeLessThanOrEqual(3);
    }
  });

  it('names a line station or sub-assembly cell as point of use of every component', () => {
    for (const part of scenario.parts) {
      if (part.source === 'end_item') expect(part.pointOfUse).toBeNull();
      else expect(part.pointOfUse).toMatch(/^(L1-ST\d{2}|FAB-C1|SUB-SQ1)$/);
    }
  });

  it('flags hazardous material only on battery supplier parts, and at least one', () => {
    const hazardous = scenario.parts.filter((part) => part.hazardous);
    expect(hazardous.length).toBeGreaterThanOrEqual(1);
    for (const part of hazardous) {
      expect(part.source).toBe('buy');
      expect(part.description.toLowerCase()).toContain('battery');
    }
    expect(new Set(hazardous.map((part) => part.supplierCode)).size).toBe(1);
  });

  it('lists only known parts in the BOM and uses every part below the end items', () => {
    const components = new Set(scenario.bom.map((line) => line.component));
    for (const line of scenario.bom) {
      expect(partByNumber.has(line.parent), line.parent).toBe(true);
      expect(partByNumber.has(line.component), line.component).toBe(true);
      expect(partByNumber.get(line.parent)?.source).not.toBe('buy');
      expect(line.qtyPer).toBeGreaterThan(0);
      expect(line.scrapPct).toBeGreaterThanOrEqual(0);
    }
    for (const part of scenario.parts) {
      if (part.source !== 'end_item') expect(components.has(part.partNumber), part.partNumber).toBe(true);
    }
  });

  it('has a BOM without cycles that reaches three levels (model → made part → material)', () => {
    const children = new Map<string, string[]>();
    for (const line of scenario.bom) children.set(line.parent, [...(children.get(line.parent) ?? []), line.component]);
    const endItems = scenario.parts.filter((part) => part.source === 'end_item');
    const depths = endItems.map((part) => depth(part.partNumber, children));
    expect(Math.max(...depths)).toBe(3);
    // Walk from every part as well, so a cycle out of reach of the end items would still throw.
    for (const part of scenario.parts) {
      if (part.source !== 'end_item') expect(() => depth(part.partNumber, children)).not.toThrow();
    }
  });

  it('shares common parts across all four models and keeps model-specific ones apart', () => {
    const modelsUsing = new Map<string, Set<string>>();
    for (const line of scenario.bom) {
      if (partByNumber.get(line.parent)?.source !== 'end_item') continue;
      modelsUsing.set(line.component, (modelsUsing.get(line.component) ?? new Set()).add(line.parent));
    }
    const counts = [...modelsUsing.values()].map((models) => models.size);
    expect(counts.filter((count) => count === 4).length).toBeGreaterThanOrEqual(5);
    expect(counts.filter((count) => count === 1).length).toBeGreaterThanOrEqual(10);
  });

  it('never lets two lines of the same parent and component be effective on the same day', () => {
    const byPair = new Map<string, DemoBomLine[]>();
    for (const line of scenario.bom) {
      const key = `${line.parent}|${line.component}`;
      byPair.set(key, [...(byPair.get(key) ?? []), line]);
    }
    for (const lines of byPair.values()) {
      for (let i = 0; i < lines.length; i += 1) {
        for (let j = i + 1; j < lines.length; j += 1) {
          // Inclusive windows [from, to] overlap when each starts no later than the other ends.
          const a = lines[i];
          const b = lines[j];
          const overlap =
            (a.effectiveFrom ?? '') <= (b.effectiveTo ?? '9999-12-31') &&
            (b.effectiveFrom ?? '') <= (a.effectiveTo ?? '9999-12-31');
          expect(overlap).toBe(false);
        }
      }
    }
  });

  it('switches one component of one model to a part from the same supplier about ten working days in', () => {
    const ended = scenario.bom.filter((line) => line.effectiveTo !== null);
    const started = scenario.bom.filter((line) => line.effectiveFrom !== null);
    expect(ended).toHaveLength(1);
    expect(started).toHaveLength(1);
    const [oldLine] = ended;
    const [newLine] = started;
    expect(newLine.parent).toBe(oldLine.parent);
    expect(newLine.component).not.toBe(oldLine.component);
    expect(partByNumber.get(newLine.parent)?.source).toBe('end_item');
    expect(dayNumber(newLine.effectiveFrom!) - dayNumber(oldLine.effectiveTo!)).toBe(1);
    expect(partByNumber.get(newLine.component)?.supplierCode).toBe(partByNumber.get(oldLine.component)?.supplierCode);
    const changeIndex = days.indexOf(newLine.effectiveFrom!);
    expect(changeIndex).toBeGreaterThanOrEqual(8);
    expect(changeIndex).toBeLessThanOrEqual(12);
  });

  it('builds on 30 distinct Monday–Friday days that skip the shutdown days inside the window', () => {
    // ISO 8601-1:2019 week dates number Monday 1 … Sunday 7; 2026-03-02 is 2026-W10-1
    // (cross-checked with GNU date +%G-W%V-%u), which pins the weekday helper above.
    expect(isoWeekday('2026-03-02')).toBe(1);
    expect(isoWeekday(SATURDAY)).toBe(6);
    expect(scenario.calendar.workingWeekdays).toEqual([1, 2, 3, 4, 5]);
    expect(days).toHaveLength(30);
    for (const day of days) {
      expect(isoWeekday(day)).toBeLessThanOrEqual(5);
      expect(scenario.calendar.holidays).not.toContain(day);
    }
    const inside = scenario.calendar.holidays.filter((holiday) => holiday > days[0] && holiday < days[days.length - 1]);
    expect(inside.length).toBeGreaterThanOrEqual(1);
    for (const holiday of inside) expect(isoWeekday(holiday)).toBeLessThanOrEqual(5);
    // Every weekday between the first and last build day is either built on or a holiday.
    for (let day = dayNumber(days[0]); day <= dayNumber(days[days.length - 1]); day += 1) {
      const date = isoDateOf(day);
      if (isoWeekday(date) <= 5) expect(days.includes(date) || scenario.calendar.holidays.includes(date)).toBe(true);
    }
  });

  it('starts on the seed day when it is a working day, otherwise on the next one', () => {
    expect(days[0]).toBe('2026-03-09');
    expect(distinctDays(buildDemoScenario(WEDNESDAY))[0]).toBe(WEDNESDAY);
  });

  it('builds 22–26 units a day in positions numbered 1…n, one unit per slot', () => {
    for (const day of days) {
      const slots = scenario.sequence.filter((slot) => slot.date === day);
      expect(slots.length).toBeGreaterThanOrEqual(22);
      expect(slots.length).toBeLessThanOrEqual(26);
      expect(slots.map((slot) => slot.sequence).sort((a, b) => a - b)).toEqual(slots.map((_, index) => index + 1));
      for (const slot of slots) expect(slot.qty).toBe(1);
    }
    const endItems = new Set(
      scenario.parts.filter((part) => part.source === 'end_item').map((part) => part.partNumber),
    );
    expect(new Set(scenario.sequence.map((slot) => slot.model))).toEqual(endItems);
  });

  it('gives every unit a unique serial', () => {
    expect(new Set(scenario.sequence.map((slot) => slot.serial)).size).toBe(scenario.sequence.length);
  });

  it('levels each day: every model stays within one unit of its even share at every position', () => {
    // Steiner & Yeomans, "Level schedules for mixed-model, just-in-time processes", Management
    // Science 39(6), 1993 (from memory): a sequence keeping |xᵢₖ − k·dᵢ/D| < 1 for every model i
    // and position k always exists; compared in integers as |xᵢₖ·D − k·dᵢ| < D.
    for (const day of days) {
      const models = scenario.sequence
        .filter((slot) => slot.date === day)
        .sort((a, b) => a.sequence - b.sequence)
        .map((slot) => slot.model);
      const total = models.length;
      const demand = new Map<string, number>();
      for (const model of models) demand.set(model, (demand.get(model) ?? 0) + 1);
      const placed = new Map<string, number>();
      models.forEach((model, index) => {
        placed.set(model, (placed.get(model) ?? 0) + 1);
        for (const [other, qty] of demand) {
          expect(Math.abs((placed.get(other) ?? 0) * total - (index + 1) * qty)).toBeLessThan(total);
        }
      });
    }
  });

  it('never builds one model in a block longer than the level bound allows, across day ends too', () => {
    // Within the ±1 band a run of L units of a model with share r gains L·(1 − r) < 2 on its
    // ideal, so L < 2 / (1 − r); the same holds across a day end (property, no source).
    let bound = 0;
    for (const day of days) {
      const slots = scenario.sequence.filter((slot) => slot.date === day);
      for (const model of new Set(slots.map((slot) => slot.model))) {
        const share = slots.filter((slot) => slot.model === model).length / slots.length;
        bound = Math.max(bound, Math.ceil(2 / (1 - share)) - 1);
      }
    }
    const ordered = [...scenario.sequence].sort((a, b) => a.date.localeCompare(b.date) || a.sequence - b.sequence);
    let longest = 0;
    let run = 0;
    ordered.forEach((slot, index) => {
      run = index > 0 && ordered[index - 1].model === slot.model ? run + 1 : 1;
      longest = Math.max(longest, run);
    });
    expect(bound).toBeLessThanOrEqual(3);
    expect(longest).toBeLessThanOrEqual(bound);
  });

  it('signs in five plant roles and one contact per supplier, all on reserved example domains', () => {
    // RFC 2606 §3 reserves example.com, example.net and example.org for documentation.
    const emails = scenario.users.map((user) => user.email);
    expect(new Set(emails).size).toBe(emails.length);
    for (const email of [...emails, ...scenario.suppliers.map((supplier) => supplier.email)]) {
      expect(email).toMatch(/^[a-z0-9.]+@example\.(com|net|org)$/);
    }
    for (const role of ['admin', 'planner', 'buyer', 'receiving', 'viewer']) {
      expect(scenario.users.find((user) => user.email === `${role}@example.com`)?.role).toBe(role);
    }
    const contacts = scenario.users.filter((user) => user.role === 'supplier');
    expect(contacts.map((user) => user.supplierCode).sort()).toEqual(
      scenario.suppliers.map((supplier) => supplier.code).sort(),
    );
    for (const user of scenario.users) {
      if (user.role !== 'supplier') expect(user.supplierCode).toBeNull();
    }
  });

  it('runs exactly one bought part short within the first ten working days, the hazardous battery', () => {
    const need = explode(scenario);
    const firstTen = days.slice(0, 10);
    const short = scenario.parts.filter((part) => {
      if (part.source !== 'buy') return false;
      const byDay = need.get(part.partNumber) ?? new Map<string, number>();
      const cumulative = firstTen.reduce((sum, day) => sum + (byDay.get(day) ?? 0), 0);
      return cumulative > part.onHand;
    });
    expect(short.map((part) => part.partNumber)).toEqual(['BAT-06-312']);
    expect(short[0]!.hazardous).toBe(true);
    for (const part of short) {
      const byDay = need.get(part.partNumber)!;
      let covered = 0;
      let cumulative = 0;
      for (const day of days) {
        cumulative += byDay.get(day) ?? 0;
        if (cumulative > part.onHand) break;
        covered += 1;
      }
      expect(covered, part.partNumber).toBeGreaterThanOrEqual(2);
      expect(covered, part.partNumber).toBeLessThanOrEqual(6);
    }
  });

  it('holds a few days of each made part and nothing of the end items', () => {
    const need = explode(scenario);
    for (const part of scenario.parts) {
      if (part.source === 'end_item') expect(part.onHand).toBe(0);
      if (part.source !== 'make') continue;
      const firstThree = days.slice(0, 3).reduce((sum, day) => sum + (need.get(part.partNumber)?.get(day) ?? 0), 0);
      expect(part.onHand).toBeGreaterThan(0);
      expect(part.onHand).toBeLessThanOrEqual(firstThree);
    }
  });

  it('moves every date with the seed day', () => {
    const later = buildDemoScenario('2026-03-14');
    const laterDays = distinctDays(later);
    expect(laterDays[0]).toBe('2026-03-16');
    expect(dayNumber(laterDays[29]) - dayNumber(days[29])).toBe(7);
    // Shutdown days are dates of the year, not of the seed day: both seeds share one calendar.
    expect(later.calendar.holidays).toEqual(scenario.calendar.holidays);
  });
});

describe('the demo plant calendar', () => {
  it('finds Easter Sunday where a reference library does', () => {
    // python-dateutil 2.x, dateutil.easter.easter(year) (western method), run for these years.
    const reference: Record<number, string> = {
      2024: '2024-03-31',
      2025: '2025-04-20',
      2026: '2026-04-05',
      2027: '2027-03-28',
      2028: '2028-04-16',
    };
    for (const [year, date] of Object.entries(reference)) expect(easterSunday(Number(year))).toBe(date);
  });

  it('closes for the year end, the new year, the spring holiday and 1 May, each named a plant shutdown', () => {
    const scenario = buildDemoScenario('2026-12-02');
    const byDate = new Map(scenario.shutdowns.map((shutdown) => [shutdown.date, shutdown.name]));

    for (const date of ['2026-12-24', '2026-12-25', '2026-12-26', '2026-12-31', '2027-01-01', '2027-05-01']) {
      expect(scenario.calendar.holidays).toContain(date);
      expect(byDate.get(date)).toMatch(/^Plant shutdown: /);
    }
    // Good Friday and Easter Monday of 2027 (Easter Sunday 28 March, python-dateutil as above).
    expect(byDate.get('2027-03-26')).toBe('Plant shutdown: spring holiday');
    expect(byDate.get('2027-03-29')).toBe('Plant shutdown: spring holiday');
    expect(scenario.shutdowns.map((shutdown) => shutdown.date)).toEqual(scenario.calendar.holidays);
    // No build day falls on a shutdown day.
    for (const slot of [...scenario.history, ...scenario.sequence]) expect(byDate.has(slot.date)).toBe(false);
  });
});
