/**
 * Kanban loop sizing: how many cards a loop needs.
 *
 *   T     = leadTimeDays, or for a delivery cycle days × (1 + delay) / deliveries
 *   exact = (D · (T · (1 + safetyFactor) + safetyDays) + safetyStock) / containerQty
 *   cards = ⌈exact⌉
 *
 * D and T may be in any one time unit (per day and days, per hour and hours); safetyDays is then in
 * that unit too. Inputs arrive as JSON numbers such as 0.2 or 1.1, which are not exact in binary
 * floating point; multiplying them as doubles can land a hair above a whole number (500 × 0.2 ×
 * 1.1 / 10 gives 11.000000000000002) and a plain Math.ceil would then ask for one card too many.
 * So every input is read back as the decimal the user typed and the formula is evaluated in exact
 * rational arithmetic on bigints; only the reported `exact` is converted back to a double.
 */

/**
 * A delivery cycle written days–deliveries–delay: `deliveries` deliveries every `days` days, each
 * bringing the parts for the cards collected `delay` deliveries earlier.
 */
export interface DeliveryCycle {
  days: number;
  deliveries: number;
  delay: number;
}

/** Sizing input; give exactly one of `leadTimeDays` or `cycle`. Safety terms default to 0. */
export interface KanbanSizeInput {
  dailyDemand: number;
  containerQty: number;
  leadTimeDays?: number;
  cycle?: DeliveryCycle;
  /** Safety allowance as a fraction of demand over the replenishment time (0.1 = 10 %). */
  safetyFactor?: number;
  /** Safety allowance in days (or hours) of demand. */
  safetyDays?: number;
  /** Safety allowance in units. */
  safetyStock?: number;
}

export interface KanbanSizing {
  /** The unrounded card count, as the double nearest the exact rational value. */
  exact: number;
  /** ⌈exact⌉ taken in exact arithmetic. */
  cards: number;
  /** T, the replenishment time used (days, or hours when demand is per hour). */
  replenishmentTime: number;
  /** The formula with the numbers filled in, for display. */
  formula: string;
}

/** Invalid sizing input; `field` names the offending request field (dotted for the cycle). */
export class KanbanInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.name = 'KanbanInputError';
    this.field = field;
  }
}

interface Rational {
  num: bigint;
  den: bigint;
}

const ONE: Rational = { num: 1n, den: 1n };

function gcd(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) {
    [x, y] = [y, x % y];
  }
  return x;
}

function rational(num: bigint, den: bigint): Rational {
  if (den < 0n) {
    num = -num;
    den = -den;
  }
  const divisor = gcd(num, den);
  return divisor > 1n ? { num: num / divisor, den: den / divisor } : { num, den };
}

function add(a: Rational, b: Rational): Rational {
  return rational(a.num * b.den + b.num * a.den, a.den * b.den);
}

function multiply(a: Rational, b: Rational): Rational {
  return rational(a.num * b.num, a.den * b.den);
}

function divide(a: Rational, b: Rational): Rational {
  return rational(a.num * b.den, a.den * b.num);
}

function ceil(r: Rational): bigint {
  const quotient = r.num / r.den;
  return r.num > 0n && r.num % r.den !== 0n ? quotient + 1n : quotient;
}

function bitLength(value: bigint): number {
  return value === 0n ? 0 : value.toString(2).length;
}

/** Nearest double: a 64–65 bit quotient with a sticky bit lets Number(bigint) round once, correctly. */
function toNumber(r: Rational): number {
  if (r.num === 0n) return 0;
  const negative = r.num < 0n;
  const num = negative ? -r.num : r.num;
  const shift = 64 - (bitLength(num) - bitLength(r.den));
  const dividend = shift >= 0 ? num << BigInt(shift) : num;
  const divisor = shift >= 0 ? r.den : r.den << BigInt(-shift);
  let quotient = dividend / divisor;
  if (dividend % divisor !== 0n) quotient |= 1n;
  const half = Math.trunc(-shift / 2);
  const magnitude = Number(quotient) * 2 ** half * 2 ** (-shift - half);
  return negative ? -magnitude : magnitude;
}

/** A finite double as the decimal it prints as: digits × 10^exponent. */
interface Decimal {
  digits: bigint;
  exponent: number;
}

function toDecimal(value: number): Decimal {
  // toString gives the shortest decimal that reads back as the same double, i.e. what was typed.
  const match = /^(-?)(\d+)(?:\.(\d+))?(?:e([+-]\d+))?$/.exec(String(value));
  if (!match) throw new Error(`Cannot read ${value} as a decimal`);
  const [, sign, whole, fraction = '', exponent = '0'] = match;
  const digits = BigInt(`${sign}${whole}${fraction}`);
  return { digits, exponent: Number(exponent) - fraction.length };
}

function decimalToRational({ digits, exponent }: Decimal): Rational {
  return exponent >= 0 ? rational(digits * 10n ** BigInt(exponent), 1n) : rational(digits, 10n ** BigInt(-exponent));
}

function decimalToString({ digits, exponent }: Decimal): string {
  const negative = digits < 0n;
  const body = (negative ? -digits : digits).toString();
  let text: string;
  if (exponent >= 0) {
    text = body === '0' ? '0' : body + '0'.repeat(exponent);
  } else {
    const padded = body.padStart(-exponent + 1, '0');
    const point = padded.length + exponent;
    text = `${padded.slice(0, point)}.${padded.slice(point)}`.replace(/\.?0+$/, '');
  }
  return negative ? `-${text}` : text;
}

const MAX_DISPLAY_DECIMALS = 40;

/** Readable value of a derived rational: whole, a few decimals, "≈" when rounded, ">n" when only a trace above n. */
function formatRational(r: Rational): string {
  if (r.den === 1n) return r.num.toString();
  const negative = r.num < 0n;
  const num = negative ? -r.num : r.num;
  for (let places = 4; places <= MAX_DISPLAY_DECIMALS; places += 1) {
    const scale = 10n ** BigInt(places);
    const rounded = (2n * num * scale + r.den) / (2n * r.den);
    if (rounded % scale === 0n) continue;
    const text = decimalToString({ digits: rounded, exponent: -places });
    const exact = (num * scale) % r.den === 0n;
    return `${exact ? '' : '≈'}${negative ? '-' : ''}${text}`;
  }
  return negative ? `<-${num / r.den}` : `>${num / r.den}`;
}

/** The value as an exact decimal, or null when its expansion repeats (denominator not 2^a·5^b). */
function exactDecimal(r: Rational): Decimal | null {
  let den = r.den;
  let twos = 0;
  let fives = 0;
  for (; den % 2n === 0n; twos += 1) den /= 2n;
  for (; den % 5n === 0n; fives += 1) den /= 5n;
  if (den !== 1n) return null;
  const places = Math.max(twos, fives);
  return { digits: (r.num * 10n ** BigInt(places)) / r.den, exponent: -places };
}

function readNumber(field: string, value: unknown): Decimal {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new KanbanInputError(field, 'must be a finite number');
  }
  return toDecimal(value);
}

function nonNegative(field: string, value: unknown): Decimal {
  const decimal = readNumber(field, value);
  if (decimal.digits < 0n) throw new KanbanInputError(field, 'must not be negative');
  return decimal;
}

function optionalNonNegative(field: string, value: unknown): Decimal {
  return value === undefined ? { digits: 0n, exponent: 0 } : nonNegative(field, value);
}

function positive(field: string, value: unknown): Decimal {
  const decimal = nonNegative(field, value);
  if (decimal.digits === 0n) throw new KanbanInputError(field, 'must be greater than zero');
  return decimal;
}

function positiveWhole(field: string, value: unknown): Decimal {
  const decimal = positive(field, value);
  if (!Number.isInteger(value)) throw new KanbanInputError(field, 'must be a whole number');
  return decimal;
}

interface ReplenishmentTime {
  value: Rational;
  /** T as it appears inside the main formula. */
  shown: string;
  /** How T was obtained, shown before the main formula; empty for a plain lead time. */
  derivation: string;
}

function replenishmentTime(input: KanbanSizeInput): ReplenishmentTime {
  const hasLeadTime = input.leadTimeDays !== undefined;
  const hasCycle = input.cycle !== undefined;
  if (hasLeadTime && hasCycle) {
    throw new KanbanInputError('cycle', 'give either leadTimeDays or cycle, not both');
  }
  if (!hasLeadTime && !hasCycle) {
    throw new KanbanInputError('leadTimeDays', 'give leadTimeDays or a delivery cycle');
  }
  if (hasLeadTime) {
    const leadTime = nonNegative('leadTimeDays', input.leadTimeDays);
    return { value: decimalToRational(leadTime), shown: decimalToString(leadTime), derivation: '' };
  }
  const cycle = input.cycle as DeliveryCycle;
  if (typeof cycle !== 'object' || cycle === null) {
    throw new KanbanInputError('cycle', 'must be an object {days, deliveries, delay}');
  }
  const days = nonNegative('cycle.days', cycle.days);
  const deliveries = positiveWhole('cycle.deliveries', cycle.deliveries);
  const delay = nonNegative('cycle.delay', cycle.delay);
  const value = divide(
    multiply(decimalToRational(days), add(ONE, decimalToRational(delay))),
    decimalToRational(deliveries),
  );
  // A repeating T is shown as a fraction so the filled-in formula stays exact.
  const decimal = exactDecimal(value);
  const shown = decimal ? decimalToString(decimal) : `${value.num}/${value.den}`;
  const derivation =
    `T = ${decimalToString(days)} × (1 + ${decimalToString(delay)}) / ${decimalToString(deliveries)} = ` +
    `${shown}${decimal ? '' : ` ${formatRational(value).replace('≈', '≈ ')}`}; `;
  return { value, shown, derivation };
}

/**
 * Card count for a kanban loop by the formula above, exact for decimal inputs.
 * Throws KanbanInputError on invalid input. Zero demand gives 0 cards; a loop of 0 cards has no
 * cards in circulation and so never signals, so callers that want a minimum must apply it themselves.
 */
export function sizeKanban(input: KanbanSizeInput): KanbanSizing {
  const demand = nonNegative('dailyDemand', input.dailyDemand);
  const containerQty = positive('containerQty', input.containerQty);
  const time = replenishmentTime(input);
  const safetyFactor = optionalNonNegative('safetyFactor', input.safetyFactor);
  const safetyDays = optionalNonNegative('safetyDays', input.safetyDays);
  const safetyStock = optionalNonNegative('safetyStock', input.safetyStock);

  const coveredTime = add(
    multiply(time.value, add(ONE, decimalToRational(safetyFactor))),
    decimalToRational(safetyDays),
  );
  const units = add(multiply(decimalToRational(demand), coveredTime), decimalToRational(safetyStock));
  const exact = divide(units, decimalToRational(containerQty));
  const cards = ceil(exact);
  if (cards > BigInt(Number.MAX_SAFE_INTEGER)) {
    throw new KanbanInputError('dailyDemand', 'gives more cards than can be counted; check the units');
  }

  const formula =
    `${time.derivation}⌈(${decimalToString(demand)} × (${time.shown} × (1 + ${decimalToString(safetyFactor)}) + ` +
    `${decimalToString(safetyDays)}) + ${decimalToString(safetyStock)}) / ${decimalToString(containerQty)}⌉ = ` +
    `⌈${formatRational(exact)}⌉ = ${cards}`;

  return {
    exact: toNumber(exact),
    cards: Number(cards),
    replenishmentTime: toNumber(time.value),
    formula,
  };
}
