import { computed, type ComputedRef } from 'vue';
import { CalcInputError } from '@shared/calc';

/** Thrown by `need()` when a required field is empty: the calculator shows its hint, not an error. */
export class EmptyField extends Error {
  constructor() {
    super('A required field is empty.');
    this.name = 'EmptyField';
  }
}

/** What a calculator shows: a hint (something is empty), a result, or the library's complaint. */
export type CalcOutcome<T> = { status: 'empty' } | { status: 'ok'; value: T } | { status: 'error'; field: string; message: string };

/** Library argument names (e.g. `og`, `readings[2].sg`) that belong to each field of a form. */
export type FieldMap<K extends string> = Record<K, readonly string[]>;

function claims(names: readonly string[], field: string): boolean {
  return names.some((n) => field === n || field.startsWith(`${n}[`) || field.startsWith(`${n}.`));
}

/**
 * Runs a calculation reactively. `compute` reads the form through `need()` and the unit helpers
 * and calls the shared library; a CalcInputError becomes a message under the field that
 * `fields` maps its `field` to (or a general message when no field claims it).
 * @param compute - the calculation; throws EmptyField or CalcInputError for incomplete or impossible input
 * @param fields - for each form field, the library argument names it feeds
 */
export function useCalcResult<T, K extends string>(compute: () => T, fields: FieldMap<K>) {
  const outcome: ComputedRef<CalcOutcome<T>> = computed(() => {
    try {
      return { status: 'ok', value: compute() };
    } catch (err) {
      if (err instanceof EmptyField) return { status: 'empty' };
      if (err instanceof CalcInputError) return { status: 'error', field: err.field, message: err.message };
      // Not expected from the library; keep the page alive and say so plainly.
      console.error(err);
      return { status: 'error', field: '', message: 'These figures could not be worked out. Check the values entered.' };
    }
  });

  const result = computed(() => (outcome.value.status === 'ok' ? outcome.value.value : null));

  /** Message for each form field that the library rejected. */
  const errors = computed(() => {
    const out: Partial<Record<K, string>> = {};
    const o = outcome.value;
    if (o.status !== 'error') return out;
    for (const key of Object.keys(fields) as K[]) {
      if (claims(fields[key], o.field)) out[key] = o.message;
    }
    return out;
  });

  /** The library's message when no field of the form claims it. */
  const generalError = computed(() => {
    const o = outcome.value;
    if (o.status !== 'error') return null;
    return (Object.values(fields) as readonly string[][]).some((names) => claims(names, o.field)) ? null : o.message;
  });

  return { outcome, result, errors, generalError };
}

/**
 * Like a try around one figure: its value, or the library's message when only this figure
 * cannot be worked out (e.g. attenuation for an OG of 1.000) while the rest of the card can.
 * @param compute - the calculation of that one figure
 */
export function figureOrMessage<T>(compute: () => T): { value: T; message: null } | { value: null; message: string } {
  try {
    return { value: compute(), message: null };
  } catch (err) {
    if (err instanceof CalcInputError) return { value: null, message: err.message };
    throw err;
  }
}
