import { formatVolume, type UnitSystem } from '../../shared/calc';

/** Litres as people write them: at most 3 decimals, no trailing zeros. */
export const litres = (value: number): string => String(Number(value.toFixed(3)));

/** Rounds away float noise from sums of litres (the columns keep 3 decimals). */
export const roundLitres = (value: number): number => Number(value.toFixed(3));

/**
 * A volume for a message, in the units the person reads: "21.5 L" in metric (to the
 * millilitre, as the columns keep it), "5.68 US gal" or "84.5 US fl oz" in US units.
 * @param value - the volume in litres (zero or more)
 * @param units - the actor's units (`Actor.units`)
 */
export function volumeText(value: number, units: UnitSystem): string {
  return units === 'metric' ? `${litres(value)} L` : formatVolume(value, units);
}
