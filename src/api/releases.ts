import type { Release, ReleaseJobSettings, ReleasesQuery, RunReleasesResponse } from '@shared/schemas/releases';
import { http } from './http';

/** Releases, newest release date first, optionally of one status or release date. */
export function listReleases(query: ReleasesQuery = {}, signal?: AbortSignal): Promise<Release[]> {
  return http.get<Release[]>('/releases', { query: { ...query }, signal });
}

/** Builds and sends the releases of a date; a date already released gets nothing new. */
export function runReleases(date: string): Promise<RunReleasesResponse> {
  return http.post<RunReleasesResponse>('/releases/run', { date });
}

/** E-mails the release again with a fresh link; earlier links stop working. */
export function resendRelease(number: string): Promise<Release> {
  return http.post<Release>(`/releases/${encodeURIComponent(number)}/resend`);
}

/**
 * Tries the release's latest e-mail again at once, with the same link (for one the mail server
 * has not taken yet); unlike `resendRelease` it issues no new link.
 */
export function sendReleaseNoticeAgain(number: string): Promise<Release> {
  return http.post<Release>(`/releases/${encodeURIComponent(number)}/notice/send-again`);
}

/** Calls a release off before anything is received. */
export function cancelRelease(number: string): Promise<Release> {
  return http.post<Release>(`/releases/${encodeURIComponent(number)}/cancel`);
}

/** Accepts the supplier's changed quantities or dates. */
export function acceptReleaseException(number: string): Promise<Release> {
  return http.post<Release>(`/releases/${encodeURIComponent(number)}/accept-exception`);
}

/** When the daily release job runs, and when it last ran. */
export function getReleaseJobSettings(): Promise<ReleaseJobSettings> {
  return http.get<ReleaseJobSettings>('/releases/settings');
}

/**
 * Sets the daily release job's time (HH:MM, plant time) on the settings as they were shown
 * (`version`); admin only. A change someone made first rejects with 409 `stale`.
 */
export function putReleaseJobSettings(jobTime: string, version: string): Promise<ReleaseJobSettings> {
  return http.put<ReleaseJobSettings>('/releases/settings', { jobTime }, { ifMatch: version });
}
