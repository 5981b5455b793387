/**
 * Life cycle of a kanban card: full → empty (the pull signal) → ordered → shipped → full.
 *
 * `receive` is also accepted straight from `ordered`: a supplier may deliver without sending a
 * ship notice (ASN), or the notice may arrive after the parts. The counted parts at the dock are
 * the fact that matters, so receiving must never be blocked by a missing notice.
 */

export const CARD_STATES = ['full', 'empty', 'ordered', 'shipped'] as const;
export type CardState = (typeof CARD_STATES)[number];

export const CARD_EVENTS = ['consume', 'release', 'ship', 'receive'] as const;
export type CardEvent = (typeof CARD_EVENTS)[number];

const TRANSITIONS: Readonly<Record<CardState, Readonly<Partial<Record<CardEvent, CardState>>>>> = {
  full: { consume: 'empty' },
  empty: { release: 'ordered' },
  ordered: { ship: 'shipped', receive: 'full' },
  shipped: { receive: 'full' },
};

/** A card event that is not allowed in the card's current state. */
export class IllegalCardTransitionError extends Error {
  readonly current: CardState;
  readonly event: CardEvent;

  constructor(current: CardState, event: CardEvent) {
    super(`A card in state "${current}" cannot take the event "${event}"`);
    this.name = 'IllegalCardTransitionError';
    this.current = current;
    this.event = event;
  }
}

/** True when the value is one of the card states. */
export function isCardState(value: unknown): value is CardState {
  return typeof value === 'string' && (CARD_STATES as readonly string[]).includes(value);
}

function target(current: CardState, event: CardEvent): CardState | undefined {
  // Own-property lookups only, so values read from storage such as "constructor" cannot match.
  if (!Object.prototype.hasOwnProperty.call(TRANSITIONS, current)) return undefined;
  const events = TRANSITIONS[current];
  return Object.prototype.hasOwnProperty.call(events, event) ? events[event] : undefined;
}

/** True when `event` is allowed for a card in state `current`. */
export function canTransition(current: CardState, event: CardEvent): boolean {
  return target(current, event) !== undefined;
}

/** State after `event`; throws IllegalCardTransitionError when the event is not allowed. */
export function nextCardState(current: CardState, event: CardEvent): CardState {
  const next = target(current, event);
  if (next === undefined) throw new IllegalCardTransitionError(current, event);
  return next;
}

/**
 * Events a scan may record by itself. The others are tied to what really happens and come only
 * from it: `release` from a release line, `ship` from a ship notice carrying the line, `receive`
 * from the receipt that adds the stock and closes the line. A scan saying them would leave a card
 * ordered with nothing asked of a supplier, or full with no stock behind it.
 */
export const SCAN_EVENTS: readonly CardEvent[] = ['consume'];

/** Why a scan cannot record this event, and where it happens instead; null when a scan may. */
export function scanRefusal(event: CardEvent): string | null {
  if (SCAN_EVENTS.includes(event)) return null;
  switch (event) {
    case 'release':
      return 'a card is ordered only by a release line: an empty card goes on the next release to its supplier (Releases)';
    case 'ship':
      return 'a card goes shipped when its supplier’s ship notice carries its release line';
    case 'receive':
      return 'a card is full again only when its delivery is counted in at the dock (Dock: scan the card there), which adds the stock and closes its release line';
    default:
      return null;
  }
}
