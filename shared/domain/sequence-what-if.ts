import { LineRiskWalker, type LineRiskInput, type UnitAtRisk } from './line-risk';
import { computePlan, grossDemandByDay } from './plan';
import { roundQty } from './quantity';
import type { DayOrder } from './sequence';
import type { IsoDate, SequenceSlot } from './types';

/*
 * A change to the build sequence tried before it is saved: the same line-risk engine and the same
 * planning engine as the server's, run on the sequence as it would be. Pure, so the board runs it
 * in the browser with no round trip.
 */

/** Gross demand of each bought part by working day, as the plan (and so the supplier's forecast) has it. */
export interface PartDemand {
  partNumber: string;
  supplierCode: string | null;
  uom: string;
  byDay: Record<IsoDate, number>;
}

/** What line risk and supplier demand look like for one sequence. */
export interface SequenceOutlook {
  /** The units that cannot be built, in build order, with what each lacks. */
  unitsAtRisk: UnitAtRisk[];
  /** The horizon's working days. */
  days: readonly IsoDate[];
  demand: PartDemand[];
}

/** One part's demand that a change moves, day by day (only days that change). */
export interface PartDemandChange {
  partNumber: string;
  uom: string;
  days: { date: IsoDate; before: number; after: number; change: number }[];
}

export interface SupplierDemandChange {
  /** Null for bought parts without a supplier. */
  supplierCode: string | null;
  parts: PartDemandChange[];
}

export interface WhatIfResult {
  /** Units at risk after the change that were not before, in build order, with what they would lack. */
  becomeAtRisk: UnitAtRisk[];
  /** Units at risk before the change that no longer are, with what they lacked. */
  stopAtRisk: UnitAtRisk[];
  /** Each supplier's demand that the change moves, by supplier then part. */
  supplierDemand: SupplierDemandChange[];
  after: SequenceOutlook;
}

/** The sequence with the listed days in their new order (a unit not listed keeps its day and place). */
export function resequenced(sequence: readonly SequenceSlot[], orders: readonly DayOrder[]): SequenceSlot[] {
  const places = new Map<string, { date: IsoDate; sequence: number }>();
  for (const order of orders) {
    order.serials.forEach((serial, index) => places.set(serial, { date: order.date, sequence: index + 1 }));
  }
  return sequence.map((slot) => {
    const place = places.get(slot.serial);
    return place ? { ...slot, ...place } : slot;
  });
}

/**
 * Line risk and the plan's gross demand of bought parts for the input's sequence. `walker`: the
 * one that made the outlook this one is compared with, which then walks only what the change moved
 * (a move judges every unit again, but explodes again only the units whose made stock moved).
 */
export function sequenceOutlook(input: LineRiskInput, walker = new LineRiskWalker()): SequenceOutlook {
  // The units at risk alone: the board marks them and a what-if compares them, while every slot
  // of every short part, as objects, would cost as much again on a large plant.
  const run = walker.walk(input);
  const plan = computePlan({
    parts: input.parts,
    bom: input.bom,
    sequence: input.sequence,
    scheduledReceipts: input.firmReceipts,
    calendar: input.calendar,
    from: input.from,
    to: input.to,
  });
  const uomOf = new Map(input.parts.map((part) => [part.partNumber, part.uom ?? 'H87']));
  const demand = grossDemandByDay(plan, input.parts).rows.map((row) => ({
    partNumber: row.partNumber,
    supplierCode: row.supplierCode,
    uom: uomOf.get(row.partNumber) ?? 'H87',
    byDay: row.byDay,
  }));
  return { unitsAtRisk: run.unitsAtRisk(), days: run.header.days, demand };
}

/**
 * Tries new day orders against the outlook of the sequence as it stands: which units would become
 * or stop being at risk, and how each supplier's demand by day would move. With the walker that
 * made `before` (see sequenceOutlook), the move is walked from that walk.
 */
export function tryResequence(
  input: LineRiskInput,
  before: SequenceOutlook,
  orders: readonly DayOrder[],
  walker?: LineRiskWalker,
): WhatIfResult {
  const after = sequenceOutlook({ ...input, sequence: resequenced(input.sequence, orders) }, walker);
  const wasAtRisk = new Map(before.unitsAtRisk.map((unit) => [unit.serial, unit]));
  const isAtRisk = new Map(after.unitsAtRisk.map((unit) => [unit.serial, unit]));
  return {
    becomeAtRisk: after.unitsAtRisk.filter((unit) => !wasAtRisk.has(unit.serial)),
    stopAtRisk: before.unitsAtRisk.filter((unit) => !isAtRisk.has(unit.serial)),
    supplierDemand: demandChanges(before.demand, after.demand),
    after,
  };
}

/** Day-by-day differences of gross demand, grouped by supplier; parts and days that do not move are left out. */
export function demandChanges(before: readonly PartDemand[], after: readonly PartDemand[]): SupplierDemandChange[] {
  const beforeByPart = new Map(before.map((row) => [row.partNumber, row]));
  const afterByPart = new Map(after.map((row) => [row.partNumber, row]));
  const partNumbers = [...new Set([...beforeByPart.keys(), ...afterByPart.keys()])].sort();
  const bySupplier = new Map<string | null, PartDemandChange[]>();
  for (const partNumber of partNumbers) {
    const was = beforeByPart.get(partNumber);
    const is = afterByPart.get(partNumber);
    const row = (is ?? was)!;
    const dates = [...new Set([...Object.keys(was?.byDay ?? {}), ...Object.keys(is?.byDay ?? {})])].sort();
    const days = dates
      .map((date) => {
        const previous = was?.byDay[date] ?? 0;
        const next = is?.byDay[date] ?? 0;
        return { date, before: previous, after: next, change: roundQty(next - previous) };
      })
      .filter((day) => day.change !== 0);
    if (days.length === 0) continue;
    const list = bySupplier.get(row.supplierCode) ?? [];
    list.push({ partNumber, uom: row.uom, days });
    bySupplier.set(row.supplierCode, list);
  }
  return [...bySupplier.entries()]
    .sort(([a], [b]) => (a === b ? 0 : a === null ? 1 : b === null ? -1 : a < b ? -1 : 1))
    .map(([supplierCode, parts]) => ({ supplierCode, parts }));
}
