import { expect, type APIRequestContext } from '@playwright/test';

/** The password of every demo account. */
export const DEMO_PASSWORD = 'cardloop-demo';

/** The plant's calendar day on the server's clock, which runs on this machine. */
export function plantToday(): string {
  const now = new Date();
  return new Date(now.getTime() - now.getTimezoneOffset() * 60_000).toISOString().slice(0, 10);
}

/** Signs a demo account in over the API and answers its session token. */
export async function tokenOf(request: APIRequestContext, email: string): Promise<string> {
  const signIn = await request.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD } });
  expect(signIn.status()).toBe(200);
  return ((await signIn.json()) as { token: string }).token;
}

/** A part's on-hand as the part list gives it. */
export async function onHandOf(request: APIRequestContext, token: string, partNumber: string): Promise<number> {
  const response = await request.get('/api/parts', { headers: { Authorization: `Bearer ${token}` } });
  const parts = (await response.json()) as { partNumber: string; onHand: number }[];
  return parts.find((part) => part.partNumber === partNumber)!.onHand;
}
