/**
 * GS1 mod-10 check digits (GS1 General Specifications, section 7.9): digits are weighted 3 and 1
 * alternately starting with 3 at the digit next to the check digit, and the check digit brings the
 * weighted sum up to a multiple of ten. The same rule covers GTIN-8/12/13/14, SSCC and GSIN.
 */

const DIGITS = /^\d+$/;

/** Check digit (0–9) for a string of data digits, by the GS1 mod-10 rule. */
export function gs1CheckDigit(digits: string): number {
  if (!DIGITS.test(digits)) {
    throw new RangeError(`Expected one or more digits, got "${digits}"`);
  }
  let sum = 0;
  for (let fromRight = 0; fromRight < digits.length; fromRight += 1) {
    const digit = digits.charCodeAt(digits.length - 1 - fromRight) - 48;
    sum += digit * (fromRight % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

/** The data digits followed by their GS1 check digit. */
export function withCheckDigit(digits: string): string {
  return `${digits}${gs1CheckDigit(digits)}`;
}

/** True when the last digit is the GS1 check digit of the ones before it; false for anything not all digits. */
export function isValidGs1(digitsWithCheck: string): boolean {
  if (typeof digitsWithCheck !== 'string' || digitsWithCheck.length < 2 || !DIGITS.test(digitsWithCheck)) {
    return false;
  }
  const data = digitsWithCheck.slice(0, -1);
  return gs1CheckDigit(data) === Number(digitsWithCheck.at(-1));
}

/** Loop ids fit in 7 digits and card indexes in 4, so a card number has 11 data digits. */
export const MAX_LOOP_ID = 9_999_999;
export const MAX_CARD_INDEX = 9_999;

/**
 * Printed number of a kanban card: 12 digits, the loop id zero-padded to 7, the card's 1-based
 * index in the loop zero-padded to 4, then a GS1 check digit so a mistyped or misread number is
 * caught at the dock. It borrows only the check-digit rule: it is an internal number, not a GTIN,
 * and must not be printed in an EAN/UPC symbol.
 */
export function cardNumber(loopId: number, cardIndex: number): string {
  if (!Number.isInteger(loopId) || loopId < 1 || loopId > MAX_LOOP_ID) {
    throw new RangeError(`Loop id must be a whole number from 1 to ${MAX_LOOP_ID}, got ${loopId}`);
  }
  if (!Number.isInteger(cardIndex) || cardIndex < 1 || cardIndex > MAX_CARD_INDEX) {
    throw new RangeError(`Card index must be a whole number from 1 to ${MAX_CARD_INDEX}, got ${cardIndex}`);
  }
  return withCheckDigit(`${String(loopId).padStart(7, '0')}${String(cardIndex).padStart(4, '0')}`);
}

/** Loop id and card index from a scanned or typed card number; null when it is not a valid card number. */
export function parseCardNumber(text: string): { loopId: number; cardIndex: number } | null {
  const trimmed = text.trim();
  if (trimmed.length !== 12 || !isValidGs1(trimmed)) return null;
  const loopId = Number(trimmed.slice(0, 7));
  const cardIndex = Number(trimmed.slice(7, 11));
  return loopId >= 1 && cardIndex >= 1 ? { loopId, cardIndex } : null;
}
