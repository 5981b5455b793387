import type { ForecastZone } from '@shared/domain/supplier-forecast';
import type { Discrepancy } from '@shared/schemas/receipts';
import type { Release, ReleaseStatus } from '@shared/schemas/releases';
import type { ReceivingClaim } from '@shared/schemas/supplier-account';
import { formatQty } from '@/format';

export const ZONE_WORDS: Record<ForecastZone, string> = { firm: 'Firm', planned: 'Planned', forecast: 'Forecast' };

export const ZONE_MEANINGS: Record<ForecastZone, string> = {
  firm: 'inside the plant’s frozen window: the build sequence no longer changes',
  planned: 'inside the part’s lead time: orders for these days go out now',
  forecast: 'beyond the lead time: nothing ordered yet, the figures may move',
};

const CLAIM_WORDS: Record<Discrepancy, string> = {
  short: 'Short',
  over: 'Over',
  damaged: 'Damaged',
  wrong_part: 'Wrong part',
};

/** A claim's kind in words; an over one says what the dock did with the extra. */
export function claimWords(claim: Pick<ReceivingClaim, 'discrepancy' | 'overAction' | 'excessQty'>): string {
  if (claim.discrepancy !== 'over' || !claim.overAction) return CLAIM_WORDS[claim.discrepancy];
  const extra = formatQty(claim.excessQty);
  return claim.overAction === 'keep' ? `Over: ${extra} kept for later orders` : `Over: ${extra} sent back`;
}

/** Releases a supplier still has to ship against. */
export const SHIPPABLE_STATUSES: readonly ReleaseStatus[] = ['sent', 'confirmed', 'exception', 'partial'];

/** Releases waiting for the supplier's answer (quantities and ship dates). */
export const ANSWERABLE_STATUSES: readonly ReleaseStatus[] = ['draft', 'sent'];

/** Where a signed-in supplier answers a release. */
export function confirmPath(releaseNumber: string): string {
  return `/releases/${encodeURIComponent(releaseNumber)}/confirm`;
}

/** Where a supplier tells the plant what it shipped for a release. */
export function shipNoticePath(releaseNumber: string): string {
  return `/releases/${encodeURIComponent(releaseNumber)}/ship-notice`;
}

/**
 * The day a release must leave the supplier: the earliest ship date of its lines still to come (the
 * answered date, or the last one that still arrives on time); null when nothing is left to ship.
 */
export function shipBy(release: Pick<Release, 'lines'>): string | null {
  const dates = release.lines
    .filter((line) => !line.closed && line.receivedQty < (line.confirmedQty ?? line.qty))
    .map((line) => line.shipDate ?? line.latestShipDate)
    .sort();
  return dates[0] ?? null;
}

/** Not shipped yet and past its ship-by day (`today` is the plant's day). */
export function isLate(release: Pick<Release, 'lines' | 'status'>, today: string): boolean {
  const day = shipBy(release);
  return ['sent', 'confirmed', 'exception'].includes(release.status) && day !== null && day < today;
}
