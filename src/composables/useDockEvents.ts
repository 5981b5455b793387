import { useVersionEvents, type VersionEvents } from './useServerEvents';

/** Calls `onChange` whenever the receiving board changed (a card moved, a count, a packing slip), here or elsewhere. */
export function useDockEvents(onChange: (version: number) => void): VersionEvents {
  return useVersionEvents('dock', onChange);
}
