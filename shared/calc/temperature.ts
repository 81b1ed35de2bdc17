/**
 * Hydrometer temperature correction.
 *
 * A hydrometer is graduated to read 1.000 in water at its calibration
 * temperature. A sample at another temperature is expanded or contracted, so
 * the reading is scaled by the ratio of water densities:
 *
 *   corrected = reading × ρw(calibration °C) / ρw(sample °C)
 *
 * with ρw from the CIPM formula of Tanaka, Girard, Davis, Peuto & Bignell,
 * "Recommended table for the density of water between 0 °C and 40 °C based on
 * recent experimental reports", Metrologia 38 (2001) 301–309.
 *
 * Assumes the must expands like water and ignores the glass's own expansion;
 * both effects are below a hydrometer's 0.001 resolution at cellar
 * temperatures for ordinary musts, growing for very sweet musts far from the
 * calibration temperature.
 */
import { requireGravity, requireRange } from './guards';

/** Lowest sample or calibration temperature accepted (°C); the water-density formula starts here. */
export const CORRECTION_MIN_C = 0;
/** Highest sample or calibration temperature accepted (°C); the water-density formula ends here. */
export const CORRECTION_MAX_C = 40;
/** 60 °F in °C, the older hydrometer calibration temperature. */
export const CALIBRATION_60F_C = (60 - 32) / 1.8;
/** 20 °C, the usual calibration temperature of modern hydrometers. */
export const CALIBRATION_20C = 20;

// Tanaka et al. (2001) formula constants, air-free SMOW at 101 325 Pa.
const A1 = -3.983035; // °C
const A2 = 301.797; // °C
const A3 = 522528.9; // °C²
const A4 = 69.34881; // °C
const A5 = 999.97495; // kg/m³

/**
 * Density of pure, air-free water in kg/m³ (Tanaka et al. 2001, valid 0–40 °C).
 * @param celsius - water temperature in °C (0–40)
 */
export function waterDensity(celsius: number): number {
  const t = requireRange(celsius, 'celsius', 'Water temperature', CORRECTION_MIN_C, CORRECTION_MAX_C, 0, ' °C');
  return A5 * (1 - ((t + A1) ** 2 * (t + A2)) / (A3 * (t + A4)));
}

/**
 * Corrects a hydrometer reading taken at `sampleC` to the hydrometer's calibration temperature.
 * @param reading - specific gravity read off the hydrometer
 * @param sampleC - temperature of the sample in °C (0–40)
 * @param calibrationC - the hydrometer's calibration temperature in °C (20, or 15.56 for 60 °F)
 */
export function correctGravity(reading: number, sampleC: number, calibrationC: number = CALIBRATION_20C): number {
  const r = requireGravity(reading, 'reading', 'Hydrometer reading');
  const t = requireRange(sampleC, 'sampleC', 'Sample temperature', CORRECTION_MIN_C, CORRECTION_MAX_C, 0, ' °C');
  const c = requireRange(calibrationC, 'calibrationC', 'Hydrometer calibration temperature', CORRECTION_MIN_C, CORRECTION_MAX_C, 0, ' °C');
  return (r * waterDensity(c)) / waterDensity(t);
}

/**
 * A reading as the record keeps it: corrected to the hydrometer's calibration when the sample's
 * temperature was taken, the reading itself when it was not (nothing to correct by).
 * @param sampleC - temperature of the sample in °C, or null when none was taken
 */
export function recordedGravity(reading: number, sampleC: number | null, calibrationC: number = CALIBRATION_20C): number {
  return sampleC === null ? reading : correctGravity(reading, sampleC, calibrationC);
}
