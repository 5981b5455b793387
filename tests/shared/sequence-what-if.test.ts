import { describe, expect, it } from 'vitest';
import { demandChanges, resequenced } from '../../shared/domain/sequence-what-if';
import type { SequenceSlot } from '../../shared/domain/types';

const slot = (serial: string, date: string, sequence: number): SequenceSlot => ({
  serial,
  date,
  sequence,
  model: 'M',
  qty: 1,
});

describe('resequenced', () => {
  it('gives the listed units their new day and place and leaves the others alone', () => {
    const sequence = [slot('A', '2026-12-01', 1), slot('B', '2026-12-01', 2), slot('C', '2026-12-02', 1)];

    const after = resequenced(sequence, [
      { date: '2026-12-02', serials: ['B', 'C'] },
      { date: '2026-12-01', serials: ['A'] },
    ]);

    expect(after).toEqual([slot('A', '2026-12-01', 1), slot('B', '2026-12-02', 1), slot('C', '2026-12-02', 2)]);
    expect(sequence[1]).toEqual(slot('B', '2026-12-01', 2));
  });
});

describe('demandChanges', () => {
  it('lists only the days that move, by supplier, with a part that drops out of the horizon counted as zero', () => {
    const before = [
      { partNumber: 'P1', supplierCode: 'S2', uom: 'H87', byDay: { '2026-12-01': 2, '2026-12-02': 1 } },
      { partNumber: 'P2', supplierCode: 'S1', uom: 'KGM', byDay: { '2026-12-01': 0.5, '2026-12-02': 0 } },
      { partNumber: 'P3', supplierCode: 'S1', uom: 'H87', byDay: { '2026-12-01': 4, '2026-12-02': 4 } },
    ];
    const after = [
      { partNumber: 'P1', supplierCode: 'S2', uom: 'H87', byDay: { '2026-12-01': 1, '2026-12-02': 2 } },
      { partNumber: 'P3', supplierCode: 'S1', uom: 'H87', byDay: { '2026-12-01': 4, '2026-12-02': 4 } },
    ];

    const changes = demandChanges(before, after);

    expect(changes).toEqual([
      {
        supplierCode: 'S1',
        parts: [{ partNumber: 'P2', uom: 'KGM', days: [{ date: '2026-12-01', before: 0.5, after: 0, change: -0.5 }] }],
      },
      {
        supplierCode: 'S2',
        parts: [
          {
            partNumber: 'P1',
            uom: 'H87',
            days: [
              { date: '2026-12-01', before: 2, after: 1, change: -1 },
              { date: '2026-12-02', before: 1, after: 2, change: 1 },
            ],
          },
        ],
      },
    ]);
  });
});
