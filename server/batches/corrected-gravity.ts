import { correctGravity } from '../../shared/calc';
import { calc } from '../core/calc-guard';

/**
 * The gravity corrected to the hydrometer's calibration temperature (shared/calc), or the
 * reading itself when no sample temperature was taken.
 */
export function correctedGravity(sg: number, temperatureC: number | null, calibrationC: number): number {
  return temperatureC === null ? sg : calc(() => correctGravity(sg, temperatureC, calibrationC));
}
