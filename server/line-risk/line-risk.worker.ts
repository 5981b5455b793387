import { parentPort, workerData } from 'node:worker_threads';
import { BomCycleError } from '../../shared/domain/bom';
import { LineRiskWalker } from '../../shared/domain/line-risk';
import type { LineRiskRun } from '../../shared/domain/line-risk-run';
import { PlanInputError } from '../../shared/domain/plan-model';
import type { LineRiskPieces, WorkerReply, WorkerRequest } from './line-risk-runner';
import { serialiseReport, toReport, type ReportBytes } from './line-risk-report';
import { slotsPage, summarise, unitsPage } from './line-risk-summary';
import { createQueueHelper } from './queue-helper';

/*
 * Runs the line-risk engine off the server's event loop and keeps each run here, so only the
 * report's bytes and the pages asked for cross back to the main thread. The input pieces are kept
 * too: the main thread sends only those that changed.
 */
const results = new Map<string, LineRiskRun>();
const held: Partial<LineRiskPieces> = {};
/**
 * Keeps the last walk (about 120 MB at 16 times the demo plant), so a walk after a stock change or
 * an engineering change to bought components walks only the changed parts again; a walk of
 * another horizon is made in full.
 */
const helper = createQueueHelper((workerData as { queueHelperFrom?: number } | null)?.queueHelperFrom);
/** Walks whose queue view the helper walked. */
let helped = 0;
const walker = new LineRiskWalker((job) => {
  const stream = helper(job);
  if (stream) helped += 1;
  return stream;
});

function answer(request: WorkerRequest): unknown {
  switch (request.kind) {
    case 'compute': {
      Object.assign(held, request.pieces);
      for (const [name, rows] of Object.entries(request.patches)) {
        // A new list: the results computed from the old one keep it as it was.
        const list = [...(held[name as keyof LineRiskPieces] as unknown[])];
        for (const [index, row] of rows) list[index] = row;
        (held as Record<string, unknown>)[name] = list;
      }
      const pieces = held as LineRiskPieces;
      const result = walker.walk({
        parts: pieces.parts,
        bom: pieces.bom,
        sequence: pieces.sequence,
        firmReceipts: pieces.firmReceipts,
        loops: pieces.loops,
        calendar: pieces.calendar,
        ...request.options,
      });
      results.set(request.key, result);
      return serialiseReport(toReport(summarise(result), pieces.details, pieces.awaiting));
    }
    case 'units': {
      const result = results.get(request.key);
      return result ? unitsPage(result, request.offset, request.limit) : undefined;
    }
    case 'slots': {
      const result = results.get(request.key);
      return result ? slotsPage(result, request.partNumber, request.offset, request.limit) : undefined;
    }
    case 'helped':
      return helped;
    case 'drop':
      results.delete(request.key);
      return null;
  }
}

function errorKind(error: unknown): 'cycle' | 'input' | 'other' {
  if (error instanceof BomCycleError) return 'cycle';
  if (error instanceof PlanInputError) return 'input';
  return 'other';
}

/** Whether slices of grouping ahead are scheduled: one chain at a time, whatever walks come meanwhile. */
let groupingAhead = false;

function groupAhead(): void {
  groupingAhead = walker.groupAhead();
  if (groupingAhead) setImmediate(groupAhead);
}

parentPort!.on('message', (request: WorkerRequest) => {
  let reply: WorkerReply;
  let transfer: ArrayBuffer[] = [];
  try {
    const value = answer(request);
    reply = { id: request.id, ok: true, value };
    // The report's bytes are handed over, not copied.
    if (request.kind === 'compute') {
      const bytes = value as ReportBytes;
      transfer = [bytes.json.buffer as ArrayBuffer, bytes.gzip.buffer as ArrayBuffer];
    }
  } catch (error) {
    reply = {
      id: request.id,
      ok: false,
      error: { kind: errorKind(error), message: error instanceof Error ? error.message : String(error) },
    };
  }
  parentPort!.postMessage(reply, transfer);
  // Once the answer is sent: the next walk then finds every unit's needs grouped. A slice at a
  // time, so the next request is taken up between two slices.
  if (request.kind === 'compute' && !groupingAhead) {
    groupingAhead = true;
    setImmediate(groupAhead);
  }
});
