import { expect } from 'vitest';
import { CalcInputError } from '../../shared/calc';

/**
 * Asserts that `fn` throws a CalcInputError naming `field`, with a readable
 * sentence as its message (and matching `message` when given).
 */
export function expectInputError(fn: () => unknown, field: string, message?: RegExp | string): void {
  let caught: unknown = undefined;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught, `expected a CalcInputError for ${field}`).toBeInstanceOf(CalcInputError);
  const err = caught as CalcInputError;
  expect(err.field).toBe(field);
  expect(err.name).toBe('CalcInputError');
  expect(err.message).toMatch(/^(pH\b|[A-Z0-9'"]).*[.)]$/s);
  expect(err.message).not.toMatch(/undefined|\[object/);
  if (typeof message === 'string') expect(err.message).toBe(message);
  else if (message) expect(err.message).toMatch(message);
}
