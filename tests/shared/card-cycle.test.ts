import { describe, expect, it } from 'vitest';
import {
  CARD_EVENTS,
  CARD_STATES,
  canTransition,
  IllegalCardTransitionError,
  isCardState,
  nextCardState,
  SCAN_EVENTS,
  scanRefusal,
  type CardEvent,
  type CardState,
} from '../../shared/domain/card-cycle';

// Card life cycle as specified for Cardloop loops: full → empty (signal) → ordered → shipped →
// full on receipt; receipt straight from ordered covers a delivery that arrives without an ASN.
const LEGAL: [CardState, CardEvent, CardState][] = [
  ['full', 'consume', 'empty'],
  ['empty', 'release', 'ordered'],
  ['ordered', 'ship', 'shipped'],
  ['shipped', 'receive', 'full'],
  ['ordered', 'receive', 'full'],
];

const ILLEGAL: [CardState, CardEvent][] = [
  ['full', 'release'],
  ['full', 'ship'],
  ['full', 'receive'],
  ['empty', 'consume'],
  ['empty', 'ship'],
  ['empty', 'receive'],
  ['ordered', 'consume'],
  ['ordered', 'release'],
  ['shipped', 'consume'],
  ['shipped', 'release'],
  ['shipped', 'ship'],
];

describe('card cycle', () => {
  it('lists the four card states in cycle order', () => {
    expect(CARD_STATES).toEqual(['full', 'empty', 'ordered', 'shipped']);
  });

  it('covers every state and event pair with the two tables above', () => {
    const pairs = [...LEGAL, ...ILLEGAL].map(([state, event]) => `${state}/${event}`);

    expect(new Set(pairs).size).toBe(CARD_STATES.length * CARD_EVENTS.length);
  });

  it.each(LEGAL)('moves a %s card on %s to %s', (current, event, expected) => {
    const next = nextCardState(current, event);

    expect(next).toBe(expected);
    expect(canTransition(current, event)).toBe(true);
  });

  it.each(ILLEGAL)('refuses %s on %s with an IllegalCardTransitionError', (current, event) => {
    const attempt = () => nextCardState(current, event);

    expect(canTransition(current, event)).toBe(false);
    expect(attempt).toThrow(IllegalCardTransitionError);
    try {
      attempt();
    } catch (error) {
      expect(error).toBeInstanceOf(Error);
      expect(error).toMatchObject({ name: 'IllegalCardTransitionError', current, event });
    }
  });

  it('brings a card back to full after one trip round the loop', () => {
    const events: CardEvent[] = ['consume', 'release', 'ship', 'receive'];

    const visited: CardState[] = ['full'];
    for (const event of events) visited.push(nextCardState(visited[visited.length - 1], event));

    expect(visited).toEqual(['full', 'empty', 'ordered', 'shipped', 'full']);
  });

  it('refuses state and event names read from storage that are not part of the cycle', () => {
    expect(canTransition('constructor' as CardState, 'consume')).toBe(false);
    expect(canTransition('full', 'toString' as CardEvent)).toBe(false);
    expect(() => nextCardState('lost' as CardState, 'receive')).toThrow(IllegalCardTransitionError);
  });

  it('recognises card states', () => {
    expect(CARD_STATES.every(isCardState)).toBe(true);
    expect(isCardState('signalled')).toBe(false);
    expect(isCardState(3)).toBe(false);
  });
});

describe('scanRefusal', () => {
  it('lets a scan empty a full card and refuses the steps that come from releases, ship notices and receipts', () => {
    expect(SCAN_EVENTS).toEqual(['consume']);
    expect(scanRefusal('consume')).toBeNull();
    expect(scanRefusal('release')).toMatch(/release line/);
    expect(scanRefusal('ship')).toMatch(/ship notice/);
    expect(scanRefusal('receive')).toMatch(/counted in at the dock/);
  });
});
