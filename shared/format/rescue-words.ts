import type { ResequenceOptionDto } from '../schemas/line-risk';
import { formatDay } from './dates';

/**
 * "Build SN… (FS-20W) in slot 14 of Thu 3 Dec, ahead of SN…: …", on the Line risk screen and in the
 * planners' alert e-mail. A resequence keeps the line's slot busy; the unit at risk still lacks the
 * part, so a what-if of the move shows it still at risk.
 */
export function resequenceSentence(option: ResequenceOptionDto): string {
  const { slot, candidate } = option;
  return (
    `Build ${candidate.serial} (${candidate.model}) in slot ${slot.sequence} of ${formatDay(slot.date)}, ahead of ${slot.serial}: ` +
    `all its parts are present, so the line keeps running while ${slot.serial} waits for the part.`
  );
}
