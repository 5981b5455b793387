import { randomBytes } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { hashConfirmationToken } from '../releases/confirmation-tokens';
import { ShippingLinkEntity } from './shipping-link.entity';

/** A ship-notice link stays valid this long after the confirmation that gave it. */
export const SHIPPING_LINK_TTL_DAYS = 60;

const TOKEN_BYTES = 32;
const DAY_MS = 24 * 60 * 60 * 1000;

/**
 * Issues the link a supplier without an account uses to send ship notices of one release. Unlike
 * the confirmation link it is not spent on use: a release may go out in several shipments.
 */
export async function issueShippingLink(manager: EntityManager, releaseId: number, now = new Date()): Promise<string> {
  const token = randomBytes(TOKEN_BYTES).toString('base64url');
  await manager.insert(ShippingLinkEntity, {
    releaseId,
    tokenHash: hashConfirmationToken(token),
    expiresAt: new Date(now.getTime() + SHIPPING_LINK_TTL_DAYS * DAY_MS).toISOString(),
  });
  return token;
}

/** The release a presented shipping link belongs to, or null when the link is unknown or expired. */
export async function releaseIdOfShippingLink(
  manager: EntityManager,
  token: string,
  now = new Date(),
): Promise<number | null> {
  const link = await manager.findOneBy(ShippingLinkEntity, { tokenHash: hashConfirmationToken(token) });
  if (!link || link.expiresAt <= now.toISOString()) return null;
  return link.releaseId;
}
