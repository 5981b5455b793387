import { useVersionEvents, type VersionEvents } from './useServerEvents';

export { EventStreamParser } from './useServerEvents';

/** Calls `onChange` whenever planning inputs change on the server (sequence, stock, BOM, releases…). */
export function usePlanningEvents(onChange: (version: number) => void): VersionEvents {
  return useVersionEvents('planning', onChange);
}
