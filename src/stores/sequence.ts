import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import {
  DEFAULT_BOARD_WORKING_DAYS,
  type AddSequenceUnitRequest,
  type SequenceBoard,
  type SequenceDay,
  type SequenceSettings,
  type SequenceUnit,
  type VersionedSequenceSettings,
} from '@shared/schemas/sequence';
import { reorderDay, type PlannedMove } from '@shared/domain/sequence';
import * as sequenceApi from '@/api/sequence';
import { ApiError } from '@/api/http';
import { useLatestRequest } from './latest-request';

export const useSequenceStore = defineStore('sequence', () => {
  const board = ref<SequenceBoard | null>(null);
  const horizonDays = ref<number>(DEFAULT_BOARD_WORKING_DAYS);
  const loaded = ref(false);
  const { loading, error, run } = useLatestRequest();
  const saving = ref(false);
  /** The settings with their version, loaded when the planner opens them. */
  const settings = ref<VersionedSequenceSettings | null>(null);
  // Changes made here since a load started; a load that started before one would show the old order.
  let changeCount = 0;

  const days = computed(() => board.value?.days ?? []);
  const models = computed(() => board.value?.models ?? []);
  const modelOrder = computed(() => models.value.map((model) => model.partNumber));
  const unitCount = computed(() => days.value.reduce((sum, day) => sum + day.units.length, 0));

  /** Loads the board for the chosen horizon; a failure is kept in `error` and the board shown stays. */
  function loadBoard(): Promise<void> {
    const startedAt = changeCount;
    return run(
      (signal) => sequenceApi.fetchBoard({ days: horizonDays.value }, signal),
      (next) => {
        if (startedAt === changeCount) board.value = next;
        loaded.value = true;
      },
    );
  }

  function replaceDays(replacements: readonly SequenceDay[]): void {
    if (!board.value) return;
    const byDate = new Map(replacements.map((day) => [day.date, day]));
    board.value = { ...board.value, days: board.value.days.map((day) => byDate.get(day.date) ?? day) };
  }

  /** True when a planned move changes a day inside the frozen window (or before today). */
  function touchesFrozen(move: PlannedMove): boolean {
    return move.changedDates.some((date) => days.value.find((day) => day.date === date)?.frozen);
  }

  /**
   * Shows the move at once, then saves it; on failure the days go back as they were, the board
   * is reloaded, and the ApiError is rethrown for the view to explain.
   */
  async function move(planned: PlannedMove, allowFrozen = false): Promise<void> {
    changeCount += 1;
    const before = days.value.filter((day) => planned.changedDates.includes(day.date));
    const unitsBySerial = new Map(before.flatMap((day) => day.units.map((unit) => [unit.serial, unit] as const)));
    replaceDays(
      planned.orders.map((order) =>
        reorderDay(
          before.find((day) => day.date === order.date)!,
          order.serials,
          unitsBySerial,
        ),
      ),
    );
    // Every day the move touches, as the board showed it: the server refuses the move if one changed.
    const basedOn = before.map((day) => ({ date: day.date, version: day.version }));
    saving.value = true;
    try {
      const saved = await sequenceApi.resequenceDays(planned.orders, basedOn, allowFrozen);
      replaceDays(saved.days);
    } catch (cause) {
      replaceDays(before);
      void loadBoard();
      throw cause;
    } finally {
      saving.value = false;
    }
  }

  /** Adds a unit and reloads the board; rethrows the ApiError for the form. */
  async function addUnit(unit: AddSequenceUnitRequest): Promise<SequenceUnit> {
    saving.value = true;
    try {
      const added = await sequenceApi.addUnit(unit);
      changeCount += 1;
      await loadBoard();
      return added;
    } finally {
      saving.value = false;
    }
  }

  /** Removes a unit and reloads the board; rethrows the ApiError for the view. */
  async function removeUnit(serial: string, allowFrozen = false): Promise<void> {
    saving.value = true;
    try {
      await sequenceApi.removeUnit(serial, allowFrozen);
      changeCount += 1;
      await loadBoard();
    } finally {
      saving.value = false;
    }
  }

  /** Loads the frozen window and capacity with their version; rethrows the ApiError for the dialog. */
  async function loadSettings(): Promise<VersionedSequenceSettings> {
    settings.value = await sequenceApi.fetchSettings();
    return settings.value;
  }

  /**
   * Saves the frozen window and capacity as the planner saw them, then reloads the board whose
   * flags depend on them. Rethrows the ApiError; when someone changed them first (409 `stale`)
   * the settings and the board shown become the current ones.
   */
  async function saveSettings(next: SequenceSettings): Promise<SequenceSettings> {
    saving.value = true;
    try {
      const version = settings.value?.version ?? (await loadSettings()).version;
      settings.value = await sequenceApi.saveSettings(next, version);
      changeCount += 1;
      await loadBoard();
      return settings.value;
    } catch (cause) {
      if (cause instanceof ApiError && cause.isStale) {
        settings.value = cause.staleCurrent<VersionedSequenceSettings>() ?? null;
        changeCount += 1;
        await Promise.all([settings.value ? undefined : loadSettings().catch(() => undefined), loadBoard()]);
      }
      throw cause;
    } finally {
      saving.value = false;
    }
  }

  /** Shows another number of working days. */
  async function setHorizon(workingDays: number): Promise<void> {
    horizonDays.value = workingDays;
    await loadBoard();
  }

  return {
    board,
    horizonDays,
    loading,
    loaded,
    error,
    saving,
    days,
    models,
    modelOrder,
    unitCount,
    settings,
    loadBoard,
    loadSettings,
    touchesFrozen,
    move,
    addUnit,
    removeUnit,
    saveSettings,
    setHorizon,
  };
});
