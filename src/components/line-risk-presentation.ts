import type { ShortageDto } from '@shared/schemas/line-risk';
import { roundQty } from '@shared/domain/quantity';
import { countOf, formatDay, formatQuantity } from '@/format';

/** Horizon lengths the planner can pick, in weeks. */
export const LINE_RISK_WEEKS = [1, 2, 4] as const;
export const DEFAULT_LINE_RISK_WEEKS = 2;

/** "next week", "next 2 weeks". */
export function horizonWords(weeks: number): string {
  return weeks === 1 ? 'next week' : `next ${weeks} weeks`;
}

/** How soon a shortage stops the line: inside the frozen sequence, within a working week, or later. */
export type ImpactLevel = 'frozen' | 'week' | 'later';

/** Working days in a plant week, the reach of "within a week". */
const WORKING_WEEK = 5;

export function impactLevel(shortage: Pick<ShortageDto, 'inFrozenWindow' | 'daysUntilImpact'>): ImpactLevel {
  if (shortage.inFrozenWindow) return 'frozen';
  return shortage.daysUntilImpact <= WORKING_WEEK ? 'week' : 'later';
}

export const IMPACT_WORDS: Record<ImpactLevel, string> = {
  frozen: 'In frozen window',
  week: 'Within a week',
  later: 'Later',
};

/** "today", "in 1 working day", "in 3 working days" (or "3 working days ago" for a past date). */
export function impactWhen(daysUntilImpact: number): string {
  if (daysUntilImpact === 0) return 'today';
  if (daysUntilImpact === 1) return 'in 1 working day';
  if (daysUntilImpact > 1) return `in ${daysUntilImpact} working days`;
  const ago = -daysUntilImpact;
  return `${ago} working ${ago === 1 ? 'day' : 'days'} ago`;
}

/** "SRM (Rotomould Co)", or "the supplier" when the part has none on record. */
function supplierWords(shortage: ShortageDto): string {
  if (!shortage.supplierCode) return 'the supplier';
  return `${shortage.supplierCode}${shortage.supplierName ? ` (${shortage.supplierName})` : ''}`;
}

const RELEASE_LIST = new Intl.ListFormat('en', { type: 'conjunction' });

/** "R-000123", "R-000123 and R-000130". */
function releaseList(numbers: readonly string[]): string {
  return RELEASE_LIST.format(numbers);
}

/**
 * "Expedite 12 pcs of TNK-R60 from SRM (Rotomould Co) by Fri 4 Dec." When a release already asks
 * the supplier for the part and awaits an answer, the rescue starts there, so no one asks twice:
 * "Ask SRM (Rotomould Co) to confirm R-000123 (18 pcs) so that 12 pcs of TNK-R60 arrive by Fri 4 Dec."
 */
export function expediteSentence(shortage: ShortageDto): string {
  const { qty, needBy } = shortage.rescue.expedite;
  const awaiting = shortage.awaitingConfirmation;
  if (!awaiting) {
    const from = shortage.supplierCode ? ` from ${supplierWords(shortage)}` : '';
    return `Expedite ${formatQuantity(qty, shortage.uom)} of ${shortage.partNumber}${from} by ${formatDay(needBy)}.`;
  }
  const ask = `Ask ${supplierWords(shortage)} to confirm ${releaseList(awaiting.releaseNumbers)} (${formatQuantity(awaiting.qty, shortage.uom)})`;
  const more = roundQty(qty - awaiting.qty);
  const andMore = more > 0 ? ` and to expedite ${formatQuantity(more, shortage.uom)} more,` : '';
  return `${ask}${andMore} so that ${formatQuantity(qty, shortage.uom)} of ${shortage.partNumber} arrive by ${formatDay(needBy)}.`;
}

/** "18 pcs asked for on R-000123, not yet confirmed"; null when no release awaits an answer. */
export function awaitingNote(shortage: ShortageDto): string | null {
  const awaiting = shortage.awaitingConfirmation;
  if (!awaiting) return null;
  return `${formatQuantity(awaiting.qty, shortage.uom)} asked for on ${releaseList(awaiting.releaseNumbers)}, not yet confirmed`;
}

export type ShortageAction = ShortageDto['action'];

/** Alarms first, in this order; `release` is listed apart. */
export const ALARM_ACTIONS: readonly ShortageAction[] = ['expedite', 'loop', 'count'];

/** What each action asks of the planner, in a few words and in a sentence. */
export const ACTION_WORDS: Record<ShortageAction, { word: string; heading: string; meaning: string }> = {
  expedite: {
    word: 'Expedite',
    heading: 'Expedite now',
    meaning: "Short inside the supplier's lead time: only an expedite or a resequence saves these units.",
  },
  loop: {
    word: 'Loop',
    heading: 'Kanban loop cannot keep up',
    meaning:
      'The loop has fewer cards in circulation than it needs, or cannot hold the demand over its replenishment time.',
  },
  count: {
    word: 'Count',
    heading: 'Count the stock first',
    meaning: 'On-hand is negative or due a count, so the shortage may not be real: count the part before acting.',
  },
  release: {
    word: 'Release',
    heading: 'Covered by the normal release',
    meaning: "Short later than the supplier's lead time: the normal release covers it if it is sent by the date shown.",
  },
};

/** Short parts in display groups: the alarms by action (only those with parts), then the releases. */
export function groupShortages(shortages: readonly ShortageDto[]): {
  alarms: { action: ShortageAction; shortages: ShortageDto[] }[];
  releases: ShortageDto[];
} {
  const alarms = ALARM_ACTIONS.map((action) => ({
    action,
    shortages: shortages.filter((shortage) => shortage.action === action),
  })).filter((group) => group.shortages.length > 0);
  return { alarms, releases: shortages.filter((shortage) => shortage.action === 'release') };
}

/** The earliest date by which one of these releases must go out, or null. */
export function earliestReleaseBy(shortages: readonly ShortageDto[]): string | null {
  return shortages.reduce<string | null>(
    (earliest, shortage) =>
      shortage.releaseBy && (earliest === null || shortage.releaseBy < earliest) ? shortage.releaseBy : earliest,
    null,
  );
}

/** One line of a dated need: what must arrive by the date, and the running total. */
export interface NeedByLine {
  date: string;
  qty: string;
  cumulative: string;
}

/** The need-by schedule as lines to read: "Mon 7 Dec · 5 pcs · 5 pcs in all". */
export function needByLines(shortage: Pick<ShortageDto, 'needBy' | 'uom'>): NeedByLine[] {
  let total = 0;
  return shortage.needBy.map((entry) => {
    total += entry.qty;
    return {
      date: formatDay(entry.date),
      qty: formatQuantity(entry.qty, shortage.uom),
      cumulative: formatQuantity(roundQty(total), shortage.uom),
    };
  });
}

/** "5 pcs by Mon 7 Dec, then 120 pcs more to Tue 29 Dec": the schedule in one line for a table row. */
export function needBySummary(shortage: Pick<ShortageDto, 'needBy' | 'uom'>): string {
  const [first, ...rest] = shortage.needBy;
  if (!first) return '';
  const head = `${formatQuantity(first.qty, shortage.uom)} by ${formatDay(first.date)}`;
  if (rest.length === 0) return head;
  const more = roundQty(rest.reduce((sum, entry) => sum + entry.qty, 0));
  return `${head}, then ${formatQuantity(more, shortage.uom)} more to ${formatDay(rest[rest.length - 1].date)}`;
}

/** The subassemblies through which units lack the part, in first-seen order. */
export function viaParts(shortage: Pick<ShortageDto, 'slotsAtRisk'>): string[] {
  return [...new Set(shortage.slotsAtRisk.map((slot) => slot.via).filter((via): via is string => via !== null))];
}

/** The sentence of what to do, for the part's detail. */
export function actionSentence(shortage: ShortageDto): string {
  switch (shortage.action) {
    case 'loop': {
      const loop = shortage.loop;
      const cards = loop
        ? `The loop has ${countOf(loop.activeCards, 'card', 'cards')} in circulation and needs ${loop.recommendedCards}.`
        : 'The loop cannot keep up with the demand.';
      return `${cards} Add cards (Loops) so the loop covers the demand over its replenishment time.`;
    }
    case 'count':
      return shortage.onHand < 0
        ? `On-hand reads ${formatQuantity(shortage.onHand, shortage.uom)}: count ${shortage.partNumber} before expediting anything.`
        : `${shortage.partNumber} is due a count: count it before expediting anything, the shortage may not be real.`;
    case 'release':
      if (shortage.awaitingConfirmation) {
        return `Already asked for on ${releaseList(shortage.awaitingConfirmation.releaseNumbers)}: it counts as supply once the supplier confirms it.`;
      }
      return shortage.releaseBy
        ? `The normal release covers it if sent by ${formatDay(shortage.releaseBy)} (lead time ${countOf(shortage.leadTimeDays, 'working day', 'working days')}).`
        : 'The normal release covers it.';
    default: {
      const within = `Short inside the lead time of ${countOf(shortage.leadTimeDays, 'working day', 'working days')}`;
      return shortage.awaitingConfirmation
        ? `${within}: a release already asks for it; get it confirmed to arrive by the dates below, or resequence.`
        : `${within}: expedite by the dates below, or resequence.`;
    }
  }
}
