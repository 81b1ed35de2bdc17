/**
 * Input checks shared by every calculation. Each check either returns the
 * value (narrowed to a usable number or date) or throws a CalcInputError that
 * names the offending argument, so no calculation ever hands back NaN or
 * Infinity.
 */

/** Thrown when a calculation is given input that cannot be real. */
export class CalcInputError extends Error {
  /** Name of the argument (or nested field, e.g. `readings[2].sg`) that was rejected. */
  readonly field: string;

  /**
   * @param field - name of the rejected argument
   * @param message - plain-language explanation a cellar hand can act on
   */
  constructor(field: string, message: string) {
    super(message);
    this.name = 'CalcInputError';
    this.field = field;
  }
}

/** Lowest specific gravity accepted anywhere (a very dry, strong wine reads about 0.990). */
export const GRAVITY_MIN = 0.98;
/** Highest specific gravity accepted anywhere (beyond the strongest musts a yeast can start in). */
export const GRAVITY_MAX = 1.2;

/**
 * Formats a number for an error message without losing the digits that matter.
 * @param value - the number to show
 * @param decimals - minimum decimals to show
 */
export function showNumber(value: number, decimals = 0): string {
  // NaN and ±Infinity come out of toFixed as "NaN" and "±Infinity", which is what a message needs.
  const fixed = value.toFixed(Math.max(decimals, 0));
  // Keep extra digits only when the fixed form would hide a real difference.
  if (Number(fixed) === value) return fixed;
  const precise = String(Number(value.toPrecision(8)));
  const preciseDecimals = precise.includes('.') ? precise.split('.')[1].length : 0;
  return preciseDecimals < decimals ? fixed : precise;
}

/**
 * Requires a finite number.
 * @param value - the argument as received
 * @param field - argument name reported in the error
 * @param label - what the value is, in plain words ("Original gravity")
 */
export function requireFinite(value: unknown, field: string, label: string): number {
  if (typeof value !== 'number') {
    throw new CalcInputError(field, `${label} must be a number (got ${describe(value)}).`);
  }
  if (!Number.isFinite(value)) {
    throw new CalcInputError(field, `${label} must be a number (got ${showNumber(value)}).`);
  }
  return value;
}

/**
 * Requires a finite number within [min, max].
 * @param value - the argument as received
 * @param field - argument name reported in the error
 * @param label - plain-words name of the value
 * @param min - lowest accepted value
 * @param max - highest accepted value
 * @param decimals - decimals used to print the limits and the received value
 * @param unit - unit suffix for the message, e.g. ' °C' (include the leading space)
 */
export function requireRange(value: unknown, field: string, label: string, min: number, max: number, decimals = 0, unit = ''): number {
  const n = requireFinite(value, field, label);
  if (n < min || n > max) {
    throw new CalcInputError(
      field,
      `${label} must be between ${showNumber(min, decimals)} and ${showNumber(max, decimals)}${unit} (got ${showNumber(n, decimals)}${unit}).`,
    );
  }
  return n;
}

/**
 * Requires a specific gravity within GRAVITY_MIN..GRAVITY_MAX.
 * @param value - the gravity as received
 * @param field - argument name reported in the error
 * @param label - plain-words name ("Final gravity")
 */
export function requireGravity(value: unknown, field: string, label: string): number {
  return requireRange(value, field, label, GRAVITY_MIN, GRAVITY_MAX, 3);
}

/**
 * Requires a finite number that is zero or more.
 * @param value - the argument as received
 * @param field - argument name reported in the error
 * @param label - plain-words name of the value
 * @param unit - unit suffix for the message (leading space included)
 */
export function requireNonNegative(value: unknown, field: string, label: string, unit = ''): number {
  const n = requireFinite(value, field, label);
  if (n < 0) {
    throw new CalcInputError(field, `${label} cannot be negative (got ${showNumber(n)}${unit}).`);
  }
  return n;
}

/**
 * Requires a finite number above zero.
 * @param value - the argument as received
 * @param field - argument name reported in the error
 * @param label - plain-words name of the value
 * @param unit - unit suffix for the message (leading space included)
 */
export function requirePositive(value: unknown, field: string, label: string, unit = ''): number {
  const n = requireFinite(value, field, label);
  if (n <= 0) {
    throw new CalcInputError(field, `${label} must be more than zero (got ${showNumber(n)}${unit}).`);
  }
  return n;
}

/**
 * Requires a finite number at or above `min`.
 * @param value - the argument as received
 * @param field - argument name reported in the error
 * @param label - plain-words name of the value
 * @param min - lowest accepted value
 * @param unit - unit suffix for the message (leading space included)
 */
export function requireAtLeast(value: unknown, field: string, label: string, min: number, unit = ''): number {
  const n = requireFinite(value, field, label);
  if (n < min) {
    throw new CalcInputError(field, `${label} must be at least ${showNumber(min)}${unit} (got ${showNumber(n)}${unit}).`);
  }
  return n;
}

/**
 * Hands back a computed figure, or throws when finite input has overflowed into Infinity
 * (1e308 gallons in litres): the error names the argument that made it too large.
 * @param value - the computed figure
 * @param field - the argument to blame
 * @param label - plain-words name of that argument
 */
export function requireFiniteResult(value: number, field: string, label: string): number {
  if (Number.isFinite(value)) return value;
  throw new CalcInputError(field, `${label} is too large to work with.`);
}

/**
 * Requires a whole number within [min, max].
 * @param value - the argument as received
 * @param field - argument name reported in the error
 * @param label - plain-words name of the value
 * @param min - lowest accepted value
 * @param max - highest accepted value
 */
export function requireInteger(value: unknown, field: string, label: string, min = 0, max = Number.MAX_SAFE_INTEGER): number {
  const n = requireFinite(value, field, label);
  if (!Number.isInteger(n)) {
    throw new CalcInputError(field, `${label} must be a whole number (got ${showNumber(n)}).`);
  }
  if (n < min || n > max) {
    throw new CalcInputError(
      field,
      max === Number.MAX_SAFE_INTEGER ? `${label} must be ${min} or more (got ${n}).` : `${label} must be between ${min} and ${max} (got ${n}).`,
    );
  }
  return n;
}

/**
 * Requires a valid date; accepts a Date or an ISO 8601 string.
 * Date-only strings (YYYY-MM-DD) are read as UTC midnight, as JavaScript does.
 * @param value - the date as received
 * @param field - argument name reported in the error
 * @param label - plain-words name of the value
 */
export function requireDate(value: unknown, field: string, label: string): Date {
  let d: Date | null = null;
  if (value instanceof Date) d = new Date(value.getTime());
  // An empty or blank string makes an invalid Date, so it is rejected below.
  else if (typeof value === 'string') d = new Date(value);
  if (d === null || Number.isNaN(d.getTime())) {
    throw new CalcInputError(field, `${label} must be a valid date (got ${describe(value)}).`);
  }
  return d;
}

/**
 * Requires a value from a fixed list.
 * @param value - the argument as received
 * @param allowed - accepted values
 * @param field - argument name reported in the error
 * @param label - plain-words name of the value
 */
export function requireOneOf<T extends string>(value: unknown, allowed: readonly T[], field: string, label: string): T {
  if ((allowed as readonly unknown[]).includes(value)) return value as T;
  throw new CalcInputError(field, `${label} must be one of ${allowed.map((a) => `'${a}'`).join(', ')} (got ${describe(value)}).`);
}

function describe(value: unknown): string {
  if (typeof value === 'number') return showNumber(value);
  if (typeof value === 'string') return value === '' ? 'an empty value' : `'${value}'`;
  if (value === null) return 'nothing';
  if (value === undefined) return 'nothing';
  if (value instanceof Date) return 'an invalid date';
  return typeof value;
}
