import { markRaw, type Component } from 'vue';
import {
  Box,
  Checked,
  CircleCheck,
  CircleClose,
  EditPen,
  Promotion,
  Van,
  WarningFilled,
} from '@element-plus/icons-vue';
import { answerDifference } from '@shared/domain/release-rules';
import type { Release, ReleaseLine, ReleaseStatus, RunReleasesResponse } from '@shared/schemas/releases';

/**
 * Our own picture for each release status, shown beside its word: a pen while drafted, a paper
 * plane once mailed, a van on the road, a box when part has come in.
 */
export const RELEASE_STATUS_ICONS: Record<ReleaseStatus, Component> = {
  draft: markRaw(EditPen),
  sent: markRaw(Promotion),
  confirmed: markRaw(CircleCheck),
  exception: markRaw(WarningFilled),
  shipped: markRaw(Van),
  partial: markRaw(Box),
  received: markRaw(Checked),
  cancelled: markRaw(CircleClose),
};

/** Each status in words, in life-cycle order. */
export const STATUS_WORDS: Record<ReleaseStatus, string> = {
  draft: 'Draft',
  sent: 'Sent',
  confirmed: 'Confirmed',
  exception: 'Exception',
  shipped: 'Shipped',
  partial: 'Partly received',
  received: 'Received',
  cancelled: 'Cancelled',
};

/** What a buyer may still do with a release of this status. */
export function canResend(release: Pick<Release, 'status'>): boolean {
  return ['draft', 'sent', 'exception'].includes(release.status);
}

export function canCancel(release: Pick<Release, 'status' | 'lines'>): boolean {
  return (
    ['draft', 'sent', 'confirmed', 'exception', 'shipped'].includes(release.status) &&
    release.lines.every((line) => line.receivedQty === 0)
  );
}

/** How a supplier's answer to a line differs from the request; all false when it was not answered. */
export interface LineDifference {
  answered: boolean;
  qtyChanged: boolean;
  late: boolean;
  early: boolean;
  differs: boolean;
}

export function lineDifference(
  line: Pick<ReleaseLine, 'qty' | 'confirmedQty' | 'shipDate' | 'earliestShipDate' | 'latestShipDate'>,
): LineDifference {
  if (line.confirmedQty === null || line.shipDate === null)
    return { answered: false, qtyChanged: false, late: false, early: false, differs: false };
  return { answered: true, ...answerDifference(line, { confirmedQty: line.confirmedQty, shipDate: line.shipDate }) };
}

/** "3 releases with 5 lines sent for Wed 2 Dec." style summary of a run; `dateWords` is the day as shown. */
export function runSummary(result: RunReleasesResponse, dateWords: string): string {
  const sent = result.releases.length;
  const lines = result.releases.reduce((sum, release) => sum + release.lines.length, 0);
  const earlier = result.existing.length;
  if (sent === 0) {
    return earlier > 0
      ? `Nothing new for ${dateWords}: ${earlier === 1 ? '1 release was' : `${earlier} releases were`} already made that day.`
      : `Nothing to release for ${dateWords}: no empty cards and no planned releases due.`;
  }
  const made = `${sent === 1 ? '1 release' : `${sent} releases`} with ${lines === 1 ? '1 line' : `${lines} lines`} sent for ${dateWords}`;
  return earlier > 0 ? `${made}; ${earlier} already made earlier that day.` : `${made}.`;
}
