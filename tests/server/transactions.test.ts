import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { openDatabase } from '../../server/db/data-source';
import { SettingEntity } from '../../server/settings/setting.entity';
import { bumpPlanningVersion, readPlanningVersion } from '../../server/settings/settings';

let dataSource: DataSource;
beforeAll(async () => {
  dataSource = await openDatabase(':memory:');
});
afterAll(() => dataSource.destroy());

describe('transactions on the SQLite data source', () => {
  it('runs transactions begun at the same moment one after another, losing no update', async () => {
    const before = await readPlanningVersion(dataSource.manager);

    await Promise.all(
      Array.from({ length: 25 }, () =>
        dataSource.transaction(async (manager) => {
          await bumpPlanningVersion(manager);
          await new Promise((resolve) => setTimeout(resolve, 1));
        }),
      ),
    );

    expect(await readPlanningVersion(dataSource.manager)).toBe(before + 25);
  });

  it('lets a transaction begun inside another run at once and roll back with it', async () => {
    const attempt = dataSource.transaction(async (manager) => {
      await manager.save(SettingEntity, { key: 'outer', value: 1 });
      await dataSource.transaction((inner) => inner.save(SettingEntity, { key: 'inner', value: 2 }));
      throw new Error('abandon the outer transaction');
    });

    await expect(attempt).rejects.toThrow('abandon the outer transaction');
    expect(await dataSource.manager.findOneBy(SettingEntity, { key: 'outer' })).toBeNull();
  });
});
