import type { EntityManager } from 'typeorm';
import { bumpDockVersion } from '../settings/versions';
import { bumpPlanningVersion } from '../settings/versions';

/**
 * A release changed: plans and line risk count its lines anew, and open dock boards refresh. As
 * planning changes go it is stock (its arrival): the line risk reads its firm lines every time.
 */
export async function releasesChanged(manager: EntityManager): Promise<void> {
  await bumpPlanningVersion(manager, 'stock');
  await bumpDockVersion(manager);
}
