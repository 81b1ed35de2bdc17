/**
 * Name and source of every computation, for the Calculators page footnotes.
 */
import type { AbvFormula } from './abv';
import type { CAUTIONS } from './cautions';

/** How firmly a computation is grounded. */
export type SourceBasis = 'published formula' | 'published table' | 'standard' | 'regulation' | 'definition' | 'common practice';

/** Footnote metadata for one computation. */
export interface FormulaSource {
  /** Short name of the formula or rule. */
  name: string;
  /** Where it comes from, as a reader could look it up. */
  source: string;
  /** How firmly it is grounded. */
  basis: SourceBasis;
  /** Keys of CAUTIONS the interface should show beside it. */
  cautions: readonly (keyof typeof CAUTIONS)[];
}

const NBS_SUCROSE =
  'Cubic fit to the sucrose table of NBS Circular C440 (Bates et al., Polarimetry, Saccharimetry and the Sugars, 1942), as given in the Wikipedia article "Brix"';
const ASBC_PLATO = 'Widely published cubic fit to the ASBC extract (°Plato) tables';
const TANAKA =
  'Tanaka, Girard, Davis, Peuto & Bignell, "Recommended table for the density of water between 0 °C and 40 °C", Metrologia 38 (2001) 301–309';
const NIST_UNITS = 'NIST Handbook 44, Appendix C, and NIST SP 811 (exact unit definitions)';
const ZOECKLEIN = 'Zoecklein, Fugelsang, Gump & Nury, Wine Analysis and Production (1995)';
const BALLING =
  'C. J. N. Balling, Die Gärungschemie (Prague, 1854), as reviewed by Cutaia, Reid & Speers, J. Inst. Brew. 115 (2009) 318–327; °Plato by the ASBC-table fit; ethanol 789.24 kg/m³ at 20 °C (OIML R 22)';
const HALL = 'First published by M. Hall, Zymurgy (1995); reprinted in R. Daniels, Designing Great Beers (1996)';
const HONEY_35 = `${NBS_SUCROSE}; honey at 35 gravity points per pound per US gallon (mead makers' figure), scaled by its dry matter when its moisture is given (typical honey 17.1 % water, USDA FoodData Central)`;

/** Footnote metadata, keyed by exported function name. */
export const FORMULA_SOURCES = {
  abvSimple: {
    name: 'Linear ABV: (OG − FG) × 131.25 (understates strong musts)',
    source: 'Common linear approximation used throughout home brewing and winemaking',
    basis: 'common practice',
    cautions: ['estimate'],
  },
  abvHighGravity: {
    name: 'High-gravity fit: 76.08 (OG − FG) / (1.775 − OG) × FG / 0.794 (overstates strong musts)',
    source: HALL,
    basis: 'published formula',
    cautions: ['estimate'],
  },
  abvBalling: {
    name: 'Balling ABV: real extract 0.1808 OE + 0.8192 AE; ABW = (OE − RE) / (2.0665 − 0.010665 OE); ABV = ABW × FG / 0.7907',
    source: BALLING,
    basis: 'published formula',
    cautions: ['estimate'],
  },
  abvBy: {
    name: 'ABV by the chosen formula (Balling unless another is named)',
    source: `${BALLING}; or the linear formula, or the high-gravity fit (${HALL})`,
    basis: 'published formula',
    cautions: ['estimate'],
  },
  apparentAttenuation: {
    name: 'Apparent attenuation: (OG − FG) / (OG − 1)',
    source: 'Standard brewing definition',
    basis: 'definition',
    cautions: ['estimate'],
  },
  potentialAbv: {
    name: 'Potential alcohol: ABV if fermented to 1.000 (Balling relations)',
    source: `${BALLING}; FG 1.000 by the usual potential-alcohol convention`,
    basis: 'published formula',
    cautions: ['estimate'],
  },
  sgToBrix: { name: 'Specific gravity to °Brix', source: NBS_SUCROSE, basis: 'published table', cautions: [] },
  brixToSg: { name: '°Brix to specific gravity', source: NBS_SUCROSE, basis: 'published table', cautions: [] },
  sgToPlato: { name: 'Specific gravity to °Plato', source: ASBC_PLATO, basis: 'published table', cautions: [] },
  platoToSg: { name: '°Plato to specific gravity', source: ASBC_PLATO, basis: 'published table', cautions: [] },
  correctGravity: {
    name: 'Hydrometer temperature correction by the density of water',
    source: TANAKA,
    basis: 'published formula',
    cautions: [],
  },
  gravityPoints: {
    name: 'Gravity points: (SG − 1) × 1000',
    source: 'Trade shorthand',
    basis: 'definition',
    cautions: [],
  },
  waterDensity: {
    name: 'Density of water, 0–40 °C',
    source: TANAKA,
    basis: 'published formula',
    cautions: [],
  },
  fermentableForGravity: {
    name: 'Honey or sugar for a target gravity (sucrose table; honey at 35 points per lb per US gal)',
    source: HONEY_35,
    basis: 'common practice',
    cautions: ['estimate'],
  },
  gravityFromFermentable: {
    name: 'Gravity reached by a honey or sugar addition (honey at 35 points per lb per US gal)',
    source: HONEY_35,
    basis: 'common practice',
    cautions: ['estimate'],
  },
  sugarPerLitre: {
    name: 'Dissolved sugar per litre: °Brix/100 × SG × density of water at 20 °C',
    source: NBS_SUCROSE,
    basis: 'published table',
    cautions: ['estimate'],
  },
  fgAtAbv: {
    name: 'Gravity at which a must reaches a given ABV (Balling relations solved for FG)',
    source: BALLING,
    basis: 'published formula',
    cautions: ['estimate'],
  },
  predictFinish: {
    name: 'Predicted finish: yeast stops at its tolerance or when the sugar runs out',
    source: `Balling relations solved for FG (${BALLING}); dry finish 0.996 by common practice`,
    basis: 'common practice',
    cautions: ['estimate', 'bottlePressure'],
  },
  sweetnessOf: {
    name: 'Sweetness by final gravity: dry < 1.010 ≤ semi-sweet < 1.025 ≤ sweet',
    source: 'Gravity bands widely quoted as BJCP mead guidance (the 2015 guidelines judge sweetness by taste)',
    basis: 'common practice',
    cautions: [],
  },
  strengthOf: {
    name: 'Strength: hydromel < 7.5 % ≤ standard < 14 % ≤ sack',
    source: 'BJCP 2015 Mead Style Guidelines, Introduction ("Strength")',
    basis: 'published table',
    cautions: [],
  },
  fermentationState: {
    name: 'Fermentation state: steady three days and dry (to 1.004), or within 1 % ABV of the yeast’s tolerance by the lower of the linear and Balling figures; otherwise stuck',
    source: 'Cellar rule of a steady gravity over three days; alcohol by the linear formula and the Balling relations',
    basis: 'common practice',
    cautions: ['estimate', 'bottlePressure'],
  },
  metabisulfiteGrams: {
    name: 'Potassium metabisulfite for molecular SO₂: free = molecular × (1 + 10^(pH − 1.81)); KMS 57.6 % SO₂',
    source: `${ZOECKLEIN}; SO₂ share of K₂S₂O₅ from IUPAC standard atomic weights`,
    basis: 'published formula',
    cautions: ['sulfites', 'estimate'],
  },
  freeSo2Needed: {
    name: 'Free SO₂ for a molecular SO₂ target: molecular × (1 + 10^(pH − 1.81))',
    source: ZOECKLEIN,
    basis: 'published formula',
    cautions: ['sulfites'],
  },
  sorbicAcidMgPerL: {
    name: 'Sorbic acid by ABV: 150 mg/L at 10 % to 50 mg/L at 14 %, at most 200 mg/L',
    source: 'Widely reproduced winemaking table; 200 mg/L ceiling is the EU limit for wine',
    basis: 'common practice',
    cautions: ['sorbate'],
  },
  sorbateGrams: {
    name: 'Potassium sorbate by ABV (sorbic acid 150 mg/L at 10 % down to 50 mg/L at 14 %)',
    source: 'Widely reproduced winemaking table; sorbic-acid share of potassium sorbate from IUPAC atomic weights',
    basis: 'common practice',
    cautions: ['sorbate', 'bottlePressure', 'estimate'],
  },
  headspace: {
    name: 'Headspace: capacity − volume',
    source: 'Definition',
    basis: 'definition',
    cautions: ['glass'],
  },
  rackingLoss: {
    name: 'Racking loss: 0.03 L plus 4 % (primary), 2.5 % (secondary) or 1 % (later rackings) of the volume',
    source: 'Makers’ figures: about half a cup from a one-gallon batch, a couple of cups from five gallons',
    basis: 'common practice',
    cautions: ['glass'],
  },
  bestVesselForRacking: {
    name: 'Smallest free vessel holding the volume after the expected loss',
    source: 'Rule of thumb: least headspace, least oxygen',
    basis: 'common practice',
    cautions: ['glass'],
  },
  bottlesFrom: {
    name: 'Full bottles from a volume after losses',
    source: 'Definition',
    basis: 'definition',
    cautions: ['bottlePressure'],
  },
  casesFrom: { name: 'Full cases and loose bottles', source: 'Definition', basis: 'definition', cautions: [] },
  litresFrom: { name: 'Volume to litres', source: NIST_UNITS, basis: 'standard', cautions: [] },
  litresTo: { name: 'Litres to other volume units', source: NIST_UNITS, basis: 'standard', cautions: [] },
  kilogramsFrom: { name: 'Mass to kilograms', source: NIST_UNITS, basis: 'standard', cautions: [] },
  kilogramsTo: { name: 'Kilograms to other mass units', source: NIST_UNITS, basis: 'standard', cautions: [] },
  celsiusFrom: { name: '°F to °C: (t − 32) / 1.8', source: NIST_UNITS, basis: 'standard', cautions: [] },
  fahrenheitFrom: { name: '°C to °F: 1.8 t + 32', source: NIST_UNITS, basis: 'standard', cautions: [] },
  daysBetween: { name: 'Whole days between two dates', source: 'Definition', basis: 'definition', cautions: [] },
  addMonths: {
    name: 'Calendar months later',
    source: 'Calendar months, end-of-month days falling back to the month’s last day',
    basis: 'definition',
    cautions: [],
  },
  ageMilestones: {
    name: 'Ageing milestones at 3, 6 and 12 calendar months',
    source: 'Calendar months, end-of-month days falling back to the month’s last day',
    basis: 'definition',
    cautions: [],
  },
  annualVolumeUsage: {
    name: 'Yearly volume made against a limit',
    source: 'Limit set by the cellar; US federal reference 27 CFR 24.75(b): 100 gal (one adult) / 200 gal (two or more) per calendar year',
    basis: 'regulation',
    cautions: ['legalLimits'],
  },
  spiceCaution: {
    name: 'Caution for cinnamon, clove and allspice added in primary',
    source: 'Makers add strongly antimicrobial spices in secondary',
    basis: 'common practice',
    cautions: ['spiceInPrimary'],
  },
} as const satisfies Record<string, FormulaSource>;

/** Names of the computations that have footnote metadata. */
export type FormulaKey = keyof typeof FORMULA_SOURCES;

/** The footnote of each ABV formula, to name the source beside a figure. */
export const ABV_FORMULA_KEYS: Readonly<Record<AbvFormula, FormulaKey>> = {
  balling: 'abvBalling',
  simple: 'abvSimple',
  'high-gravity': 'abvHighGravity',
};
