import { describe, expect, it } from 'vitest';
import { planMove, unitChangeProblem } from '../../shared/domain/sequence';
import type { SequenceDay, SequenceUnit } from '../../shared/schemas/sequence';

const unit = (date: string, sequence: number, serial: string, status: SequenceUnit['status']): SequenceUnit => ({
  id: sequence,
  date,
  sequence,
  model: 'M',
  serial,
  qty: 1,
  status,
  builtAt: status === 'built' ? `${date}T08:00:00.000Z` : null,
});
const day = (date: string, units: SequenceUnit[]) => ({ date, units }) as unknown as SequenceDay;

describe('units at the line', () => {
  const monday = day('2026-12-07', [
    unit('2026-12-07', 1, 'A', 'built'),
    unit('2026-12-07', 2, 'B', 'started'),
    unit('2026-12-07', 3, 'C', 'planned'),
  ]);
  const tuesday = day('2026-12-08', [unit('2026-12-08', 1, 'D', 'planned')]);

  it('lets planned units move anywhere behind a built one', () => {
    expect(planMove([monday, tuesday], 'C', '2026-12-07', 1)?.problem).toBe(
      null, // C before B: B (started) changes place within its day, which is allowed.
    );
    expect(planMove([monday, tuesday], 'D', '2026-12-07', 3)?.problem).toBeNull();
  });

  it('refuses a move that shifts a built unit or carries a started one to another day', () => {
    expect(planMove([monday, tuesday], 'C', '2026-12-07', 0)?.problem).toBe(
      "unit 'A' was built on 2026-12-07; its place cannot change",
    );
    expect(planMove([monday, tuesday], 'B', '2026-12-08', 0)?.problem).toBe(
      "unit 'B' was started on 2026-12-07 (its kit is at the line); its day cannot change",
    );
  });

  it('refuses removing a unit that is not merely planned, and a changed model or quantity', () => {
    const built = unit('2026-12-07', 1, 'A', 'built');
    expect(unitChangeProblem(built, null)).toContain('reverse it at the line end');
    expect(unitChangeProblem(built, { ...built, model: 'N', qty: 2 })).toBe(
      "unit 'A' was built on 2026-12-07; its model and quantity cannot change",
    );
    expect(unitChangeProblem(unit('2026-12-07', 3, 'C', 'planned'), null)).toBeNull();
  });
});

describe('a move onto a full day', () => {
  const withCapacity = (date: string, units: SequenceUnit[], capacity: number) =>
    ({ date, units, capacity, load: units.length }) as unknown as SequenceDay;
  const monday = withCapacity(
    '2026-12-07',
    [unit('2026-12-07', 1, 'A', 'planned'), unit('2026-12-07', 2, 'B', 'planned')],
    2,
  );
  const tuesday = withCapacity('2026-12-08', [unit('2026-12-08', 1, 'C', 'planned')], 2);

  it('is over capacity when it brings the day past its capacity, as the server refuses it', () => {
    expect(planMove([monday, tuesday], 'C', '2026-12-07', 0)?.overCapacity).toEqual({
      date: '2026-12-07',
      load: 3,
      capacity: 2,
    });
  });

  it('fits while the day has room, and within one day the load does not change', () => {
    expect(planMove([monday, tuesday], 'A', '2026-12-08', 1)?.overCapacity).toBeNull();
    expect(planMove([monday, tuesday], 'B', '2026-12-07', 0)?.overCapacity).toBeNull();
  });
});
