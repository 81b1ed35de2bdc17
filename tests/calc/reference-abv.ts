/**
 * The published alcohol relations written out for the tests, independently of shared/calc,
 * so the library's figures are checked against a reference rather than against themselves.
 */

/** °Plato from specific gravity: the widely published cubic fit to the ASBC extract tables. */
export function platoOf(sg: number): number {
  return -616.868 + 1111.14 * sg - 630.272 * sg ** 2 + 135.997 * sg ** 3;
}

// Density of water at 20 °C, 998.2067 kg/m³ (Tanaka et al., Metrologia 38 (2001) 301, table),
// and of absolute ethanol at 20 °C, 789.24 kg/m³ (OIML R 22 alcoholometric tables, from memory).
const WATER_20C = 998.2067;
const ETHANOL_20C = 789.24;

/**
 * % ABV by the Balling relations (C. J. N. Balling, Die Gärungschemie, 1854): real extract
 * RE = 0.1808·OE + 0.8192·AE; 2.0665 g of extract make 1 g of alcohol, so
 * ABW = (OE − RE) / (2.0665 − 1.0665·OE/100); ABV = ABW × (FG × ρwater) / ρethanol.
 */
export function ballingReferenceAbv(og: number, fg: number): number {
  const oe = platoOf(og);
  const ae = platoOf(fg);
  const re = 0.1808 * oe + 0.8192 * ae;
  const abw = (oe - re) / (2.0665 - (1.0665 * oe) / 100);
  return (abw * fg * WATER_20C) / ETHANOL_20C;
}

/** % ABV by the common linear formula, (OG − FG) × 131.25. */
export function linearReferenceAbv(og: number, fg: number): number {
  return (og - fg) * 131.25;
}

/**
 * The gravity at which a must of `og` has made `abv` % by the Balling relations, found by
 * halving the interval 0.980–OG in the test itself.
 */
export function ballingReferenceFg(og: number, abv: number): number {
  let lo = 0.98;
  let hi = og;
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (ballingReferenceAbv(og, mid) > abv) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * The highest gravity at which a must of `og` has made at least `abv` % by both the linear
 * formula and the Balling relations (the conservative reading of "alcohol made so far").
 */
export function conservativeReferenceFg(og: number, abv: number): number {
  return Math.min(og - abv / 131.25, ballingReferenceFg(og, abv));
}
