import { LineRiskWalker, type LineRiskInput, type UnitAtRisk } from '@shared/domain/line-risk';
import type { DayOrder } from '@shared/domain/sequence';
import {
  resequenced,
  sequenceOutlook,
  tryResequence,
  type SequenceOutlook,
  type SupplierDemandChange,
} from '@shared/domain/sequence-what-if';

/*
 * The Build sequence board's line risk, worked out in the browser with the server's engine: the
 * engine's input read once per horizon, the units at risk marked on the cards, and a move tried
 * before it is saved. It runs in a worker of its own where the browser has them (on a large plant
 * a walk takes about a second, and the page would freeze that long), else in the page itself.
 */

/**
 * Lacks of a unit at risk the board receives: its tip and the what-if name them and count the
 * rest. On a large plant a unit can lack a hundred parts or more; the Line risk screen lists them all.
 */
export const LACKS_NAMED = 5;

/** A unit at risk as the board gets it: its first lacks (what stops it first), and how many more it has. */
export interface BoardUnitAtRisk extends UnitAtRisk {
  moreLacks: number;
}

/** What a move would do, with the time the browser took to work it out. */
export interface BoardWhatIf {
  /** Units at risk after the move that were not before, in build order. */
  becomeAtRisk: BoardUnitAtRisk[];
  /** Units at risk before the move that no longer are. */
  stopAtRisk: BoardUnitAtRisk[];
  /** Each supplier's demand the move shifts, by supplier then part. */
  supplierDemand: SupplierDemandChange[];
  elapsedMs: number;
}

export type BoardRiskRequest =
  /** The engine's input as the server sent it (JSON bytes): the board's units at risk. */
  | { kind: 'load'; json: ArrayBuffer }
  /** What the new day orders would do. */
  | { kind: 'preview'; orders: DayOrder[] }
  /** The day orders saved: the board's units at risk after them. */
  | { kind: 'adopt'; orders: DayOrder[] };

export interface BoardRiskAnswers {
  load: BoardUnitAtRisk[];
  preview: BoardWhatIf;
  adopt: BoardUnitAtRisk[];
}

export type BoardRiskHandler = <K extends BoardRiskRequest['kind']>(
  request: Extract<BoardRiskRequest, { kind: K }>,
) => BoardRiskAnswers[K];

/** The engine's state and its answers, the same in a worker or in the page. */
export function boardRiskHandler(): BoardRiskHandler {
  // Keeps its last walk: a move is walked from it (every unit judged again, only the units whose
  // made stock moved exploded again).
  const walker = new LineRiskWalker();
  let board: { input: LineRiskInput; outlook: SequenceOutlook } | null = null;
  /** The last move tried and what it would give, for the save that follows it. */
  let tried: { orders: string; after: SequenceOutlook } | null = null;

  const loaded = () => {
    if (!board) throw new Error("The board's line risk is not loaded yet");
    return board;
  };
  const handle = (request: BoardRiskRequest): BoardRiskAnswers[BoardRiskRequest['kind']] => {
    switch (request.kind) {
      case 'load': {
        const input = JSON.parse(new TextDecoder().decode(request.json)) as LineRiskInput;
        board = { input, outlook: sequenceOutlook(input, walker) };
        tried = null;
        return board.outlook.unitsAtRisk.map(brief);
      }
      case 'preview': {
        const { input, outlook } = loaded();
        const started = performance.now();
        const result = tryResequence(input, outlook, request.orders, walker);
        tried = { orders: JSON.stringify(request.orders), after: result.after };
        return {
          becomeAtRisk: result.becomeAtRisk.map(brief),
          stopAtRisk: result.stopAtRisk.map(brief),
          supplierDemand: result.supplierDemand,
          elapsedMs: performance.now() - started,
        };
      }
      case 'adopt': {
        const { input } = loaded();
        const moved = { ...input, sequence: resequenced(input.sequence, request.orders) };
        const after = tried?.orders === JSON.stringify(request.orders) ? tried.after : sequenceOutlook(moved, walker);
        board = { input: moved, outlook: after };
        tried = null;
        return after.unitsAtRisk.map(brief);
      }
    }
  };
  return handle as BoardRiskHandler;
}

function brief(unit: UnitAtRisk): BoardUnitAtRisk {
  return { ...unit, lacks: unit.lacks.slice(0, LACKS_NAMED), moreLacks: Math.max(0, unit.lacks.length - LACKS_NAMED) };
}
