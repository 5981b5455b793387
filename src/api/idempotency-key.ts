/**
 * A fresh Idempotency-Key. `crypto.randomUUID` exists only on secure pages (https or localhost);
 * a plant tablet on plain http still has `getRandomValues`, so build the version-4 UUID from
 * that (RFC 9562, section 5.4: version bits 0100, variant bits 10).
 */
export function newIdempotencyKey(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  bytes[6] = (bytes[6]! & 0x0f) | 0x40;
  bytes[8] = (bytes[8]! & 0x3f) | 0x80;
  const hex = [...bytes].map((byte) => byte.toString(16).padStart(2, '0')).join('');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}
