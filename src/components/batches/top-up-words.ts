import type { TopUpLiquid } from '@shared/schemas/journal';

/** Our words for what a vessel was topped up with. */
export const TOP_UP_LIQUID_WORDS: Record<TopUpLiquid['kind'], string> = {
  water: 'Water',
  'sugar-water': 'Sugar-water',
  'honey-water': 'Honey-water',
  'same-batch': 'More of this batch',
  'other-wine': 'Another wine or mead',
};

/** "Honey-water at 1.120", "Another wine or mead at 0.996, 12.5 % ABV", "Water". */
export function liquidWords(liquid: TopUpLiquid, gravity: (sg: number) => string): string {
  const facts = [liquid.sg !== null ? `at ${gravity(liquid.sg)}` : '', liquid.abv !== null ? `${liquid.abv} % ABV` : ''].filter(Boolean);
  return [TOP_UP_LIQUID_WORDS[liquid.kind], facts.join(', ')].filter(Boolean).join(' ');
}
