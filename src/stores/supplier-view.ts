import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Release } from '@shared/schemas/releases';
import type { ReceivingClaim, SupplierForecast } from '@shared/schemas/supplier-view';
import * as supplierViewApi from '@/api/supplier-view';
import { useLatestRequest } from './latest-request';

/** A supplier's own business: its forecast, its open releases and the dock's claims against it. */
export const useSupplierViewStore = defineStore('supplier-view', () => {
  const forecast = ref<SupplierForecast | null>(null);
  const claims = ref<ReceivingClaim[]>([]);
  const releases = ref<Release[]>([]);
  const { loading, error, run } = useLatestRequest();

  /** Loads all three at once; a failure is kept in `error`. */
  function fetchAll(code: string): Promise<void> {
    return run(
      (signal) =>
        Promise.all([
          supplierViewApi.getSupplierForecast(code, signal),
          supplierViewApi.getReceivingClaims(code, signal),
          supplierViewApi.getOwnReleases(signal),
        ]),
      ([nextForecast, nextClaims, nextReleases]) => {
        forecast.value = nextForecast;
        claims.value = nextClaims;
        releases.value = nextReleases;
      },
    );
  }

  return {
    forecast,
    claims,
    releases,
    loading,
    error,
    fetchAll,
    downloadForecastCsv: supplierViewApi.downloadSupplierForecastCsv,
  };
});
