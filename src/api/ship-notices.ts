import { IDEMPOTENCY_HEADER } from '@shared/schemas/idempotency';
import type { ShipNoticeRequest, ShipNoticeResponse, ShippingView } from '@shared/schemas/ship-notices';
import { http } from './http';

/** Where a ship notice comes from: the link in a confirmation receipt, or a signed-in supplier's release. */
export type ShipNoticeSource = { token: string } | { releaseNumber: string };

function pathOf(source: ShipNoticeSource): string {
  return 'token' in source
    ? `/shipping/${encodeURIComponent(source.token)}`
    : `/releases/${encodeURIComponent(source.releaseNumber)}/ship-notices`;
}

/** The lines still to ship and the notices already sent. */
export function getShipNoticeForm(source: ShipNoticeSource): Promise<ShippingView> {
  // The link works without an account: no session token, and a 401 could not mean "signed out".
  return http.get<ShippingView>(pathOf(source), { anonymous: 'token' in source });
}

/** Sends one shipment; the same key again records nothing twice. */
export function postShipNotice(
  source: ShipNoticeSource,
  body: ShipNoticeRequest,
  idempotencyKey: string,
): Promise<ShipNoticeResponse> {
  return http.post<ShipNoticeResponse>(pathOf(source), body, {
    anonymous: 'token' in source,
    headers: { [IDEMPOTENCY_HEADER]: idempotencyKey },
  });
}
