import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { LineRiskReport, ResequenceOptionDto, ShortageDto } from '@shared/schemas/line-risk';
import * as lineRiskApi from '@/api/line-risk';
import type { LineRiskRange } from '@/api/line-risk';
import { useLatestRequest } from './latest-request';

interface FetchOptions {
  /** A refresh after a live change: keep the figures on screen until the new ones arrive. */
  quiet?: boolean;
}

export const useLineRiskStore = defineStore('line-risk', () => {
  const report = ref<LineRiskReport | null>(null);
  const range = ref<LineRiskRange | null>(null);
  const { loading, error, run } = useLatestRequest();
  /** When the figures were last replaced because the server announced a planning change. */
  const liveUpdatedAt = ref<Date | null>(null);

  /** Loads the report for a horizon; a failure is kept in `error`. */
  function fetchReport(next: LineRiskRange, options: FetchOptions = {}): Promise<void> {
    return run(async (signal) => {
      report.value = await lineRiskApi.getLineRisk(next, signal);
      range.value = { ...next };
    }, options);
  }

  /** Re-reads the same horizon after a planning change, without a spinner. */
  async function refreshLive(): Promise<void> {
    if (!range.value) return;
    await fetchReport(range.value, { quiet: true });
    if (!error.value) liveUpdatedAt.value = new Date();
  }

  const shortages = computed<ShortageDto[]>(() => report.value?.shortages ?? []);
  const partsInFrozenWindow = computed(() => shortages.value.filter((shortage) => shortage.inFrozenWindow).length);
  /** The shortage that hits first (the list is sorted by first short date). */
  const earliest = computed<ShortageDto | null>(() => shortages.value[0] ?? null);

  return {
    report,
    range,
    loading,
    error,
    liveUpdatedAt,
    shortages,
    partsInFrozenWindow,
    earliest,
    fetchReport,
    refreshLive,
  };
});

// --- Presentation helpers shared by the view and its components ---

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

/** "today", "tomorrow", "in 3 working days" (or "3 working days ago" for a past date). */
export function impactWhen(daysUntilImpact: number): string {
  if (daysUntilImpact === 0) return 'today';
  if (daysUntilImpact === 1) return 'in 1 working day';
  if (daysUntilImpact > 1) return `in ${daysUntilImpact} working days`;
  const ago = -daysUntilImpact;
  return `${ago} working ${ago === 1 ? 'day' : 'days'} ago`;
}

// UN/ECE Recommendation 20 codes the plant uses, as people say them.
const UOM_WORDS: Record<string, string> = { H87: 'pcs', KGM: 'kg', MTR: 'm', LTR: 'L' };

/** The unit of measure as people say it: `pcs`, `kg`, `m`, `L`; an unknown code as it is. */
export function uomWord(uom: string): string {
  return UOM_WORDS[uom] ?? uom;
}

const QTY_FORMAT = new Intl.NumberFormat('en', { maximumFractionDigits: 3 });

/** `12 pcs`, `1 pc`, `1,250.5 kg`. */
export function formatQuantity(qty: number, uom: string): string {
  const word = uom === 'H87' && qty === 1 ? 'pc' : uomWord(uom);
  return `${QTY_FORMAT.format(qty)} ${word}`;
}

/** "Expedite 12 pcs of TNK-R60 from SRM (Rotomould Co) by 2026-12-04." */
export function expediteSentence(shortage: ShortageDto): string {
  const supplier = shortage.supplierCode
    ? ` from ${shortage.supplierCode}${shortage.supplierName ? ` (${shortage.supplierName})` : ''}`
    : '';
  const { qty, needBy } = shortage.rescue.expedite;
  return `Expedite ${formatQuantity(qty, shortage.uom)} of ${shortage.partNumber}${supplier} by ${needBy}.`;
}

/** "Build SN… (FS-20W) in slot 14 of 2026-12-03 instead of SN…: all its parts are present." */
export function resequenceSentence(option: ResequenceOptionDto): string {
  const { slot, candidate } = option;
  return `Build ${candidate.serial} (${candidate.model}) in slot ${slot.sequence} of ${slot.date} instead of ${slot.serial}: all its parts are present.`;
}
