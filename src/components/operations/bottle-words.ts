import { LITRES_PER_US_FLUID_OUNCE, type UnitSystem } from '@shared/calc';
import type { CARBONATION, CLOSURES } from '@shared/schemas/journal';

/** Bottle sizes offered in the bottling form. */
export const BOTTLE_SIZES_ML = [187, 330, 355, 375, 500, 750, 1000, 1500] as const;

/** "750 mL", or "25.4 US fl oz (750 mL)" in US units. */
export function bottleSizeLabel(ml: number, system: UnitSystem): string {
  if (system !== 'us') return `${ml} mL`;
  const floz = (ml / 1000 / LITRES_PER_US_FLUID_OUNCE).toFixed(1).replace(/\.0$/, '');
  return `${floz} US fl oz (${ml} mL)`;
}

export const CLOSURE_WORDS: Record<(typeof CLOSURES)[number], string> = {
  cork: 'Natural cork',
  'synthetic-cork': 'Synthetic cork',
  'screw-cap': 'Screw cap',
  'crown-cap': 'Crown cap',
  'swing-top': 'Swing top',
};

export const CARBONATION_WORDS: Record<(typeof CARBONATION)[number], string> = { still: 'Still', sparkling: 'Sparkling' };
