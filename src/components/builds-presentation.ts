import { markRaw, type Component } from 'vue';
import { CircleCheckFilled, Clock, VideoPlay } from '@element-plus/icons-vue';
import type { UnitStatus } from '@shared/schemas/builds';
import { countOf } from '@/format';

/** Each unit status in words with its icon; colour only ever repeats what these say. */
export const UNIT_STATUS_WORDS: Record<UnitStatus, { word: string; icon: Component; hint: string }> = {
  planned: { word: 'Planned', icon: markRaw(Clock), hint: 'Not started yet' },
  started: { word: 'Started', icon: markRaw(VideoPlay), hint: 'Its kit went to the line' },
  built: { word: 'Built', icon: markRaw(CircleCheckFilled), hint: 'Reported built; its parts came off stock' },
};

/** Where a component comes from, in words. */
export const SOURCE_WORDS: Record<string, string> = {
  buy: 'Bought',
  make: 'Made in-house',
  end_item: 'End item',
};

/** A kit group's heading; components without a point of use still need a place on the sheet. */
export function pointOfUseTitle(pointOfUse: string | null): string {
  return pointOfUse ? `Point of use ${pointOfUse}` : 'No point of use set';
}

/** "14 of 26 built" for the running count of a day. */
export function builtProgress(built: number, total: number): string {
  return `${built} of ${total} built`;
}

/** The confirmation of closing a day: how many units it reports built. */
export function closeDayQuestion(toBuild: number, day: string): string {
  if (toBuild === 0) return `Every unit of ${day} is already reported built; closing the day changes nothing.`;
  return `${countOf(toBuild, 'unit', 'units')} of ${day} not yet reported will be reported built now, in sequence order, and their parts backflushed from stock.`;
}

/** What the undo dialog offers as the reason, so a quick correction at the line is one tap. */
export const DEFAULT_UNDO_REASON = 'Reported built by mistake';
