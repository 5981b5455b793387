import type { ResequenceOptionDto, ShortageDto } from '@shared/schemas/line-risk';
import { formatDay, formatQuantity } from '@/format';

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

/** "Expedite 12 pcs of TNK-R60 from SRM (Rotomould Co) by Fri 4 Dec." */
export function expediteSentence(shortage: ShortageDto): string {
  const supplier = shortage.supplierCode
    ? ` from ${shortage.supplierCode}${shortage.supplierName ? ` (${shortage.supplierName})` : ''}`
    : '';
  const { qty, needBy } = shortage.rescue.expedite;
  return `Expedite ${formatQuantity(qty, shortage.uom)} of ${shortage.partNumber}${supplier} by ${formatDay(needBy)}.`;
}

/** "Build SN… (FS-20W) in slot 14 of Thu 3 Dec instead of SN…: all its parts are present." */
export function resequenceSentence(option: ResequenceOptionDto): string {
  const { slot, candidate } = option;
  return `Build ${candidate.serial} (${candidate.model}) in slot ${slot.sequence} of ${formatDay(slot.date)} instead of ${slot.serial}: all its parts are present.`;
}
