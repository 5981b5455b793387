import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  expectedCardKey,
  parseCardKey,
  releaseCards,
  shipmentCardKey,
  type BoardLine,
  type BoardNotice,
} from '../../shared/domain/dock-cards';

const COLUMNS = ['expected', 'at_dock', 'counted', 'to_line'];

function line(id: number, orderedQty: number, needDate: string, overrides: Partial<BoardLine> = {}): BoardLine {
  return { id, orderedQty, closed: false, needDate, arrivalDate: null, dockColumn: 'expected', ...overrides };
}

function notice(id: number, lines: { lineId: number; qty: number }[], column = 'expected'): BoardNotice {
  return { id, shipDate: '2026-12-07', arrivalDate: '2026-12-09', dockColumn: column, lines };
}

describe('releaseCards', () => {
  it('puts lines expected on different days on different cards', () => {
    const cards = releaseCards(5, [line(1, 4, '2026-12-08'), line(2, 6, '2026-12-10')], [], [], COLUMNS);

    expect(cards.map((card) => [card.key, card.lines.map((entry) => entry.lineId)])).toEqual([
      ['expected-5-2026-12-08', [1]],
      ['expected-5-2026-12-10', [2]],
    ]);
  });

  it('makes a shipment its own card and leaves what it does not carry on the Expected card', () => {
    const cards = releaseCards(
      5,
      [line(1, 12, '2026-12-10')],
      [notice(9, [{ lineId: 1, qty: 5 }], 'at_dock')],
      [],
      COLUMNS,
    );

    expect(cards).toEqual([
      {
        key: 'shipment-9',
        kind: 'shipment',
        shipNoticeId: 9,
        shipDate: '2026-12-07',
        arrivalDate: '2026-12-09',
        column: 'at_dock',
        lines: [{ lineId: 1, qty: 5, receivedQty: 0, open: true }],
      },
      {
        key: 'expected-5-2026-12-10',
        kind: 'expected',
        shipNoticeId: null,
        shipDate: null,
        arrivalDate: '2026-12-10',
        column: 'expected',
        lines: [{ lineId: 1, qty: 7, receivedQty: 0, open: true }],
      },
    ]);
  });

  it('counts a receipt against the shipment it names and keeps the card on the board the day it is counted', () => {
    const lines = [line(1, 12, '2026-12-10')];
    const notices = [notice(9, [{ lineId: 1, qty: 6 }]), notice(10, [{ lineId: 1, qty: 6 }])];

    const today = releaseCards(
      5,
      lines,
      notices,
      [{ lineId: 1, shipNoticeId: 10, usableQty: 6, today: true }],
      COLUMNS,
    );
    const later = releaseCards(
      5,
      lines,
      notices,
      [{ lineId: 1, shipNoticeId: 10, usableQty: 6, today: false }],
      COLUMNS,
    );

    expect(today.map((card) => [card.key, card.lines[0]!.open])).toEqual([
      ['shipment-9', true],
      ['shipment-10', false],
    ]);
    expect(later.map((card) => card.key)).toEqual(['shipment-9']);
  });

  it('dates an answered line by its arrival and shows a card in its least advanced column', () => {
    const cards = releaseCards(
      5,
      [
        line(1, 4, '2026-12-08', { arrivalDate: '2026-12-11', dockColumn: 'counted' }),
        line(2, 4, '2026-12-11', { dockColumn: 'at_dock' }),
      ],
      [],
      [],
      COLUMNS,
    );

    expect(cards.map((card) => [card.key, card.column])).toEqual([['expected-5-2026-12-11', 'at_dock']]);
  });

  it('reads back the keys it makes', () => {
    expect(parseCardKey(shipmentCardKey(12))).toEqual({ kind: 'shipment', shipNoticeId: 12 });
    expect(parseCardKey(expectedCardKey(5, '2026-12-04'))).toEqual({
      kind: 'expected',
      releaseId: 5,
      arrivalDate: '2026-12-04',
    });
    expect(parseCardKey('5')).toBeNull();
    expect(parseCardKey('shipment-x')).toBeNull();
  });

  // Invariant, no outside source: before anything is received, the cards of a release carry every
  // line's ordered quantity exactly once, what is on notices on shipment cards and the rest on
  // Expected cards, and no Expected card mixes days.
  it('carries every ordered quantity exactly once, with no card mixing days', () => {
    const day = fc.constantFrom('2026-12-07', '2026-12-08', '2026-12-09');
    fc.assert(
      fc.property(
        fc.array(fc.record({ qty: fc.integer({ min: 1, max: 50 }), needDate: day }), { minLength: 1, maxLength: 6 }),
        fc.array(fc.array(fc.record({ pick: fc.nat(), share: fc.integer({ min: 1, max: 10 }) }), { maxLength: 3 }), {
          maxLength: 3,
        }),
        (specs, shipments) => {
          const lines = specs.map((spec, index) => line(index + 1, spec.qty, spec.needDate));
          const shippedSoFar = new Map<number, number>();
          const notices = shipments.map((picks, index) =>
            notice(
              100 + index,
              [...new Map(picks.map((pick) => [(pick.pick % lines.length) + 1, pick.share])).entries()].flatMap(
                ([lineId, share]) => {
                  const left = lines[lineId - 1]!.orderedQty - (shippedSoFar.get(lineId) ?? 0);
                  const qty = Math.min(left, share);
                  if (qty <= 0) return [];
                  shippedSoFar.set(lineId, (shippedSoFar.get(lineId) ?? 0) + qty);
                  return [{ lineId, qty }];
                },
              ),
            ),
          );

          const cards = releaseCards(1, lines, notices, [], COLUMNS);

          for (const candidate of lines) {
            const carried = cards.flatMap((card) => card.lines.filter((entry) => entry.lineId === candidate.id));
            expect(carried.reduce((total, entry) => total + entry.qty, 0)).toBe(candidate.orderedQty);
          }
          for (const card of cards.filter((candidate) => candidate.kind === 'expected')) {
            const days = card.lines.map((entry) => lines[entry.lineId - 1]!.needDate);
            expect(new Set([...days, card.arrivalDate]).size).toBe(1);
          }
          expect(new Set(cards.map((card) => card.key)).size).toBe(cards.length);
        },
      ),
    );
  });
});
