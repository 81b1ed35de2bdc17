/**
 * Mixing two liquids: a top-up, or a blend. Gravity points (SG − 1, in thousandths) and alcohol
 * both add up by volume, so the mix has the volume-weighted average of each — the relation the
 * Pearson square solves for (V₁ · (P₁ − P) = V₂ · (P − P₂)). Volume contraction when alcohol
 * and water mix (under 1 % at wine strengths) is ignored.
 */
import { CalcInputError, requireGravity, requirePositive, requireRange } from './guards';

/** One liquid going into a mix. */
export interface GravityPart {
  /** Litres of it. */
  volumeL: number;
  /** Its specific gravity. */
  sg: number;
}

/** One liquid going into a mix, by its strength. */
export interface AbvPart {
  volumeL: number;
  /** % alcohol by volume. */
  abv: number;
}

function partsList<T>(parts: readonly T[]): readonly T[] {
  if (!Array.isArray(parts) || parts.length === 0) throw new CalcInputError('parts', 'A mix needs at least one liquid.');
  return parts;
}

/**
 * Specific gravity of a mix: the volume-weighted average of the gravity points.
 * @param parts - each liquid's litres and specific gravity
 */
export function mixedGravity(parts: readonly GravityPart[]): number {
  let litres = 0;
  let points = 0;
  partsList(parts).forEach((p, i) => {
    const v = requirePositive(p?.volumeL, `parts[${i}].volumeL`, `Volume of liquid ${i + 1}`, ' L');
    const sg = requireGravity(p?.sg, `parts[${i}].sg`, `Gravity of liquid ${i + 1}`);
    litres += v;
    points += v * (sg - 1);
  });
  return 1 + points / litres;
}

/**
 * % ABV of a mix: the volume-weighted average of the strengths (alcohol is conserved).
 * @param parts - each liquid's litres and % ABV
 */
export function mixedAbv(parts: readonly AbvPart[]): number {
  let litres = 0;
  let alcohol = 0;
  partsList(parts).forEach((p, i) => {
    const v = requirePositive(p?.volumeL, `parts[${i}].volumeL`, `Volume of liquid ${i + 1}`, ' L');
    const abv = requireRange(p?.abv, `parts[${i}].abv`, `Strength of liquid ${i + 1}`, 0, 100, 1);
    litres += v;
    alcohol += (v * abv) / 100;
  });
  return (alcohol / litres) * 100;
}
