import { afterAll, describe, expect, it } from 'vitest';
import { computeLineRisk, type LineRiskInput, type LineRiskPart } from '../../shared/domain/line-risk';
import { LineRiskRunner, LineRiskWorkerError } from '../../server/line-risk/line-risk-runner';
import { summarise } from '../../server/line-risk/line-risk-summary';

const part = (partNumber: string, fields: Partial<LineRiskPart> = {}): LineRiskPart => ({
  partNumber,
  source: 'buy',
  supplierCode: 'SUP-A',
  leadTimeDays: 2,
  packQty: 1,
  onHand: 0,
  safetyStock: 0,
  ...fields,
});

// Three units of M, each needing 2 × C; 3 C on hand: the first unit builds, the other two lack C.
const input: LineRiskInput = {
  parts: [part('M', { source: 'end_item', supplierCode: null }), part('C', { onHand: 3 })],
  bom: [{ parent: 'M', component: 'C', qtyPer: 2, scrapPct: 0 }],
  sequence: [1, 2, 3].map((sequence) => ({ date: '2026-03-02', sequence, model: 'M', serial: `S${sequence}`, qty: 1 })),
  firmReceipts: [],
  calendar: { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] },
  from: '2026-03-02',
  to: '2026-03-06',
};

const runner = new LineRiskRunner();
afterAll(() => runner.close());

describe('the line-risk worker thread', () => {
  it('answers with the same summary as the engine run in place, and pages from the result it keeps', async () => {
    const summary = await runner.compute('k1', input);
    const slots = await runner.slots('k1', 'C', 1, 5);
    const units = await runner.units('k1', 0, 10);

    expect(summary).toEqual(summarise(computeLineRisk(input)));
    expect(summary.unitsAtRiskCount).toBe(2);
    expect(slots).toEqual({ total: 2, slots: [expect.objectContaining({ serial: 'S3' })] });
    expect(units?.units.map((unit) => unit.serial)).toEqual(['S2', 'S3']);
    expect(await runner.slots('k1', 'M', 0, 5)).toBeNull();
  });

  it('says when it no longer holds a result, so the caller computes again', async () => {
    await runner.compute('k2', input);

    runner.drop('k2');

    expect(await runner.units('k2', 0, 10)).toBeUndefined();
    expect(await runner.units('never-computed', 0, 10)).toBeUndefined();
  });

  it('passes a cyclic BOM back as an engine error of its kind', async () => {
    const cyclic = {
      ...input,
      parts: [...input.parts, part('S', { source: 'make', supplierCode: null })],
      bom: [
        { parent: 'M', component: 'S', qtyPer: 1, scrapPct: 0 },
        { parent: 'S', component: 'M', qtyPer: 1, scrapPct: 0 },
      ],
    };

    const failure = await runner.compute('k3', cyclic).catch((error: unknown) => error);

    expect(failure).toBeInstanceOf(LineRiskWorkerError);
    expect((failure as LineRiskWorkerError).kind).toBe('cycle');
  });
});
