import { CalcInputError } from '../../shared/calc';
import { BadRequestError } from '../http/errors';

/** Runs a shared/calc function, turning its input errors into a 400 the user can act on. */
export function calc<T>(fn: () => T): T {
  try {
    return fn();
  } catch (error) {
    if (error instanceof CalcInputError) throw new BadRequestError(error.message, { field: error.field });
    throw error;
  }
}
