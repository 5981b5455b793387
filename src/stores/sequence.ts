import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import {
  DEFAULT_BOARD_WORKING_DAYS,
  type AddSequenceUnitRequest,
  type SequenceBoard,
  type SequenceDay,
  type SequenceSettings,
  type SequenceUnit,
} from '@shared/schemas/sequence';
import { reorderDay, type PlannedMove } from '@shared/domain/sequence';
import * as sequenceApi from '@/api/sequence';
import { useLatestRequest } from './latest-request';

export const useSequenceStore = defineStore('sequence', () => {
  const board = ref<SequenceBoard | null>(null);
  const horizonDays = ref<number>(DEFAULT_BOARD_WORKING_DAYS);
  const loaded = ref(false);
  const { loading, error, run } = useLatestRequest();
  const saving = ref(false);
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
    saving.value = true;
    try {
      const saved = await sequenceApi.resequenceDays(planned.orders, allowFrozen);
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

  /** Saves the frozen window and capacity, then reloads the board whose flags depend on them. */
  async function saveSettings(settings: SequenceSettings): Promise<SequenceSettings> {
    saving.value = true;
    try {
      const saved = await sequenceApi.saveSettings(settings);
      changeCount += 1;
      await loadBoard();
      return saved;
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
    loadBoard,
    touchesFrozen,
    move,
    addUnit,
    removeUnit,
    saveSettings,
    setHorizon,
  };
});
