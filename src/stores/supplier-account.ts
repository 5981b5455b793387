import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Release } from '@shared/schemas/releases';
import type { ReceivingClaim, SupplierForecast } from '@shared/schemas/supplier-account';
import * as supplierAccountApi from '@/api/supplier-account';
import { useLatestRequest } from './latest-request';

/** A supplier's own business: its forecast, its open releases and the dock's claims against it. */
export const useSupplierAccountStore = defineStore('supplier-account', () => {
  const forecast = ref<SupplierForecast | null>(null);
  const claims = ref<ReceivingClaim[]>([]);
  const releases = ref<Release[]>([]);
  const { loading, error, run } = useLatestRequest();

  /** Loads all three at once; a failure is kept in `error`. */
  function fetchAll(code: string): Promise<void> {
    return run(
      (signal) =>
        Promise.all([
          supplierAccountApi.getSupplierForecast(code, signal),
          supplierAccountApi.getReceivingClaims(code, signal),
          supplierAccountApi.getOwnReleases(signal),
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
    downloadForecastCsv: supplierAccountApi.downloadSupplierForecastCsv,
  };
});
