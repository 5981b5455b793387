/** localStorage key under which the signed-in user's bearer token is kept. */
export const TOKEN_KEY = 'cardloop.token';

/** The stored bearer token, or null when nobody is signed in on this browser. */
export function readToken(): string | null {
  return localStorage.getItem(TOKEN_KEY);
}

/** Keeps the token across reloads; null forgets it. */
export function writeToken(token: string | null): void {
  if (token) localStorage.setItem(TOKEN_KEY, token);
  else localStorage.removeItem(TOKEN_KEY);
}
