// @vitest-environment node
import { describe, expect, it } from 'vitest';
import type { LineRiskInput, UnitAtRisk } from '@shared/domain/line-risk';
import { resequenced } from '@shared/domain/sequence-what-if';
import { boardRiskHandler, LACKS_NAMED } from '@/stores/board-risk-engine';
import { bomLine, boughtPart, sequenceUnit } from '../shared/builders';
import { referenceLineRisk } from '../shared/line-risk-reference';

/*
 * The board's engine against the plain walk (tests/shared/line-risk-reference.ts, which explodes
 * every unit afresh): the units at risk it hands the board are the plain walk's, each with its
 * first lacks and the count of the others. No outside source: the rules are checked in
 * tests/shared/line-risk.test.ts.
 */

const part = boughtPart;
const unit = sequenceUnit;

/** Model WIDE takes eight bought parts none of which is in stock; model ONE takes a part in stock for one unit. */
const bought = Array.from({ length: LACKS_NAMED + 3 }, (_, index) => `B-${index + 1}`);
const input: LineRiskInput = {
  parts: [
    part('WIDE', { source: 'end_item' }),
    part('ONE', { source: 'end_item' }),
    ...bought.map((partNumber) => part(partNumber)),
    part('CELL', { onHand: 1 }),
  ],
  bom: [...bought.map((component) => bomLine('WIDE', component)), bomLine('ONE', 'CELL')],
  sequence: [
    unit('2026-03-03', 1, 'ONE', 'S1'),
    unit('2026-03-03', 2, 'ONE', 'S2'),
    unit('2026-03-04', 1, 'WIDE', 'S3'),
  ],
  firmReceipts: [],
  calendar: { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] },
  from: '2026-03-02',
  to: '2026-03-06',
};

const bytes = (value: unknown): ArrayBuffer => new TextEncoder().encode(JSON.stringify(value)).buffer as ArrayBuffer;
const briefed = (units: UnitAtRisk[]) =>
  units.map((atRisk) => ({
    ...atRisk,
    lacks: atRisk.lacks.slice(0, LACKS_NAMED),
    moreLacks: Math.max(0, atRisk.lacks.length - LACKS_NAMED),
  }));

describe("the board's line-risk engine", () => {
  it("hands the board the plain walk's units at risk, each with its first lacks and the count of the rest", () => {
    const handle = boardRiskHandler();

    const units = handle({ kind: 'load', json: bytes(input) });

    const plain = referenceLineRisk(input).unitsAtRisk;
    expect(plain.map((atRisk) => [atRisk.serial, atRisk.lacks.length])).toEqual([
      ['S2', 1],
      ['S3', LACKS_NAMED + 3],
    ]);
    expect(units).toEqual(briefed(plain));
    expect(units[1]).toMatchObject({ serial: 'S3', moreLacks: 3 });
    expect(units[1]!.lacks.map((lack) => lack.partNumber)).toEqual(bought.slice(0, LACKS_NAMED));
  });

  it('tries a move, and once it is saved marks the units the move leaves at risk', () => {
    const handle = boardRiskHandler();
    handle({ kind: 'load', json: bytes(input) });
    // S2 ahead of S1: S2 now takes the one CELL, and S1 is left without.
    const orders = [{ date: '2026-03-03', serials: ['S2', 'S1'] }];

    const tried = handle({ kind: 'preview', orders });
    const saved = handle({ kind: 'adopt', orders });

    const after = referenceLineRisk({ ...input, sequence: resequenced(input.sequence, orders) }).unitsAtRisk;
    expect(tried.becomeAtRisk.map((atRisk) => atRisk.serial)).toEqual(['S1']);
    expect(tried.stopAtRisk.map((atRisk) => atRisk.serial)).toEqual(['S2']);
    expect(tried.elapsedMs).toBeGreaterThanOrEqual(0);
    expect(saved).toEqual(briefed(after));
    // A move saved without being tried first is walked there and then.
    const fresh = boardRiskHandler();
    fresh({ kind: 'load', json: bytes(input) });
    expect(fresh({ kind: 'adopt', orders })).toEqual(briefed(after));
  });

  it('says so when asked about a move before the board is loaded', () => {
    expect(() => boardRiskHandler()({ kind: 'preview', orders: [] })).toThrow('not loaded');
  });
});
