import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, ReadOnlyUnitError, type Database } from '../../server/db/database';
import { SettingEntity } from '../../server/settings/setting.entity';
import { bumpPlanningVersion, readPlanningVersion } from '../../server/settings/versions';

let db: Database;
beforeAll(async () => {
  db = await openDatabase(':memory:');
});
afterAll(() => db.close());

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('units of work', () => {
  it('runs write units begun at the same moment one after another, losing no update', async () => {
    const before = await readPlanningVersion(db.manager);

    await Promise.all(
      Array.from({ length: 25 }, () =>
        db.write(async (manager) => {
          await bumpPlanningVersion(manager);
          await pause(1);
        }),
      ),
    );

    expect(await readPlanningVersion(db.manager)).toBe(before + 25);
  });

  it('lets a write unit begun inside another join it and roll back with it', async () => {
    const attempt = db.write(async (manager) => {
      await manager.save(SettingEntity, { key: 'outer', value: 1 });
      await db.write((inner) => inner.save(SettingEntity, { key: 'inner', value: 2 }));
      throw new Error('abandon the outer unit');
    });

    await expect(attempt).rejects.toThrow('abandon the outer unit');
    expect(await db.manager.findOneBy(SettingEntity, { key: 'outer' })).toBeNull();
    expect(await db.manager.findOneBy(SettingEntity, { key: 'inner' })).toBeNull();
  });

  it('shows a read outside the write unit only what was committed', async () => {
    let release!: () => void;
    const held = new Promise<void>((resolve) => (release = resolve));

    const writing = db.write(async (manager) => {
      await manager.save(SettingEntity, { key: 'uncommitted', value: 1 });
      await held;
    });
    await pause(20);
    const seenDuringWrite = await db.manager.findOneBy(SettingEntity, { key: 'uncommitted' });
    const snapshotDuringWrite = await db.read((manager) => manager.findOneBy(SettingEntity, { key: 'uncommitted' }));
    release();
    await writing;

    expect(seenDuringWrite).toBeNull();
    expect(snapshotDuringWrite).toBeNull();
    expect(await db.manager.findOneBy(SettingEntity, { key: 'uncommitted' })).not.toBeNull();
  });

  it('keeps one snapshot for the whole of a read unit while writes commit beside it', async () => {
    let firstSeen!: (version: number) => void;
    const firstRead = new Promise<number>((resolve) => (firstSeen = resolve));
    let goOn!: () => void;
    const gate = new Promise<void>((resolve) => (goOn = resolve));

    const reading = db.read(async (manager) => {
      firstSeen(await readPlanningVersion(manager));
      await gate;
      return readPlanningVersion(manager);
    });
    const first = await firstRead;
    await db.write((manager) => bumpPlanningVersion(manager));
    goOn();
    const second = await reading;

    expect(second).toBe(first);
    expect(await readPlanningVersion(db.manager)).toBe(first + 1);
  });

  it('refuses a write inside a read unit, and a write outside any unit', async () => {
    const inRead = db.read(() => db.write((manager) => manager.save(SettingEntity, { key: 'x', value: 1 })));
    await expect(inRead).rejects.toBeInstanceOf(ReadOnlyUnitError);

    const stray = db.manager.save(SettingEntity, { key: 'stray', value: 1 });
    await expect(stray).rejects.toThrow(/readonly|read-only|query_only/i);
  });
});
