import type { EntityManager } from 'typeorm';
import type { Database } from '../db/database';
import { readPlanningVersion } from '../settings/versions';

/**
 * Planning inputs read once per planning version and shared by every request until something that
 * feeds planning changes (the plan, the line risk). Inside a write unit they may hold uncommitted
 * changes, so they are read for that unit alone and never cached.
 */
export class PerPlanningVersion<T> {
  private version = -1;
  private value: Promise<T> | null = null;

  constructor(
    private readonly db: Database,
    private readonly load: (manager: EntityManager) => Promise<T>,
    /** Called when a new version is loaded, to drop what was computed from the old one. */
    private readonly onChange: () => void = () => undefined,
  ) {}

  async get(): Promise<T> {
    if (this.db.inWriteUnit) return this.load(this.db.manager);
    const version = await readPlanningVersion(this.db.manager);
    if (version !== this.version || !this.value) {
      this.version = version;
      this.onChange();
      const loading = this.db.read(async (manager) => ({
        version: await readPlanningVersion(manager),
        value: await this.load(manager),
      }));
      this.value = loading.then((loaded) => {
        this.version = loaded.version;
        return loaded.value;
      });
      this.value.catch(() => {
        this.value = null;
      });
    }
    return this.value;
  }
}
