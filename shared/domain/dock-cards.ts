import { QTY_EPSILON, roundQty } from './quantity';
import type { IsoDate } from './types';

/*
 * How a release appears on the receiving board: one card per shipment the supplier announced,
 * and the lines (or parts of lines) not yet announced on cards by the day they are expected. A
 * receipt counts against the shipment it names; goods that came without a notice count against
 * the unshipped rest. Lines due on different days never share a card, so the first delivery
 * does not carry later ones out of Expected.
 */

/** A release line as the board reads it. */
export interface BoardLine {
  id: number;
  /** What the release asks for: the confirmed quantity once the supplier gave one, else the request. */
  orderedQty: number;
  closed: boolean;
  needDate: IsoDate;
  /** The answered arrival (ship date plus transit), when the supplier gave a ship date. */
  arrivalDate: IsoDate | null;
  /** Column of the line's unshipped rest. */
  dockColumn: string;
}

/** One ship notice of the release. */
export interface BoardNotice {
  id: number;
  shipDate: IsoDate;
  /** Ship date plus the supplier's transit working days. */
  arrivalDate: IsoDate;
  dockColumn: string;
  lines: { lineId: number; qty: number }[];
}

/** One receipt: the usable quantity it added, the shipment it counted (null: none), and whether it was today. */
export interface BoardReceipt {
  lineId: number;
  shipNoticeId: number | null;
  usableQty: number;
  today: boolean;
}

export interface BoardCardLine {
  lineId: number;
  /** What this card brings of the line. */
  qty: number;
  /** What was counted in against this card. */
  receivedQty: number;
  open: boolean;
}

export interface BoardCard {
  key: string;
  kind: 'shipment' | 'expected';
  shipNoticeId: number | null;
  shipDate: IsoDate | null;
  /** The day the dock expects the goods. */
  arrivalDate: IsoDate;
  column: string;
  lines: BoardCardLine[];
}

/** Key of a shipment's card. */
export function shipmentCardKey(noticeId: number): string {
  return `shipment-${noticeId}`;
}

/** Key of the card of a release's unshipped lines expected on one day. */
export function expectedCardKey(releaseId: number, arrivalDate: IsoDate): string {
  return `expected-${releaseId}-${arrivalDate}`;
}

/** The release id or ship-notice id a card key names; null when the key is not one of ours. */
export function parseCardKey(
  key: string,
): { kind: 'shipment'; shipNoticeId: number } | { kind: 'expected'; releaseId: number; arrivalDate: IsoDate } | null {
  const shipment = /^shipment-(\d+)$/.exec(key);
  if (shipment) return { kind: 'shipment', shipNoticeId: Number(shipment[1]) };
  const expected = /^expected-(\d+)-(\d{4}-\d{2}-\d{2})$/.exec(key);
  if (expected) return { kind: 'expected', releaseId: Number(expected[1]), arrivalDate: expected[2]! };
  return null;
}

/** The day an unshipped line is expected: its answered arrival, else its need date. */
export function expectedArrival(line: Pick<BoardLine, 'needDate' | 'arrivalDate'>): IsoDate {
  return line.arrivalDate ?? line.needDate;
}

function sum(values: number[]): number {
  return roundQty(values.reduce((total, value) => total + value, 0));
}

/**
 * The cards of one release: every card with something still to come, and those counted in today.
 * `columnOrder` ranks columns so a card whose lines stand in different columns shows in the
 * earliest (nothing is further along than its least advanced line).
 */
export function releaseCards(
  releaseId: number,
  lines: readonly BoardLine[],
  notices: readonly BoardNotice[],
  receipts: readonly BoardReceipt[],
  columnOrder: readonly string[],
): BoardCard[] {
  const lineById = new Map(lines.map((line) => [line.id, line]));
  const cards: BoardCard[] = [];

  for (const notice of [...notices].sort((a, b) => a.id - b.id)) {
    const counted = receipts.filter((receipt) => receipt.shipNoticeId === notice.id);
    const cardLines = notice.lines.flatMap((shipped) => {
      const line = lineById.get(shipped.lineId);
      if (!line) return [];
      const receivedQty = sum(counted.filter((r) => r.lineId === line.id).map((r) => r.usableQty));
      return [
        {
          lineId: line.id,
          qty: shipped.qty,
          receivedQty,
          open: !line.closed && receivedQty < shipped.qty - QTY_EPSILON,
        },
      ];
    });
    if (cardLines.some((line) => line.open) || counted.some((receipt) => receipt.today)) {
      cards.push({
        key: shipmentCardKey(notice.id),
        kind: 'shipment',
        shipNoticeId: notice.id,
        shipDate: notice.shipDate,
        arrivalDate: notice.arrivalDate,
        column: notice.dockColumn,
        lines: cardLines,
      });
    }
  }

  const byDate = new Map<IsoDate, { line: BoardLine; cardLine: BoardCardLine }[]>();
  for (const line of lines) {
    const shipped = sum(notices.flatMap((n) => n.lines.filter((l) => l.lineId === line.id).map((l) => l.qty)));
    const unshipped = roundQty(Math.max(0, line.orderedQty - shipped));
    const direct = receipts.filter((r) => r.lineId === line.id && r.shipNoticeId === null);
    const receivedQty = sum(direct.map((r) => r.usableQty));
    const open = !line.closed && receivedQty < unshipped - QTY_EPSILON;
    if (!open && !direct.some((receipt) => receipt.today)) continue;
    const date = expectedArrival(line);
    const group = byDate.get(date) ?? [];
    group.push({ line, cardLine: { lineId: line.id, qty: unshipped, receivedQty, open } });
    byDate.set(date, group);
  }
  for (const [date, group] of byDate) {
    const columns = group.map((entry) => entry.line.dockColumn);
    const column = columns.reduce((earliest, candidate) =>
      columnOrder.indexOf(candidate) < columnOrder.indexOf(earliest) ? candidate : earliest,
    );
    cards.push({
      key: expectedCardKey(releaseId, date),
      kind: 'expected',
      shipNoticeId: null,
      shipDate: null,
      arrivalDate: date,
      column,
      lines: group.map((entry) => entry.cardLine),
    });
  }
  return cards;
}
