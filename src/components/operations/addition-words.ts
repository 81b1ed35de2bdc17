import { ADDITION_CATEGORIES } from '@shared/schemas/journal';

export type AdditionCategory = (typeof ADDITION_CATEGORIES)[number];

/** Plain words and an icon for each kind of addition. */
export const ADDITION_CATEGORY_WORDS: Record<AdditionCategory, { label: string; icon: string }> = {
  fruit: { label: 'Fruit', icon: 'nutrition' },
  oak: { label: 'Oak', icon: 'forest' },
  spice: { label: 'Spice or herb', icon: 'eco' },
  nutrient: { label: 'Yeast nutrient', icon: 'science' },
  stabiliser: { label: 'Stabiliser (sulfite, sorbate)', icon: 'shield' },
  sweetener: { label: 'Sweetener (back-sweetening)', icon: 'water_drop' },
  fining: { label: 'Fining agent', icon: 'filter_alt' },
  acid: { label: 'Acid', icon: 'opacity' },
  tannin: { label: 'Tannin', icon: 'local_cafe' },
  other: { label: 'Other', icon: 'more_horiz' },
};

/** Additions that usually come out again, so the form asks when. */
export const REMOVABLE_CATEGORIES: readonly AdditionCategory[] = ['oak', 'fruit', 'spice'];

/** Units an addition is weighed or measured in. */
export const ADDITION_UNITS = ['g', 'kg', 'oz', 'lb', 'mL', 'L', 'tsp', 'tbsp', 'tablet', 'piece'] as const;

/** Days oak usually stays in before the first taste-check (common practice). */
export const OAK_DEFAULT_DAYS = 28;
