import { describe, it, expect } from 'vitest';
import {
  CalcInputError,
  GRAVITY_MAX,
  GRAVITY_MIN,
  requireAtLeast,
  requireDate,
  requireFinite,
  requireFiniteResult,
  requireGravity,
  requireInteger,
  requireNonNegative,
  requireOneOf,
  requirePositive,
  requireRange,
  showNumber,
} from '../../shared/calc/guards';
import { expectInputError } from './expect-input-error';

// The messages are what a cellar hand reads under a field; each is checked word for word.
describe('showNumber — a number for a message, without hiding the digits that matter', () => {
  it.each([
    [Number.NaN, 0, 'NaN'],
    [Number.POSITIVE_INFINITY, 0, 'Infinity'],
    [Number.NEGATIVE_INFINITY, 0, '-Infinity'],
    [3, 0, '3'],
    [1.2, 3, '1.200'],
    [1.05, 3, '1.050'],
    [1.0504, 3, '1.0504'], // the fixed form would hide a real difference
    [1.00000001, 3, '1.000'], // a difference beyond eight digits is noise
    [1.00001, 3, '1.00001'],
    [1e-300, 0, '1e-300'],
    [2.5, 0, '2.5'],
    [1.23456789012, 1, '1.2345679'], // eight significant digits at most
    [0.5, -2, '0.5'], // negative decimals count as none
    [-4, 0, '-4'],
    [123456789, 0, '123456789'], // exact in fixed form: all nine digits kept
  ])('%s with %s decimals is "%s"', (value, decimals, text) => {
    expect(showNumber(value, decimals)).toBe(text);
  });

  it('shows no decimals by default', () => {
    expect(showNumber(7)).toBe('7');
    expect(showNumber(7.25)).toBe('7.25');
  });
});

describe('CalcInputError', () => {
  it('is an Error named CalcInputError that names the argument', () => {
    const e = new CalcInputError('readings[2].sg', 'Gravity of reading 3 must be a number (got NaN).');
    expect(e).toBeInstanceOf(Error);
    expect(e.name).toBe('CalcInputError');
    expect(e.field).toBe('readings[2].sg');
    expect(e.message).toBe('Gravity of reading 3 must be a number (got NaN).');
  });
});

describe('requireFinite', () => {
  it('hands back a finite number', () => {
    expect(requireFinite(-2.5, 'x', 'X')).toBe(-2.5);
  });

  it.each([
    [Number.NaN, 'Volume must be a number (got NaN).'],
    [Number.NEGATIVE_INFINITY, 'Volume must be a number (got -Infinity).'],
    ['12', "Volume must be a number (got '12')."],
    ['', 'Volume must be a number (got an empty value).'],
    [null, 'Volume must be a number (got nothing).'],
    [undefined, 'Volume must be a number (got nothing).'],
    [new Date(0), 'Volume must be a number (got an invalid date).'],
    [{}, 'Volume must be a number (got object).'],
    [true, 'Volume must be a number (got boolean).'],
  ])('rejects %s with a plain message', (value, message) => {
    expectInputError(() => requireFinite(value, 'volumeL', 'Volume'), 'volumeL', message);
  });
});

describe('requireRange', () => {
  it('accepts both ends of the range', () => {
    expect(requireRange(0, 'x', 'X', 0, 40)).toBe(0);
    expect(requireRange(40, 'x', 'X', 0, 40)).toBe(40);
  });

  it('prints the limits and the value with the decimals and unit asked for', () => {
    expectInputError(
      () => requireRange(41, 'sampleC', 'Sample temperature', 0, 40, 0, ' °C'),
      'sampleC',
      'Sample temperature must be between 0 and 40 °C (got 41 °C).',
    );
    expectInputError(() => requireRange(-0.5, 'x', 'Share', 0, 0.5, 2), 'x', 'Share must be between 0.00 and 0.50 (got -0.50).');
    expectInputError(() => requireRange(Number.NaN, 'x', 'Share', 0, 1), 'x', 'Share must be a number (got NaN).');
  });
});

describe('requireGravity', () => {
  it('accepts 0.980 to 1.200', () => {
    expect(GRAVITY_MIN).toBe(0.98);
    expect(GRAVITY_MAX).toBe(1.2);
    expect(requireGravity(0.98, 'sg', 'Gravity')).toBe(0.98);
    expect(requireGravity(1.2, 'sg', 'Gravity')).toBe(1.2);
    expectInputError(() => requireGravity(0.979, 'sg', 'Gravity'), 'sg', 'Gravity must be between 0.980 and 1.200 (got 0.979).');
    expectInputError(() => requireGravity(1.2001, 'sg', 'Gravity'), 'sg', 'Gravity must be between 0.980 and 1.200 (got 1.2001).');
  });
});

describe('requireNonNegative, requirePositive, requireAtLeast', () => {
  it('accept the smallest allowed value', () => {
    expect(requireNonNegative(0, 'x', 'X')).toBe(0);
    expect(requirePositive(1e-9, 'x', 'X')).toBe(1e-9);
    expect(requireAtLeast(1, 'x', 'X', 1)).toBe(1);
  });

  it('say what is wrong, with the unit', () => {
    expectInputError(() => requireNonNegative(-2, 'volumeL', 'Volume', ' L'), 'volumeL', 'Volume cannot be negative (got -2 L).');
    expectInputError(() => requireNonNegative(-2, 'v', 'Volume'), 'v', 'Volume cannot be negative (got -2).');
    expectInputError(() => requirePositive(0, 'limitL', 'Yearly limit', ' L'), 'limitL', 'Yearly limit must be more than zero (got 0 L).');
    expectInputError(() => requirePositive(-1, 'n', 'Count'), 'n', 'Count must be more than zero (got -1).');
    expectInputError(() => requireAtLeast(0.5, 'bottleMl', 'Bottle size', 1, ' mL'), 'bottleMl', 'Bottle size must be at least 1 mL (got 0.5 mL).');
    expectInputError(() => requireAtLeast(2, 'n', 'Count', 3), 'n', 'Count must be at least 3 (got 2).');
    expectInputError(() => requireAtLeast('3', 'n', 'Count', 3), 'n');
  });
});

describe('requireFiniteResult', () => {
  it('hands back a finite figure and blames the argument for an overflow', () => {
    expect(requireFiniteResult(1e308, 'value', 'Volume')).toBe(1e308);
    expect(requireFiniteResult(0, 'value', 'Volume')).toBe(0);
    expectInputError(() => requireFiniteResult(Number.POSITIVE_INFINITY, 'value', 'Volume'), 'value', 'Volume is too large to work with.');
    expectInputError(() => requireFiniteResult(Number.NaN, 'kg', 'Mass'), 'kg', 'Mass is too large to work with.');
  });
});

describe('requireInteger', () => {
  it('accepts whole numbers within the range, 0 or more by default', () => {
    expect(requireInteger(0, 'n', 'Count')).toBe(0);
    expect(requireInteger(12, 'n', 'Count', 1, 12)).toBe(12);
    expect(requireInteger(1, 'n', 'Count', 1, 12)).toBe(1);
  });

  it('says what is wrong', () => {
    expectInputError(() => requireInteger(2.5, 'bottles', 'Number of bottles'), 'bottles', 'Number of bottles must be a whole number (got 2.5).');
    expectInputError(() => requireInteger(-1, 'bottles', 'Number of bottles'), 'bottles', 'Number of bottles must be 0 or more (got -1).');
    expectInputError(() => requireInteger(0, 'perCase', 'Bottles per case', 1), 'perCase', 'Bottles per case must be 1 or more (got 0).');
    expectInputError(() => requireInteger(13, 'm', 'Month', 1, 12), 'm', 'Month must be between 1 and 12 (got 13).');
    expectInputError(() => requireInteger(0, 'm', 'Month', 1, 12), 'm', 'Month must be between 1 and 12 (got 0).');
  });
});

describe('requireDate', () => {
  it('takes a Date (as a copy) or an ISO string', () => {
    const d = new Date('2024-03-01T10:00:00Z');
    const got = requireDate(d, 'at', 'Date');
    expect(got.getTime()).toBe(d.getTime());
    expect(got).not.toBe(d);
    expect(requireDate('2024-03-01', 'at', 'Date').toISOString()).toBe('2024-03-01T00:00:00.000Z');
  });

  it.each([
    ['soon', "Start date must be a valid date (got 'soon')."],
    ['   ', "Start date must be a valid date (got '   ')."],
    ['', 'Start date must be a valid date (got an empty value).'],
    [new Date(Number.NaN), 'Start date must be a valid date (got an invalid date).'],
    [20240301, 'Start date must be a valid date (got 20240301).'],
    [null, 'Start date must be a valid date (got nothing).'],
  ])('rejects %s', (value, message) => {
    expectInputError(() => requireDate(value, 'start', 'Start date'), 'start', message);
  });
});

describe('requireOneOf', () => {
  it('hands back a listed value and names the list otherwise', () => {
    expect(requireOneOf('us', ['metric', 'us'] as const, 'system', 'Unit system')).toBe('us');
    expectInputError(
      () => requireOneOf('imperial', ['metric', 'us'] as const, 'system', 'Unit system'),
      'system',
      "Unit system must be one of 'metric', 'us' (got 'imperial').",
    );
    expectInputError(
      () => requireOneOf(3, ['metric', 'us'] as const, 'system', 'Unit system'),
      'system',
      "Unit system must be one of 'metric', 'us' (got 3).",
    );
  });
});
