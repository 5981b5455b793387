import { Worker } from 'node:worker_threads';
import { gunzipSync } from 'node:zlib';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { computeLineRisk, type LineRiskInput, type LineRiskPart } from '../../shared/domain/line-risk';
import type { AwaitingLine, PartDetails } from '../../server/line-risk/line-risk-inputs';
import { toReport, type ReportBytes } from '../../server/line-risk/line-risk-report';
import { LineRiskRunner, LineRiskWorkerError, type WorkerRequest } from '../../server/line-risk/line-risk-runner';
import { summarise } from '../../server/line-risk/line-risk-summary';
import { etagOf } from '../../server/http/serialised-body';
import { addWorkingDays } from '../../shared/domain/calendar';
import { generatePlanFixture } from '../bench/plan-fixture';

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

const details = new Map<string, PartDetails>([
  ['C', { description: 'Bracket', uom: 'H87', hazardous: true, supplierName: 'Supplier A' }],
]);
const awaiting: AwaitingLine[] = [{ partNumber: 'C', releaseNumber: 'R-000042', qty: 3 }];

const runner = new LineRiskRunner();
afterAll(() => runner.close());

function compute(key: string, engineInput: LineRiskInput, on: LineRiskRunner = runner): Promise<ReportBytes> {
  const { from, to, today, frozenWindowDays, loops, ...pieces } = engineInput;
  return on.compute(key, { ...pieces, loops: loops ?? [], details, awaiting }, { from, to, today, frozenWindowDays });
}

/** The report the engine gives when run in place. */
const inPlace = (engineInput: LineRiskInput) => toReport(summarise(computeLineRisk(engineInput)), details, awaiting);

const text = (bytes: Uint8Array) => Buffer.from(bytes).toString('utf8');

describe('the line-risk worker thread', () => {
  it('answers with the report of the engine run in place, as bytes, and pages from the result it keeps', async () => {
    const bytes = await compute('k1', input);
    const slots = await runner.slots('k1', 'C', 1, 5);
    const units = await runner.units('k1', 0, 10);

    expect(text(bytes.json)).toBe(JSON.stringify(inPlace(input)));
    expect(JSON.parse(text(bytes.json))).toMatchObject({
      unitsAtRiskCount: 2,
      shortages: [{ partNumber: 'C', hazardous: true, supplierName: 'Supplier A' }],
    });
    expect(text(gunzipSync(bytes.gzip))).toBe(text(bytes.json));
    expect(bytes.etag).toBe(etagOf(bytes.gzip));
    expect(text(bytes.json.subarray(bytes.shortagesAt, bytes.json.length - 1))).toBe(
      JSON.stringify(inPlace(input).shortages),
    );
    expect(slots).toEqual({ total: 2, slots: [expect.objectContaining({ serial: 'S3' })] });
    expect(units?.units.map((unit) => unit.serial)).toEqual(['S2', 'S3']);
    expect(await runner.slots('k1', 'M', 0, 5)).toBeNull();
  });

  it('says when it no longer holds a result, so the caller computes again', async () => {
    await compute('k2', input);

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

    const failure = await compute('k3', cyclic).catch((error: unknown) => error);

    expect(failure).toBeInstanceOf(LineRiskWorkerError);
    expect((failure as LineRiskWorkerError).kind).toBe('cycle');
  });

  it('sends only the pieces of the input that changed, and answers for the whole new input', async () => {
    const own = new LineRiskRunner();
    const posted = vi.spyOn(Worker.prototype, 'postMessage');
    try {
      await compute('a', input, own);
      const sentFirst = posted.mock.calls
        .map(([message]) => message as WorkerRequest)
        .find((m) => m.kind === 'compute');
      posted.mockClear();
      // Equal pieces read again (new arrays), a different stock of C, and one unit fewer.
      const next: LineRiskInput = {
        ...structuredClone(input),
        parts: [input.parts[0], { ...input.parts[1], onHand: 4 }],
        sequence: input.sequence.slice(0, 2).map((slot) => ({ ...slot })),
      };
      const bytes = await compute('b', next, own);
      const sentNext = posted.mock.calls.map(([message]) => message as WorkerRequest).find((m) => m.kind === 'compute');

      expect(sentFirst?.kind === 'compute' && Object.keys(sentFirst.pieces).sort()).toEqual([
        'awaiting',
        'bom',
        'calendar',
        'details',
        'firmReceipts',
        'loops',
        'parts',
        'sequence',
      ]);
      expect(sentNext?.kind === 'compute' && Object.keys(sentNext.pieces).sort()).toEqual(['parts', 'sequence']);
      expect(sentNext?.kind === 'compute' && sentNext.patches).toEqual({});
      expect(text(bytes.json)).toBe(JSON.stringify(inPlace(next)));
      // 4 C: the first two units build (2 × 2), none is at risk.
      expect(JSON.parse(text(bytes.json))).toMatchObject({ unitsAtRiskCount: 0, shortages: [] });
    } finally {
      posted.mockRestore();
      await own.close();
    }
  });

  it('has the queue view of a walk afresh walked beside it in a thread of its own, with the same answer', async () => {
    // The benchmark plant, small: every walk afresh is handed to the helper (from 0 needs on).
    const plant = generatePlanFixture({ partCount: 300, models: 4, workingDays: 15, unitsPerDay: 12 });
    const own = new LineRiskRunner({ queueHelperFrom: 0 });
    try {
      // The helper's thread takes a moment to start; walks before it is up walk their queue view
      // themselves. Each horizon is a walk afresh.
      let helped = 0;
      for (let days = 3; days <= 40 && helped === 0; days += 1) {
        const walked: LineRiskInput = {
          ...plant,
          firmReceipts: plant.scheduledReceipts,
          to: addWorkingDays(plant.from, days % 12, plant.calendar),
        };
        const bytes = await compute(`plant-${days}`, walked, own);
        expect(text(bytes.json)).toBe(JSON.stringify(inPlace(walked)));
        helped = await own.helped();
        if (helped === 0) await new Promise((resolve) => setTimeout(resolve, 100));
      }
      expect(helped).toBeGreaterThan(0);
      // And a walk after it, which keeps the queue view the helper found.
      const later: LineRiskInput = {
        ...plant,
        firmReceipts: plant.scheduledReceipts,
        to: addWorkingDays(plant.from, 11, plant.calendar),
        parts: plant.parts.map((each, index) =>
          index === 7 ? { ...each, leadTimeDays: each.leadTimeDays + 1 } : each,
        ),
      };
      const before = { ...later, parts: plant.parts };
      await compute('plant-before', before, own);
      expect(text((await compute('plant-before', later, own)).json)).toBe(JSON.stringify(inPlace(later)));
    } finally {
      await own.close();
    }
  });

  it('sends the few rows of a long list that changed, and answers as if sent the whole list', async () => {
    const own = new LineRiskRunner();
    const posted = vi.spyOn(Worker.prototype, 'postMessage');
    const lastCompute = () =>
      posted.mock.calls.map(([message]) => message as WorkerRequest).findLast((m) => m.kind === 'compute');
    try {
      const long: LineRiskInput = {
        ...input,
        parts: [...input.parts, ...['E', 'F', 'G', 'H', 'I', 'J'].map((number) => part(number, { onHand: 1 }))],
      };
      await compute('a', long, own);
      // C's stock counted up to 4: one row of eight.
      const counted: LineRiskInput = {
        ...long,
        parts: long.parts.map((row) => ({ ...row, onHand: row.partNumber === 'C' ? 4 : row.onHand })),
      };
      const bytes = await compute('b', counted, own);
      const sent = lastCompute();

      expect(sent?.kind === 'compute' && sent.pieces).toEqual({});
      expect(sent?.kind === 'compute' && sent.patches).toEqual({ parts: [[1, counted.parts[1]]] });
      expect(text(bytes.json)).toBe(JSON.stringify(inPlace(counted)));
      expect(JSON.parse(text(bytes.json))).toMatchObject({ unitsAtRiskCount: 1 });
    } finally {
      posted.mockRestore();
      await own.close();
    }
  });
});
