import type { ValueTransformer } from 'typeorm';

/** pg returns NUMERIC as a string to keep precision; our quantities fit a double. */
export const numericTransformer: ValueTransformer = {
  to: (value: number | null | undefined) => value,
  from: (value: string | null) => (value === null ? null : Number(value)),
};
