import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { AuditEvent } from '@shared/schemas/audit';
import * as auditApi from '@/api/audit';
import type { AuditFilters } from '@/api/audit';
import { useLatestRequest } from './latest-request';

/** The audit trail as filtered on screen. */
export const useAuditStore = defineStore('audit', () => {
  const events = ref<AuditEvent[]>([]);
  const truncated = ref(false);
  const kinds = ref<string[]>([]);
  const loaded = ref(false);
  const { loading, error, run } = useLatestRequest();

  function load(filters: AuditFilters): Promise<void> {
    return run(
      (signal) => auditApi.fetchAudit(filters, signal),
      (answer) => {
        events.value = answer.events;
        truncated.value = answer.truncated;
        loaded.value = true;
      },
    );
  }

  async function loadKinds(): Promise<void> {
    kinds.value = await auditApi.fetchAuditKinds();
  }

  return { events, truncated, kinds, loaded, loading, error, load, loadKinds, exportCsv: auditApi.downloadAuditCsv };
});
