/**
 * What a screen says when its change was refused because someone else changed the same thing
 * first (409 `stale`): the screen already shows their version, so the person can look and decide.
 */
export function staleNotice(what: string): string {
  return `${what} was changed by someone else first. The screen now shows their version; make your change again if it is still needed.`;
}
