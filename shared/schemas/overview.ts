import { z } from 'zod';
import { roleSchema } from './user';

/**
 * One figure a role watches on its Overview: a count, a number of working days or a share, where to
 * go about it, and whether it needs someone now (shown with a glyph and words, never colour alone).
 */
export const overviewFigureSchema = z.object({
  key: z.string(),
  label: z.string(),
  /** null when there is nothing to measure yet (no unit at risk: no first stop). */
  value: z.number().nullable(),
  unit: z.enum(['count', 'workingDays', 'share']),
  /** What the figure means, in a sentence. */
  hint: z.string(),
  /** The app path that deals with it. */
  to: z.string(),
  attention: z.boolean(),
});
export type OverviewFigure = z.infer<typeof overviewFigureSchema>;

export const overviewSchema = z.object({
  role: roleSchema,
  today: z.string(),
  figures: z.array(overviewFigureSchema),
  /** Show the "start here" guide: a demo account that has not put it away yet. */
  firstRunGuide: z.boolean(),
});
export type Overview = z.infer<typeof overviewSchema>;
