import type { FermentationState, Strength, Sweetness } from '@shared/calc';

/** Our words, a one-line meaning and a colour for each fermentation state. */
export const FERMENTATION_WORDS: Record<FermentationState, { label: string; meaning: string; colour: string; icon: string }> = {
  active: { label: 'Active', meaning: 'Still fermenting well, or too few readings to judge.', colour: 'info', icon: 'bubble_chart' },
  slowing: { label: 'Slowing', meaning: 'Still dropping, but slowly. Keep taking readings.', colour: 'secondary', icon: 'trending_down' },
  finished: { label: 'Finished', meaning: 'Steady at or near the expected finish.', colour: 'positive', icon: 'check_circle' },
  stuck: {
    label: 'Stuck',
    meaning: 'Steady, but well above the expected finish while the yeast is short of its tolerance.',
    colour: 'negative',
    icon: 'report',
  },
};

export const SWEETNESS_WORDS: Record<Sweetness, string> = { dry: 'Dry', 'semi-sweet': 'Semi-sweet', sweet: 'Sweet' };
export const STRENGTH_WORDS: Record<Strength, string> = { hydromel: 'Hydromel (light)', standard: 'Standard', sack: 'Sack (strong)' };
