import { extname } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Worker } from 'node:worker_threads';
import type { LineRiskInput, SlotAtRisk, UnitAtRisk } from '../../shared/domain/line-risk';
import { changedRows, samePiece } from './changed-rows';
import type { AwaitingLine, PartDetails } from './line-risk-inputs';
import type { ReportBytes } from './line-risk-report';
import { startWorker } from './start-worker';

/** The engine's input that comes from the planning data, with the part details and awaiting lines the report shows. */
export interface LineRiskPieces extends Pick<
  LineRiskInput,
  'parts' | 'bom' | 'sequence' | 'firmReceipts' | 'calendar'
> {
  loops: NonNullable<LineRiskInput['loops']>;
  details: ReadonlyMap<string, PartDetails>;
  awaiting: readonly AwaitingLine[];
}

/** What one run asks for beyond the planning data. */
export type LineRiskOptions = Pick<LineRiskInput, 'from' | 'to' | 'today' | 'frozenWindowDays'>;

const PIECES = ['parts', 'bom', 'sequence', 'firmReceipts', 'loops', 'calendar', 'details', 'awaiting'] as const;

/** Rows of list pieces that changed, by place: the rest of each list stands as the worker holds it. */
export type PiecePatches = Partial<Record<(typeof PIECES)[number], [index: number, row: unknown][]>>;

/** A list piece with at most this share of its rows changed is sent as a patch. */
const PATCH_SHARE = 0.25;

export type WorkerRequest = { id: number } & (
  | { kind: 'compute'; key: string; pieces: Partial<LineRiskPieces>; patches: PiecePatches; options: LineRiskOptions }
  | { kind: 'units'; key: string; offset: number; limit: number }
  | { kind: 'slots'; key: string; partNumber: string; offset: number; limit: number }
  | { kind: 'drop'; key: string }
  | { kind: 'helped' }
);

type Request = WorkerRequest extends infer R ? (R extends unknown ? Omit<R, 'id'> : never) : never;

export type WorkerReply =
  | { id: number; ok: true; value: unknown }
  | { id: number; ok: false; error: { kind: 'cycle' | 'input' | 'other'; message: string } };

/** An error the engine raised in the worker, with the kind the service maps to an HTTP answer. */
export class LineRiskWorkerError extends Error {
  constructor(
    readonly kind: 'cycle' | 'input' | 'other',
    message: string,
  ) {
    super(message);
  }
}

/**
 * The line-risk engine in a worker thread: a large plant takes seconds to walk, and on the main
 * thread every other request would wait that long. The worker keeps the full results by key; the
 * report comes back as bytes ready to send, and pages as objects. The worker also keeps the input
 * it was last sent, and only what differs from it is copied over again: after most planning
 * changes the BOM and the calendar stand as they were, and a stock change alters a few parts of
 * the list. It is started on first use and restarted after a crash (results held by the dead one
 * are simply missing, and the caller computes again).
 */
export class LineRiskRunner {
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly pending = new Map<number, { resolve: (value: unknown) => void; reject: (error: Error) => void }>();
  /** The pieces the worker holds (or an equal copy of each). */
  private held: Partial<LineRiskPieces> = {};

  /** `queueHelperFrom`: the size of walk from which the worker has the queue view walked beside it (see queue-helper.ts). */
  constructor(private readonly options: { queueHelperFrom?: number } = {}) {}

  /** Walks the line risk for these pieces and options; the report as the bytes to send. */
  compute(key: string, pieces: LineRiskPieces, options: LineRiskOptions): Promise<ReportBytes> {
    this.start();
    const changed: Partial<LineRiskPieces> = {};
    const patches: PiecePatches = {};
    for (const name of PIECES) {
      const piece = pieces[name];
      const held = this.held[name];
      (this.held as Record<string, unknown>)[name] = piece;
      if (held === piece || held === undefined) {
        if (held === undefined) (changed as Record<string, unknown>)[name] = piece;
        continue;
      }
      // A stock change alters a few rows of 30,000 parts: those rows alone are copied over.
      const rows = changedRows(held, piece);
      if (rows && rows.length <= PATCH_SHARE * (piece as unknown[]).length) {
        if (rows.length > 0) patches[name] = rows.map((index) => [index, (piece as unknown[])[index]]);
      } else if (rows || !samePiece(held, piece)) {
        (changed as Record<string, unknown>)[name] = piece;
      }
    }
    return this.send({ kind: 'compute', key, pieces: changed, patches, options }) as Promise<ReportBytes>;
  }

  /** Undefined when the worker no longer holds the result. */
  units(key: string, offset: number, limit: number) {
    return this.send({ kind: 'units', key, offset, limit }) as Promise<
      { total: number; units: UnitAtRisk[] } | undefined
    >;
  }

  /** Undefined when the worker no longer holds the result; null when the part is not short. */
  slots(key: string, partNumber: string, offset: number, limit: number) {
    return this.send({ kind: 'slots', key, partNumber, offset, limit }) as Promise<
      { total: number; slots: SlotAtRisk[] } | null | undefined
    >;
  }

  drop(key: string): void {
    if (this.worker) void this.send({ kind: 'drop', key }).catch(() => undefined);
  }

  /** How many walks of the worker had their queue view walked beside them (see queue-helper.ts). */
  helped(): Promise<number> {
    return this.send({ kind: 'helped' }) as Promise<number>;
  }

  async close(): Promise<void> {
    const worker = this.worker;
    this.worker = null;
    if (worker) await worker.terminate();
  }

  private send(request: Request): Promise<unknown> {
    const worker = this.start();
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      worker.postMessage({ ...request, id });
    });
  }

  private start(): Worker {
    if (this.worker) return this.worker;
    // A new worker holds nothing.
    this.held = {};
    const worker = startWorker(
      new URL(`./line-risk.worker${extname(fileURLToPath(import.meta.url))}`, import.meta.url),
      { workerData: { queueHelperFrom: this.options.queueHelperFrom } },
    );
    // Idle, it must not keep the process alive; the server's own socket does that.
    worker.unref();
    worker.on('message', (reply: WorkerReply) => {
      const waiting = this.pending.get(reply.id);
      if (!waiting) return;
      this.pending.delete(reply.id);
      if (reply.ok) waiting.resolve(reply.value);
      else waiting.reject(new LineRiskWorkerError(reply.error.kind, reply.error.message));
    });
    const fail = (error: Error) => {
      if (this.worker === worker) this.worker = null;
      for (const waiting of this.pending.values()) waiting.reject(error);
      this.pending.clear();
    };
    worker.on('error', fail);
    worker.on('exit', (code) => fail(new Error(`The line-risk worker stopped (exit code ${code}).`)));
    this.worker = worker;
    return worker;
  }
}
