import { formatTemperature, formatVolume, type UnitSystem } from '@shared/calc';

/**
 * A quantity as the shared schemas write their limits: "40 °C", "0.001 L", "20 000 L" (a space
 * between thousands). The unit must end the word, so "4 Lids" is left alone. Bottle sizes stay
 * in mL: bottles are sized in mL in both systems, and the size is picked, not typed.
 */
const QUANTITY = /(-?\d{1,3}(?:[ \u202f]\d{3})+|-?\d+(?:\.\d+)?)[ \u202f]?(°C|L)(?![\p{L}\d])/gu;

/**
 * A form's message with its metric quantities in the units the person works in, so a limit
 * reads in the unit they typed ("at most 40 °C" is "at most 104 °F" in US units). Only for the
 * shared schemas' own messages: they name no vessel, so no "5 L demijohn" is rewritten.
 * @param message - the message as the schema gives it (metric)
 * @param system - the units shown to this person
 */
export function quantitiesInUnits(message: string, system: UnitSystem): string {
  if (system === 'metric') return message;
  return message.replace(QUANTITY, (whole, figure: string, unit: string) => {
    const value = Number(figure.replace(/[ \u202f]/g, ''));
    try {
      return unit === '°C' ? formatTemperature(value, system) : formatVolume(value, system);
    } catch {
      // Below absolute zero or a negative volume: say it as the schema did.
      return whole;
    }
  });
}
