import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { isValid } from 'gtin';
import {
  cardNumber,
  gs1CheckDigit,
  isValidGs1,
  MAX_CARD_INDEX,
  MAX_LOOP_ID,
  parseCardNumber,
  withCheckDigit,
} from '../../shared/domain/gs1';

const digitString = (length: number) =>
  fc.array(fc.integer({ min: 0, max: 9 }), { minLength: length, maxLength: length }).map((digits) => digits.join(''));

describe('gs1CheckDigit', () => {
  it('reproduces the worked example of the GS1 General Specifications', () => {
    // GS1 General Specifications, section 7.9.1 (check digit calculation), worked example on the
    // SSCC data digits 37610425002123456: weighted sum 101, next multiple of ten 110, check digit 9
    // (from memory).
    const data = '37610425002123456';

    const check = gs1CheckDigit(data);

    expect(check).toBe(9);
    expect(withCheckDigit(data)).toBe('376104250021234569');
  });

  it.each([
    // gtin 1.0.2 README (npm package "gtin"), examples of isValid: all true.
    ['12341238'],
    ['1234123412344'],
    ['12341234123413'],
    ['012000007897'],
  ])('accepts %s, a valid GTIN from the gtin README', (gtin) => {
    const valid = isValidGs1(gtin);

    expect(valid).toBe(true);
    expect(gs1CheckDigit(gtin.slice(0, -1))).toBe(Number(gtin.at(-1)));
  });

  it('rejects 012000007896, the invalid GTIN-12 from the gtin README', () => {
    // gtin 1.0.2 README: isValid('012000007896') is false.
    expect(isValidGs1('012000007896')).toBe(false);
  });

  it('refuses anything but digits', () => {
    expect(() => gs1CheckDigit('')).toThrow(RangeError);
    expect(() => gs1CheckDigit('12a4')).toThrow(RangeError);
    expect(() => gs1CheckDigit('12 34')).toThrow(RangeError);
  });
});

describe('GS1 check digits against the gtin library', () => {
  it.each([7, 11, 12, 13])('appends a check digit gtin accepts to %i data digits', (dataLength) => {
    // Reference library: gtin 1.0.2 (npm), isValid for GTIN-8/12/13/14.
    fc.assert(
      fc.property(digitString(dataLength), (data) => {
        const full = withCheckDigit(data);

        expect(full).toHaveLength(dataLength + 1);
        expect(isValid(full)).toBe(true);
      }),
      { numRuns: 1_000 },
    );
  });

  it.each([8, 12, 13, 14])('agrees with gtin on any %i-digit string', (length) => {
    fc.assert(
      fc.property(digitString(length), (candidate) => {
        expect(isValidGs1(candidate)).toBe(isValid(candidate));
      }),
      { numRuns: 1_000 },
    );
  });

  it('catches every single-digit error', () => {
    // Property of the mod-10 rule with weights 3 and 1 (both prime to 10), GS1 General
    // Specifications section 7.9: changing any one digit changes the weighted sum mod 10.
    fc.assert(
      fc.property(digitString(12), fc.nat(12), fc.integer({ min: 1, max: 9 }), (data, position, shift) => {
        const full = withCheckDigit(data);
        const changed = (Number(full[position]) + shift) % 10;
        const misread = `${full.slice(0, position)}${changed}${full.slice(position + 1)}`;

        expect(isValidGs1(misread)).toBe(false);
        expect(isValid(misread)).toBe(false);
      }),
      { numRuns: 1_000 },
    );
  });

  it('returns false rather than throwing for strings that are not digit keys', () => {
    expect(isValidGs1('')).toBe(false);
    expect(isValidGs1('7')).toBe(false);
    expect(isValidGs1('1234-1238')).toBe(false);
  });
});

describe('cardNumber', () => {
  it('packs the loop id and card index into 11 digits plus a GS1 check digit', () => {
    const printed = cardNumber(4217, 3);

    expect(printed).toHaveLength(12);
    expect(printed.slice(0, 11)).toBe('00042170003');
    expect(isValid(printed)).toBe(true);
  });

  it('round-trips through parseCardNumber for any loop and card', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: MAX_LOOP_ID }),
        fc.integer({ min: 1, max: MAX_CARD_INDEX }),
        (loopId, cardIndex) => {
          const printed = cardNumber(loopId, cardIndex);

          expect(isValid(printed)).toBe(true);
          expect(parseCardNumber(printed)).toEqual({ loopId, cardIndex });
        },
      ),
      { numRuns: 1_000 },
    );
  });

  it('reads a scanned number with surrounding whitespace and refuses a mistyped one', () => {
    const printed = cardNumber(12, 7);
    const lastDigit = Number(printed.at(-1));
    const mistyped = `${printed.slice(0, -1)}${(lastDigit + 1) % 10}`;

    expect(parseCardNumber(` ${printed}\n`)).toEqual({ loopId: 12, cardIndex: 7 });
    expect(parseCardNumber(mistyped)).toBeNull();
    expect(parseCardNumber('R-2024-0001')).toBeNull();
  });

  it.each([
    [0, 1],
    [MAX_LOOP_ID + 1, 1],
    [1.5, 1],
    [1, 0],
    [1, MAX_CARD_INDEX + 1],
    [1, 2.5],
  ])('refuses loop %d card %d', (loopId, cardIndex) => {
    expect(() => cardNumber(loopId, cardIndex)).toThrow(RangeError);
  });
});
