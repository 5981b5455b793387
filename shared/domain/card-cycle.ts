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
