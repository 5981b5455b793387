import type { Overview } from '@shared/schemas/overview';
import { http } from './http';

/** The figures the signed-in role watches on its Overview. */
export function getOverview(signal?: AbortSignal): Promise<Overview> {
  return http.get<Overview>('/overview', { signal });
}

/** Puts the first-run guide away for the signed-in user. */
export async function dismissGuide(): Promise<void> {
  await http.post<void>('/overview/first-run-guide/dismiss');
}
