import type { INGREDIENT_CATEGORIES } from '@shared/schemas/batches';
import { numberOrNull } from './form-values';

/** One ingredient as the form holds it (the amount may still be empty). */
export interface IngredientRow {
  category: (typeof INGREDIENT_CATEGORIES)[number];
  name: string;
  amount: number | string | null;
  unit: string;
}

/** The rows as the start request wants them; empty amounts stay null so the schema names them. */
export const ingredientsForRequest = (rows: IngredientRow[]) => rows.map((row) => ({ ...row, amount: numberOrNull(row.amount) }));
