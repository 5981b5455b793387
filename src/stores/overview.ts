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

  return { overview, loading, error, fetchOverview };
});
