/** Litres as people write them: at most 3 decimals, no trailing zeros. */
export const litres = (value: number): string => String(Number(value.toFixed(3)));

/** Rounds away float noise from sums of litres (the columns keep 3 decimals). */
export const roundLitres = (value: number): number => Number(value.toFixed(3));
