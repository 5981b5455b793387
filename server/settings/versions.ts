import type { EntityManager } from 'typeorm';
import { readSetting, writeSetting } from './settings';

const DOCK_VERSION = 'dock.version';

/** Every change to the receiving board bumps this, so open Dock screens know to reload. */
export async function bumpDockVersion(manager: EntityManager): Promise<number> {
  const next = (await readSetting<number>(manager, DOCK_VERSION, 0)) + 1;
  await writeSetting(manager, DOCK_VERSION, next);
  return next;
}

export function readDockVersion(manager: EntityManager): Promise<number> {
  return readSetting<number>(manager, DOCK_VERSION, 0);
}
