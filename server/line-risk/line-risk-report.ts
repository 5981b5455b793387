import { gzipSync } from 'node:zlib';
import { roundQty } from '../../shared/domain/quantity';
import type { LineRiskReport, ShortageDto } from '../../shared/schemas/line-risk';
import { etagOf } from '../http/serialised-body';
import type { AwaitingLine, PartDetails } from './line-risk-inputs';
import type { LineRiskSummary, ShortageSummary } from './line-risk-summary';

/** The report as published, built once per result. */
export function toReport(
  summary: LineRiskSummary,
  details: ReadonlyMap<string, PartDetails>,
  awaiting: readonly AwaitingLine[],
): LineRiskReport {
  const awaitingByPart = awaitingOf(awaiting);
  return {
    from: summary.from,
    to: summary.to,
    today: summary.today,
    days: summary.days,
    frozenWindowDays: summary.frozenWindowDays,
    frozenUntil: summary.frozenUntil,
    unitsInHorizon: summary.unitsInHorizon,
    unitsBuilt: summary.unitsBuilt,
    unitsAtRisk: summary.unitsAtRisk,
    unitsAtRiskCount: summary.unitsAtRiskCount,
    // Last, so the shortages alone (GET /api/shortages) are a tail of the report's bytes.
    shortages: summary.shortages.map((shortage) =>
      toShortage(shortage, details.get(shortage.partNumber), awaitingByPart.get(shortage.partNumber) ?? null),
    ),
  };
}

type Awaiting = ShortageDto['awaitingConfirmation'];

/** The awaiting lines summed by part, with the releases they are on (each once, in number order). */
function awaitingOf(lines: readonly AwaitingLine[]): Map<string, NonNullable<Awaiting>> {
  const byPart = new Map<string, NonNullable<Awaiting>>();
  for (const line of lines) {
    const entry = byPart.get(line.partNumber);
    if (!entry) byPart.set(line.partNumber, { qty: line.qty, releaseNumbers: [line.releaseNumber] });
    else {
      // Summed as the plan sums quantities: no float dust on the screen (0.1 + 0.2).
      entry.qty = roundQty(entry.qty + line.qty);
      if (!entry.releaseNumbers.includes(line.releaseNumber)) entry.releaseNumbers.push(line.releaseNumber);
    }
  }
  return byPart;
}

/** A short part as published, with what the screen shows beside the figures. */
function toShortage(shortage: ShortageSummary, details: PartDetails | undefined, awaiting: Awaiting): ShortageDto {
  return {
    partNumber: shortage.partNumber,
    firstShortDate: shortage.firstShortDate,
    shortQty: shortage.shortQty,
    slotsAtRisk: shortage.slotsAtRisk,
    slotsAtRiskCount: shortage.slotsAtRiskCount,
    action: shortage.action,
    needBy: shortage.needBy,
    releaseBy: shortage.releaseBy,
    leadTimeDays: shortage.leadTimeDays,
    loop: shortage.loop,
    description: details?.description ?? '',
    uom: details?.uom ?? 'H87',
    supplierCode: shortage.supplierCode,
    supplierName: details?.supplierName ?? null,
    hazardous: details?.hazardous ?? false,
    onHand: shortage.onHand,
    firmReceiptQty: shortage.firmReceiptQty,
    awaitingConfirmation: awaiting,
    daysUntilImpact: shortage.daysUntilImpact,
    inFrozenWindow: shortage.inFrozenWindow,
    rescue: shortage.rescue,
  };
}

/**
 * A report as the bytes GET /api/line-risk sends, made where it was computed (the worker), so the
 * main thread neither copies a large plant's report as objects nor serialises or compresses it.
 * Each array owns its memory, so it can be transferred rather than copied.
 */
export interface ReportBytes {
  json: Uint8Array;
  gzip: Uint8Array;
  etag: string;
  /** Where the shortages array starts in `json`; it ends one byte before the end (the closing brace). */
  shortagesAt: number;
}

export function serialiseReport(report: LineRiskReport): ReportBytes {
  const { shortages, ...head } = report;
  const headJson = JSON.stringify(head);
  // The same text JSON.stringify(report) gives: shortages is the report's last key.
  const prefix = `${headJson.slice(0, -1)}${headJson === '{}' ? '' : ','}"shortages":`;
  // Buffer.from writes UTF-8 about twice as fast as TextEncoder on a large report (5 against 10 ms at 16×).
  const json = ownBytes(Buffer.from(`${prefix}${JSON.stringify(shortages)}}`));
  // The fastest level: made after every change, it is on the way of the answer. The body comes out
  // about half as large again as at the default level (0.8 against 0.55 MB at 16×).
  const gzip = ownBytes(gzipSync(json, { level: 1 }));
  return {
    json,
    gzip,
    // The same JSON always compresses to the same bytes, and other JSON to other bytes: the tag of
    // the compressed body tags the JSON too, for a ninth of the hashing (7 MB of JSON at 16×).
    etag: etagOf(gzip),
    shortagesAt: Buffer.byteLength(prefix),
  };
}

/** A copy when the bytes share their buffer (Node pools small buffers), so the buffer can be transferred. */
function ownBytes(bytes: Uint8Array): Uint8Array {
  return bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? bytes : new Uint8Array(bytes);
}
