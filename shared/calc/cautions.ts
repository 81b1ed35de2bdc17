/**
 * Short cautions the interface shows beside the calculations that can hurt
 * someone. Plain words; they defer to local law and licensed practice.
 */

/** Beside every alcohol, gravity and dose figure. */
export const CAUTION_ESTIMATE =
  'These figures are estimates from formulas and rules of thumb, not laboratory results. Check with your own measurements.';

/** Beside sulfite (potassium metabisulfite) doses. */
export const CAUTION_SULFITES =
  'Sulfites can cause reactions in sensitive people, including asthma attacks. Weigh doses carefully, dissolve before adding, and mark bottles "contains sulfites". Follow local labelling rules.';

/** Beside sorbate doses and back-sweetening. */
export const CAUTION_SORBATE =
  'Sorbate only stops renewed fermentation when the yeast is already settled out; use it together with sulfite, never alone, and never in a wine that is still fermenting.';

/** Beside bottling and back-sweetening. */
export const CAUTION_BOTTLE_PRESSURE =
  'Bottling before fermentation has truly finished, or sweetening without stabilising, can build pressure that bursts bottles. Confirm a steady gravity over several days first.';

/** Beside annual production totals. */
export const CAUTION_LEGAL_LIMITS =
  'Home production limits and labelling rules vary by country and region. The limit here is the one you set; check the rules where you live.';

/** Beside vessel moves and rackings with glass carboys. */
export const CAUTION_GLASS = 'Glass carboys break. Carry full ones from the bottom, never by the neck; a crack can cut badly.';

/** Sanitiser concentrates (acids, oxidisers), beside marking a vessel sanitised. */
export const CAUTION_SANITISER =
  'Sanitiser concentrates are acids or oxidisers. Follow the maker’s dilution, never mix products, and protect your eyes and skin.';

/** Beside adding a strongly antimicrobial spice (cinnamon, clove…) to a batch still in primary. */
export const CAUTION_SPICE_IN_PRIMARY =
  'Cinnamon, clove and similar spices are strongly antimicrobial: added during primary they can slow or stop the yeast. They are usually added in secondary (common practice).';

/** Every caution by key, for screens that list them. */
export const CAUTIONS = {
  estimate: CAUTION_ESTIMATE,
  sulfites: CAUTION_SULFITES,
  sorbate: CAUTION_SORBATE,
  bottlePressure: CAUTION_BOTTLE_PRESSURE,
  legalLimits: CAUTION_LEGAL_LIMITS,
  glass: CAUTION_GLASS,
  sanitiser: CAUTION_SANITISER,
  spiceInPrimary: CAUTION_SPICE_IN_PRIMARY,
} as const;
