import { IsNull, type EntityManager } from 'typeorm';
import {
  CARD_STATES,
  canTransition,
  IllegalCardTransitionError,
  isCardState,
  nextCardState,
  type CardEvent,
  type CardState,
} from '../../shared/domain/card-cycle';
import { isValidGs1, parseCardNumber } from '../../shared/domain/gs1';
import { ConflictError, InvalidInputError, NotFoundError } from '../errors';
import { CardScanEntity } from './card-scan.entity';
import { KanbanCardEntity } from './kanban-card.entity';

const CARD_NUMBER_LENGTH = 12;

function invalidCardNumber(message: string): InvalidInputError {
  return new InvalidInputError(message, [{ path: ['cardNumber'], message }]);
}

/**
 * The card number as a keyboard-wedge scanner or a person typed it, trimmed and checked: 400 when
 * it is not 12 digits or its GS1 check digit is wrong (a misread or mistyped digit), 404 when it is
 * well formed but cannot be one of our cards (loop or index 0).
 */
export function readCardNumber(typed: string): string {
  const cardNumber = typed.trim();
  if (!/^\d+$/.test(cardNumber) || cardNumber.length !== CARD_NUMBER_LENGTH) {
    throw invalidCardNumber(`A card number is ${CARD_NUMBER_LENGTH} digits; "${cardNumber}" is not.`);
  }
  if (!isValidGs1(cardNumber)) {
    throw invalidCardNumber(
      `The check digit of ${cardNumber} is wrong: a digit was misread or mistyped. Scan or type the number again.`,
    );
  }
  if (!parseCardNumber(cardNumber)) throw new NotFoundError(`No kanban card ${cardNumber}.`);
  return cardNumber;
}

/** The card with that number (already checked by readCardNumber), or 404. */
export async function findCard(manager: EntityManager, cardNumber: string): Promise<KanbanCardEntity> {
  const card = await manager.findOneBy(KanbanCardEntity, { cardNumber });
  if (!card) throw new NotFoundError(`No kanban card ${cardNumber}.`);
  return card;
}

/** A pulled (retired) card keeps its number and history but takes no more events. */
export function assertInCirculation(card: KanbanCardEntity): void {
  if (card.retiredAt) {
    throw new ConflictError(`Card ${card.cardNumber} was pulled from circulation; take it out of use.`, [
      { currentState: card.state, retiredAt: card.retiredAt },
    ]);
  }
}

function statesTaking(event: CardEvent): CardState[] {
  return CARD_STATES.filter((state) => canTransition(state, event));
}

/** The event a bare scan means: at the line a full card is being emptied; any other state must be said. */
export function defaultEvent(card: KanbanCardEntity): CardEvent {
  if (card.state === 'full') return 'consume';
  throw new ConflictError(
    `Card ${card.cardNumber} is ${card.state}; a scan only empties a full card. ` +
      (card.state === 'empty'
        ? 'It goes on the next release to its supplier.'
        : 'Count its delivery in at the dock to make it full again.'),
    [{ currentState: card.state, event: null }],
  );
}

/**
 * Moves a card through one event of its cycle and writes the scan log row, inside the caller's
 * transaction (releases and receiving call this too). The update is conditional on the state
 * read, so a double scan racing itself changes the card once and the loser gets a 409.
 */
export async function applyCardEvent(
  manager: EntityManager,
  card: KanbanCardEntity,
  event: CardEvent,
  userEmail: string | null,
): Promise<{ card: KanbanCardEntity; scan: CardScanEntity }> {
  assertInCirculation(card);
  const fromState = card.state;
  if (!isCardState(fromState)) throw new ConflictError(`Card ${card.cardNumber} has an unknown state "${fromState}".`);
  let toState: CardState;
  try {
    toState = nextCardState(fromState, event);
  } catch (error) {
    if (!(error instanceof IllegalCardTransitionError)) throw error;
    throw new ConflictError(
      `Card ${card.cardNumber} is ${fromState}; "${event}" applies only to a card that is ${statesTaking(event).join(' or ')}.`,
      [{ currentState: fromState, event }],
    );
  }
  const at = new Date().toISOString();
  const result = await manager.update(
    KanbanCardEntity,
    { id: card.id, state: fromState, retiredAt: IsNull() },
    { state: toState, stateChangedAt: at },
  );
  if (result.affected === 0) {
    throw new ConflictError(`Card ${card.cardNumber} changed while this scan was recorded; scan it again.`);
  }
  const scan = await manager.save(
    manager.create(CardScanEntity, { cardId: card.id, event, fromState, toState, userEmail, scannedAt: at }),
  );
  return { card: Object.assign(card, { state: toState, stateChangedAt: at }), scan };
}
