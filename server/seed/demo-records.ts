import type { BatchKind, Ingredient } from '../../shared/schemas/batches';
import type { CleaningState, VesselKind } from '../../shared/schemas/vessels';

/**
 * The demo cellar's things: invented vessels and batches of the Fernhollow household.
 * Days are counted back from the moment of seeding, so the demo always looks current.
 */
export interface DemoVessel {
  key: string;
  name: string;
  kind: VesselKind;
  material: string;
  capacityL: number;
  /** Left in this state when empty; `sanitisedDaysAgo` dates a sanitising. */
  cleaning: CleaningState;
  sanitisedDaysAgo?: number;
  retired?: boolean;
  /** rack key, shelf number, slot */
  place?: [string, number, number];
}

export const DEMO_RACKS = [
  { key: 'pantry', name: 'Pantry rack', description: 'Steel shelving by the north wall', shelves: [4, 4, 4] },
  { key: 'stair', name: 'Under-stair shelf', description: 'Dark and steady, 14 °C', shelves: [5, 5] },
];

export const DEMO_VESSELS: DemoVessel[] = [
  { key: 'f1', name: 'Fermenter 1', kind: 'bucket', material: 'plastic', capacityL: 30, cleaning: 'dirty', place: ['pantry', 3, 1] },
  { key: 'f2', name: 'Fermenter 2', kind: 'bucket', material: 'plastic', capacityL: 23, cleaning: 'dirty', place: ['pantry', 3, 2] },
  { key: 'bigGlass', name: 'Big Glass', kind: 'carboy', material: 'glass', capacityL: 23, cleaning: 'dirty', place: ['pantry', 3, 3] },
  { key: 'carboyA', name: 'Carboy A', kind: 'carboy', material: 'glass', capacityL: 19, cleaning: 'dirty', place: ['pantry', 2, 1] },
  { key: 'carboyB', name: 'Carboy B', kind: 'carboy', material: 'glass', capacityL: 11.4, cleaning: 'dirty', place: ['pantry', 2, 2] },
  { key: 'demi1', name: 'Demi 1', kind: 'demijohn', material: 'glass', capacityL: 4.5, cleaning: 'dirty', place: ['pantry', 1, 1] },
  {
    key: 'demi2',
    name: 'Demi 2',
    kind: 'demijohn',
    material: 'glass',
    capacityL: 4.5,
    cleaning: 'sanitised',
    sanitisedDaysAgo: 1,
    place: ['pantry', 1, 2],
  },
  {
    key: 'demi3',
    name: 'Demi 3',
    kind: 'demijohn',
    material: 'glass',
    capacityL: 4.5,
    cleaning: 'sanitised',
    sanitisedDaysAgo: 20,
    place: ['pantry', 1, 3],
  },
  { key: 'jug1', name: 'Jug 1', kind: 'jug', material: 'glass', capacityL: 3.8, cleaning: 'clean', place: ['pantry', 1, 4] },
  { key: 'jug2', name: 'Jug 2', kind: 'jug', material: 'glass', capacityL: 3.8, cleaning: 'sanitised', sanitisedDaysAgo: 0 },
  {
    key: 'keg1',
    name: 'Keg 1',
    kind: 'keg',
    material: 'stainless',
    capacityL: 19,
    cleaning: 'sanitised',
    sanitisedDaysAgo: 2,
    place: ['pantry', 2, 3],
  },
  { key: 'oak', name: 'Little oak', kind: 'barrel', material: 'oak', capacityL: 10, cleaning: 'dirty', retired: true, place: ['stair', 2, 5] },
];

export interface DemoReading {
  day: number;
  sg: number;
  temperatureC?: number;
}

export interface DemoBatch {
  key: string;
  name: string;
  kind: BatchKind;
  startedDaysAgo: number;
  og: number;
  yeast: { name: string; toleranceAbv: number };
  plannedVolumeL: number;
  ingredients: Ingredient[];
  notes: string;
  /** Vessel key and litres at the start. */
  startIn: [string, number][];
  readings: DemoReading[];
}

const water = (litres: number): Ingredient => ({ category: 'water', name: 'Spring water', amount: litres, unit: 'L' });
const nutrient: Ingredient = { category: 'nutrient', name: 'Staggered yeast nutrient', amount: 12, unit: 'g' };

export const DEMO_BATCHES: DemoBatch[] = [
  {
    key: 'hawthorn',
    name: 'Hawthorn Hollow Traditional',
    kind: 'traditional-mead',
    startedDaysAgo: 10,
    og: 1.11,
    yeast: { name: 'Dry white wine yeast', toleranceAbv: 14 },
    plannedVolumeL: 20,
    ingredients: [{ category: 'honey', name: 'Wildflower honey', amount: 7.6, unit: 'kg' }, water(14.5), nutrient],
    notes: 'Honey from the allotment hives. Nutrients in thirds, days 1–3.',
    startIn: [['f1', 20]],
    readings: [
      { day: 0, sg: 1.11, temperatureC: 19 },
      { day: 3, sg: 1.086, temperatureC: 21 },
      { day: 6, sg: 1.061, temperatureC: 20 },
      { day: 9, sg: 1.043, temperatureC: 20 },
    ],
  },
  {
    key: 'quince',
    name: 'Stubborn Quince Cyser',
    kind: 'cyser',
    startedDaysAgo: 75,
    og: 1.125,
    yeast: { name: 'Champagne yeast', toleranceAbv: 16 },
    plannedVolumeL: 19,
    ingredients: [
      { category: 'juice', name: 'Pressed apple juice', amount: 12, unit: 'L' },
      { category: 'honey', name: 'Heather honey', amount: 5.9, unit: 'kg' },
      { category: 'fruit', name: 'Quince, grated', amount: 1.5, unit: 'kg' },
    ],
    notes: 'Went quiet in week five. Warmed it to 22 °C and roused the yeast; still stuck.',
    startIn: [['f2', 19]],
    readings: [
      { day: 0, sg: 1.125 },
      { day: 7, sg: 1.09 },
      { day: 14, sg: 1.062 },
      { day: 28, sg: 1.045 },
      { day: 45, sg: 1.041 },
      { day: 60, sg: 1.04 },
      { day: 70, sg: 1.04 },
    ],
  },
  {
    key: 'linden',
    name: 'Linden Blossom Metheglin',
    kind: 'metheglin',
    startedDaysAgo: 240,
    og: 1.1,
    yeast: { name: 'Neutral wine yeast', toleranceAbv: 15 },
    plannedVolumeL: 27,
    ingredients: [
      { category: 'honey', name: 'Linden honey', amount: 9.3, unit: 'kg' },
      { category: 'spice', name: 'Dried linden blossom', amount: 45, unit: 'g' },
      water(20.5),
      nutrient,
    ],
    notes: 'Floral and dry. Split a gallon off for vanilla.',
    startIn: [['f1', 27]],
    readings: [
      { day: 0, sg: 1.1 },
      { day: 5, sg: 1.06 },
      { day: 12, sg: 1.02 },
      { day: 21, sg: 1.002 },
      { day: 30, sg: 0.998 },
      { day: 34, sg: 0.998 },
      { day: 120, sg: 0.998 },
    ],
  },
  {
    key: 'blackcurrant',
    name: 'Blackcurrant Melomel',
    kind: 'melomel',
    startedDaysAgo: 122,
    og: 1.105,
    yeast: { name: 'Red wine yeast', toleranceAbv: 15 },
    plannedVolumeL: 12,
    ingredients: [
      { category: 'honey', name: 'Clover honey', amount: 4, unit: 'kg' },
      { category: 'fruit', name: 'Blackcurrants, frozen', amount: 2, unit: 'kg' },
      water(7.5),
    ],
    notes: 'Fruit in primary. Medium-toast oak in secondary.',
    startIn: [['f2', 12]],
    readings: [
      { day: 0, sg: 1.105 },
      { day: 10, sg: 1.03 },
      { day: 30, sg: 1.004 },
      { day: 60, sg: 0.999 },
      { day: 64, sg: 0.999 },
    ],
  },
  {
    key: 'cider',
    name: 'Orchard Gate Cider',
    kind: 'cider',
    startedDaysAgo: 400,
    og: 1.055,
    yeast: { name: 'Cider yeast', toleranceAbv: 9 },
    plannedVolumeL: 23,
    ingredients: [{ category: 'juice', name: 'Mixed orchard apples, pressed', amount: 23, unit: 'L' }],
    notes: 'Bittersweets from the lane, a few Bramleys for acid.',
    startIn: [['f2', 23]],
    readings: [
      { day: 0, sg: 1.055 },
      { day: 10, sg: 1.012 },
      { day: 30, sg: 1.0 },
      { day: 40, sg: 0.999 },
      { day: 44, sg: 0.999 },
    ],
  },
];
