/*
 * Opening stock of the demo. Ordinary scheduled parts hold 12–20 days of their own demand, so none
 * runs out inside the first two working weeks (later days are for the normal releases to cover).
 * A kanban part's stock is its loop's full containers, which hold more than the demand over the
 * loop's replenishment time: 10 days more than a scheduled part, so no right-sized loop runs dry
 * before its first emptied container comes back. One part is deliberately thin so that Line risk has
 * a real alarm to show: the hazardous traction battery, whose supplier is late with the next
 * delivery, runs out inside its lead time (an expedite).
 */

/** Days of demand held by the deliberately short parts (each also gets half the next day's need). */
export const SHORT_COVER_DAYS: Record<string, number> = {
  'BAT-06-312': 4,
};

/**
 * The other planted line-risk stories. A kanban loop that lost cards on the floor and never had
 * them replaced: fewer cards circulate than it needs (a loop alarm). A part last counted long ago
 * that runs short in the four-week view: count it before trusting the figure (a count alarm).
 */
export const UNDERSIZED_LOOP = { partNumber: 'GRP-W', lostCards: 2, coverDays: 10 };
export const COUNT_TO_CHECK = 'DRM-R15';
/**
 * Parts last counted past the 90-day interval though none is short, so the Stock screen has counts
 * due to show: kanban parts of right-sized loops, which the line risk never finds short.
 */
export const DUE_FOR_COUNT = ['NUT-M8', 'SQW-50', 'BMR-80', 'BCB-24'];
/** A kanban loop with more cards than its demand needs: the buyer may take two out. */
export const OVERSIZED_LOOP = { partNumber: 'SQB-F20', extraCards: 2 };

const MIN_COVER_DAYS = 12;
const COVER_SPREAD_DAYS = 9;
const KANBAN_EXTRA_COVER_DAYS = 10;

/** A stable 12–20 day cover per part number, so stock levels differ without any randomness. */
export function normalCoverDays(partNumber: string): number {
  let hash = 0;
  for (const char of partNumber) hash = (hash * 31 + char.charCodeAt(0)) % 9973;
  return MIN_COVER_DAYS + (hash % COVER_SPREAD_DAYS);
}

/** Days of demand a bought part holds at the start, by how it is replenished. */
export function openingCoverDays(partNumber: string, replenishment: string | null): number {
  if (partNumber === UNDERSIZED_LOOP.partNumber) return UNDERSIZED_LOOP.coverDays;
  const normal = normalCoverDays(partNumber);
  return replenishment === 'kanban' ? normal + KANBAN_EXTRA_COVER_DAYS : normal;
}

/** The days on which a part is needed at all, in order (a new part after a change starts late). */
function activeDemand(perDay: number[]): number[] {
  return perDay.filter((qty) => qty > 0);
}

function roundQty(qty: number): number {
  // Float sums of kilograms and metres carry noise in the last bits; settle them before rounding.
  return Math.round(qty * 1e6) / 1e6;
}

/** On-hand covering the part's first `coverDays` days of need, rounded up to whole packs. */
export function coveringStock(perDay: number[], coverDays: number, packQty: number): number {
  const need = roundQty(
    activeDemand(perDay)
      .slice(0, coverDays)
      .reduce((sum, qty) => sum + qty, 0),
  );
  return Math.ceil(need / packQty) * packQty;
}

/** On-hand of a short part: `coverDays` full days and half of the next, so it runs out mid-shift. */
export function shortStock(perDay: number[], coverDays: number): number {
  const active = activeDemand(perDay);
  const full = active.slice(0, coverDays).reduce((sum, qty) => sum + qty, 0);
  return Math.floor(roundQty(full + (active[coverDays] ?? 0) / 2));
}

/** On-hand of a made part: what its own lead time consumes, so its first orders are not past due. */
export function madeStock(perDay: number[], leadTimeDays: number): number {
  return Math.ceil(
    roundQty(
      activeDemand(perDay)
        .slice(0, leadTimeDays)
        .reduce((sum, qty) => sum + qty, 0),
    ),
  );
}
