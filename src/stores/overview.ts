import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Overview } from '@shared/schemas/overview';
import * as overviewApi from '@/api/overview';
import { useLatestRequest } from './latest-request';

export const useOverviewStore = defineStore('overview', () => {
  const overview = ref<Overview | null>(null);
  const { loading, error, run } = useLatestRequest();

  /** Loads the signed-in role's figures; a failure is kept in `error`. */
  function fetchOverview(): Promise<void> {
    return run(overviewApi.getOverview, (answer) => {
      overview.value = answer;
    });
  }

  const dismissing = ref(false);
  const guideError = ref<Error | null>(null);

  /** Puts the first-run guide away for good for this user; on failure it stays, with the reason. */
  async function dismissGuide(): Promise<void> {
    dismissing.value = true;
    guideError.value = null;
    try {
      await overviewApi.dismissGuide();
      if (overview.value) overview.value = { ...overview.value, firstRunGuide: false };
    } catch (failure) {
      guideError.value = failure instanceof Error ? failure : new Error(String(failure));
    } finally {
      dismissing.value = false;
    }
  }

  return { overview, loading, error, fetchOverview, dismissing, guideError, dismissGuide };
});
