import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { ShipNoticeRequest, ShipNoticeResponse, ShippingView } from '@shared/schemas/ship-notices';
import * as shipNoticesApi from '@/api/ship-notices';
import type { ShipNoticeSource } from '@/api/ship-notices';
import { newIdempotencyKey } from '@/api/idempotency-key';
import { ApiError } from '@/api/http';

/** The ship-notice form of one release: what is left to ship, and sending one shipment. */
export const useShipNoticeStore = defineStore('ship-notice', () => {
  const form = ref<ShippingView | null>(null);
  const loading = ref(false);
  const problem = ref<ApiError | null>(null);
  const sending = ref(false);
  const lastSent = ref<ShipNoticeResponse | null>(null);
  // One key per shipment being entered: a retry after a lost answer reuses it, the next shipment gets a new one.
  let pendingKey: string | null = null;

  async function open(source: ShipNoticeSource): Promise<void> {
    loading.value = true;
    problem.value = null;
    try {
      form.value = await shipNoticesApi.getShipNoticeForm(source);
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      problem.value = cause;
      form.value = null;
    } finally {
      loading.value = false;
    }
  }

  /** Sends the shipment and reloads the form; a refusal is rethrown for the form to show beside its fields. */
  async function send(source: ShipNoticeSource, body: ShipNoticeRequest): Promise<ShipNoticeResponse> {
    sending.value = true;
    pendingKey ??= newIdempotencyKey();
    try {
      const response = await shipNoticesApi.postShipNotice(source, body, pendingKey);
      pendingKey = null;
      lastSent.value = response;
      form.value = await shipNoticesApi.getShipNoticeForm(source);
      return response;
    } catch (cause) {
      // A refused notice recorded nothing: the corrected one is a new request.
      if (cause instanceof ApiError && cause.status >= 400 && cause.status < 500) pendingKey = null;
      throw cause;
    } finally {
      sending.value = false;
    }
  }

  return { form, loading, problem, sending, lastSent, open, send };
});
