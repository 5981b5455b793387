import { parentPort } from 'node:worker_threads';
import { BomCycleError } from '../../shared/domain/bom';
import { walkLineRisk } from '../../shared/domain/line-risk';
import type { LineRiskRun } from '../../shared/domain/line-risk-run';
import { PlanInputError } from '../../shared/domain/plan-model';
import type { WorkerReply, WorkerRequest } from './line-risk-runner';
import { slotsPage, summarise, unitsPage } from './line-risk-summary';

/*
 * Runs the line-risk engine off the server's event loop and keeps each run here, so only the
 * summary and the pages asked for are made into objects and cross back to the main thread.
 */
const results = new Map<string, LineRiskRun>();

function answer(request: WorkerRequest): unknown {
  switch (request.kind) {
    case 'compute': {
      const result = walkLineRisk(request.input);
      results.set(request.key, result);
      return summarise(result);
    }
    case 'units': {
      const result = results.get(request.key);
      return result ? unitsPage(result, request.offset, request.limit) : undefined;
    }
    case 'slots': {
      const result = results.get(request.key);
      return result ? slotsPage(result, request.partNumber, request.offset, request.limit) : undefined;
    }
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

parentPort!.on('message', (request: WorkerRequest) => {
  let reply: WorkerReply;
  try {
    reply = { id: request.id, ok: true, value: answer(request) };
  } catch (error) {
    reply = {
      id: request.id,
      ok: false,
      error: { kind: errorKind(error), message: error instanceof Error ? error.message : String(error) },
    };
  }
  parentPort!.postMessage(reply);
});
