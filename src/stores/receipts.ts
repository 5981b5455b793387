import { defineStore } from 'pinia';
import type { OverCheckResponse, ReceiptRequest, ReceiptResponse } from '@shared/schemas/receipts';
import { postReceipt } from '@/api/dock';
import * as receiptsApi from '@/api/receipts';

/**
 * Check-in counts: what a count would do before it is sent (one answer per line, the latest
 * wins), and the receipt itself. Holds no state of its own: the dialog's form owns the counts.
 */
export const useReceiptsStore = defineStore('receipts', () => {
  const pending = new Map<number, AbortController>();

  /**
   * Asks whether `qty` takes the line over its supplier's tolerance; null when a newer question
   * for the same line replaced this one or no answer came.
   */
  async function checkOver(releaseLineId: number, qty: number): Promise<OverCheckResponse | null> {
    pending.get(releaseLineId)?.abort();
    const controller = new AbortController();
    pending.set(releaseLineId, controller);
    try {
      const answer = await receiptsApi.checkOver(releaseLineId, qty, controller.signal);
      return pending.get(releaseLineId) === controller ? answer : null;
    } catch {
      // Replaced, or no answer: the check-in then shows no choice, and the server still refuses
      // an over count without one, naming the field.
      return null;
    } finally {
      if (pending.get(releaseLineId) === controller) pending.delete(releaseLineId);
    }
  }

  /** Drops the question in flight for a line whose count no longer needs one. */
  function forgetCheck(releaseLineId: number): void {
    pending.get(releaseLineId)?.abort();
    pending.delete(releaseLineId);
  }

  /** Records one count; the same key again returns the first answer and counts nothing twice. */
  function record(receipt: ReceiptRequest, idempotencyKey: string): Promise<ReceiptResponse> {
    return postReceipt(receipt, idempotencyKey);
  }

  return { checkOver, forgetCheck, record };
});
