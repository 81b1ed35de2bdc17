/**
 * Spices that hold back yeast. Cinnamon (cinnamaldehyde), clove and allspice (eugenol) are
 * strongly antimicrobial; added while a batch is in primary they can slow or stop the
 * ferment, so makers add them in secondary (common practice).
 */
import { CAUTION_SPICE_IN_PRIMARY } from './cautions';
import { CalcInputError } from './guards';

/** Words in an addition's name that mark a strongly antimicrobial spice (singular; plurals match too). */
export const ANTIMICROBIAL_SPICES: readonly string[] = ['cinnamon', 'cassia', 'clove', 'allspice'];

/**
 * Whether an addition's name names a strongly antimicrobial spice ("Ceylon cinnamon sticks",
 * "Whole cloves"); matched as whole words, in any case.
 * @param name - the addition's name as entered
 */
export function isAntimicrobialSpice(name: string): boolean {
  const n = requireText(name, 'name', 'Name of the addition');
  const words = n.toLowerCase().match(/[a-z]+/g) ?? [];
  return words.some((word) => ANTIMICROBIAL_SPICES.some((spice) => word === spice || word === `${spice}s`));
}

/**
 * The caution to show when an addition is made: CAUTION_SPICE_IN_PRIMARY for a strongly
 * antimicrobial spice added while the batch is in primary, otherwise null.
 * @param name - the addition's name as entered
 * @param stage - the batch's stage when it is added ('primary', 'secondary', …)
 */
export function spiceCaution(name: string, stage: string): string | null {
  const s = requireText(stage, 'stage', 'Stage of the batch');
  return isAntimicrobialSpice(name) && s === 'primary' ? CAUTION_SPICE_IN_PRIMARY : null;
}

function requireText(value: unknown, field: string, label: string): string {
  if (typeof value !== 'string') throw new CalcInputError(field, `${label} must be text.`);
  return value;
}
