import { describe, it, expect } from 'vitest';
import * as calc from '../../shared/calc';
import { CalcInputError, FORMULA_SOURCES, CAUTIONS } from '../../shared/calc';

// The names later work depends on (from the task brief); each must be exported as a function.
const REQUIRED_FUNCTIONS = [
  'abvSimple',
  'abvHighGravity',
  'abvBalling',
  'abvBy',
  'fgAtAbv',
  'gravityFromFermentable',
  'sugarPerLitre',
  'gravityPoints',
  'waterDensity',
  'freeSo2Needed',
  'sorbicAcidMgPerL',
  'addMonths',
  'spiceCaution',
  'isAntimicrobialSpice',
  'tidyNumber',
  'apparentAttenuation',
  'sgToPlato',
  'platoToSg',
  'sgToBrix',
  'brixToSg',
  'correctGravity',
  'fermentableForGravity',
  'potentialAbv',
  'predictFinish',
  'sweetnessOf',
  'strengthOf',
  'fermentationState',
  'metabisulfiteGrams',
  'sorbateGrams',
  'headspace',
  'rackingLoss',
  'bestVesselForRacking',
  'bottlesFrom',
  'casesFrom',
  'litresFrom',
  'litresTo',
  'celsiusFrom',
  'fahrenheitFrom',
  'kilogramsFrom',
  'kilogramsTo',
  'daysBetween',
  'ageMilestones',
  'annualVolumeUsage',
  'formatVolume',
  'formatTemperature',
  'formatMass',
] as const;

// Presentation helpers need no formula footnote.
const NO_FOOTNOTE = new Set(['formatVolume', 'formatTemperature', 'formatMass', 'tidyNumber', 'isAntimicrobialSpice']);

describe('the library’s public face', () => {
  it.each(REQUIRED_FUNCTIONS)('exports %s as a function', (name) => {
    expect(typeof (calc as Record<string, unknown>)[name]).toBe('function');
  });

  it('exports CalcInputError as an Error with a field', () => {
    const e = new CalcInputError('og', 'Original gravity must be a number (got NaN).');
    expect(e).toBeInstanceOf(Error);
    expect(e.field).toBe('og');
  });

  it.each(REQUIRED_FUNCTIONS.filter((n) => !NO_FOOTNOTE.has(n)))('has a formula footnote for %s', (name) => {
    const entry = (FORMULA_SOURCES as Record<string, { name: string; source: string; basis: string; cautions: readonly string[] }>)[name];
    expect(entry, `FORMULA_SOURCES.${name}`).toBeDefined();
    expect(entry.name.length).toBeGreaterThan(5);
    expect(entry.source.length).toBeGreaterThan(5);
    expect(['published formula', 'published table', 'standard', 'regulation', 'definition', 'common practice']).toContain(entry.basis);
    for (const key of entry.cautions) expect(Object.keys(CAUTIONS)).toContain(key);
  });

  it('has footnotes only for functions that exist', () => {
    for (const key of Object.keys(FORMULA_SOURCES)) {
      expect(typeof (calc as Record<string, unknown>)[key], key).toBe('function');
    }
  });

  it('attaches to each computation the cautions it calls for', () => {
    const cautionsOf = Object.fromEntries(Object.entries(FORMULA_SOURCES).map(([k, v]) => [k, [...v.cautions]]));
    expect(cautionsOf).toEqual({
      abvSimple: ['estimate'],
      abvHighGravity: ['estimate'],
      abvBalling: ['estimate'],
      abvBy: ['estimate'],
      apparentAttenuation: ['estimate'],
      potentialAbv: ['estimate'],
      sgToBrix: [],
      brixToSg: [],
      sgToPlato: [],
      platoToSg: [],
      correctGravity: [],
      gravityPoints: [],
      waterDensity: [],
      fermentableForGravity: ['estimate'],
      gravityFromFermentable: ['estimate'],
      sugarPerLitre: ['estimate'],
      fgAtAbv: ['estimate'],
      predictFinish: ['estimate', 'bottlePressure'],
      sweetnessOf: [],
      strengthOf: [],
      fermentationState: ['estimate', 'bottlePressure'],
      metabisulfiteGrams: ['sulfites', 'estimate'],
      freeSo2Needed: ['sulfites'],
      sorbicAcidMgPerL: ['sorbate'],
      sorbateGrams: ['sorbate', 'bottlePressure', 'estimate'],
      headspace: ['glass'],
      rackingLoss: ['glass'],
      bestVesselForRacking: ['glass'],
      bottlesFrom: ['bottlePressure'],
      casesFrom: [],
      litresFrom: [],
      litresTo: [],
      kilogramsFrom: [],
      kilogramsTo: [],
      celsiusFrom: [],
      fahrenheitFrom: [],
      daysBetween: [],
      addMonths: [],
      ageMilestones: [],
      annualVolumeUsage: ['legalLimits'],
      spiceCaution: ['spiceInPrimary'],
    });
  });

  it('names the sources the issue of record fixed: 27 CFR 24.75(b), the 1995 high-gravity fit, the Balling relations', () => {
    expect(FORMULA_SOURCES.annualVolumeUsage.source).toContain('27 CFR 24.75(b)');
    expect(FORMULA_SOURCES.abvHighGravity.source).toMatch(/Hall, Zymurgy \(1995\)/);
    expect(FORMULA_SOURCES.abvBalling.source).toMatch(/Balling.*1854/);
    expect(FORMULA_SOURCES.predictFinish.source).toMatch(/Balling/);
    expect(FORMULA_SOURCES.fermentableForGravity.name).toMatch(/35 points/);
    expect(FORMULA_SOURCES.rackingLoss.name).toMatch(/0\.03 L/);
  });

  it('has caution texts that defer to local rules where the law is involved', () => {
    for (const text of Object.values(CAUTIONS)) expect(text.length).toBeGreaterThan(40);
    expect(calc.CAUTION_SULFITES).toMatch(/sulfites/i);
    expect(calc.CAUTION_BOTTLE_PRESSURE).toMatch(/burst/i);
    expect(calc.CAUTION_ESTIMATE).toMatch(/estimate/i);
    expect(calc.CAUTION_LEGAL_LIMITS).toMatch(/where you live/i);
    expect(calc.CAUTION_SORBATE).toMatch(/sulfite/i);
    expect(calc.CAUTION_GLASS).toMatch(/neck/i);
    expect(calc.CAUTION_SANITISER).toMatch(/dilution/i);
    expect(calc.CAUTION_SPICE_IN_PRIMARY).toMatch(/secondary/i);
    expect(Object.keys(CAUTIONS)).toEqual([
      'estimate',
      'sulfites',
      'sorbate',
      'bottlePressure',
      'legalLimits',
      'glass',
      'sanitiser',
      'spiceInPrimary',
    ]);
  });
});

// Every numeric argument of every calculation, fed NaN, ±Infinity or a string,
// must throw CalcInputError naming that argument — never return NaN or Infinity.
// An optional field of an options object treats null like "not given" (a form's
// empty field arrives as null), so null is only a bad value for required ones.
type Call = [name: string, field: string, run: (bad: unknown) => unknown, optional?: 'optional'];
const b = (x: unknown) => x as number;
const CALLS: Call[] = [
  ['abvSimple', 'og', (x) => calc.abvSimple(b(x), 1.0)],
  ['abvSimple', 'fg', (x) => calc.abvSimple(1.1, b(x))],
  ['abvHighGravity', 'og', (x) => calc.abvHighGravity(b(x), 1.0)],
  ['abvHighGravity', 'fg', (x) => calc.abvHighGravity(1.1, b(x))],
  ['abvBalling', 'og', (x) => calc.abvBalling(b(x), 1.0)],
  ['abvBalling', 'fg', (x) => calc.abvBalling(1.1, b(x))],
  ['abvBy', 'og', (x) => calc.abvBy(b(x), 1.0)],
  ['abvBy', 'fg', (x) => calc.abvBy(1.1, b(x), 'simple')],
  ['fgAtAbv', 'og', (x) => calc.fgAtAbv(b(x), 10)],
  ['fgAtAbv', 'abv', (x) => calc.fgAtAbv(1.1, b(x))],
  ['gravityPoints', 'sg', (x) => calc.gravityPoints(b(x))],
  ['waterDensity', 'celsius', (x) => calc.waterDensity(b(x))],
  ['sugarPerLitre', 'sg', (x) => calc.sugarPerLitre(b(x))],
  ['gravityFromFermentable', 'volumeL', (x) => calc.gravityFromFermentable({ volumeL: b(x), kg: 1, source: 'honey' })],
  ['gravityFromFermentable', 'kg', (x) => calc.gravityFromFermentable({ volumeL: 10, kg: b(x), source: 'honey' })],
  ['gravityFromFermentable', 'startOg', (x) => calc.gravityFromFermentable({ volumeL: 10, kg: 1, startOg: b(x), source: 'honey' }), 'optional'],
  [
    'gravityFromFermentable',
    'honeyMoisturePercent',
    (x) => calc.gravityFromFermentable({ volumeL: 10, kg: 1, source: 'honey', honeyMoisturePercent: b(x) }),
    'optional',
  ],
  [
    'fermentableForGravity',
    'honeyMoisturePercent',
    (x) => calc.fermentableForGravity({ volumeL: 5, targetOg: 1.1, source: 'honey', honeyMoisturePercent: b(x) }),
    'optional',
  ],
  ['predictFinish', 'dryFg', (x) => calc.predictFinish({ og: 1.1, toleranceAbv: 14, dryFg: b(x) }), 'optional'],
  ['fermentationState', 'toleranceAbv', (x) => calc.fermentationState({ og: 1.1, toleranceAbv: b(x), readings: [], now: new Date() })],
  ['freeSo2Needed', 'pH', (x) => calc.freeSo2Needed(b(x))],
  ['sorbicAcidMgPerL', 'abv', (x) => calc.sorbicAcidMgPerL(b(x))],
  ['addMonths', 'months', (x) => calc.addMonths('2024-01-01', b(x))],
  ['ageMilestones', 'months[0]', (x) => calc.ageMilestones('2024-01-01', '2024-02-01', [b(x)])],
  ['tidyNumber', 'value', (x) => calc.tidyNumber(b(x))],
  ['apparentAttenuation', 'og', (x) => calc.apparentAttenuation(b(x), 1.0)],
  ['apparentAttenuation', 'fg', (x) => calc.apparentAttenuation(1.1, b(x))],
  ['potentialAbv', 'og', (x) => calc.potentialAbv(b(x))],
  ['sgToPlato', 'sg', (x) => calc.sgToPlato(b(x))],
  ['platoToSg', 'plato', (x) => calc.platoToSg(b(x))],
  ['sgToBrix', 'sg', (x) => calc.sgToBrix(b(x))],
  ['brixToSg', 'brix', (x) => calc.brixToSg(b(x))],
  ['correctGravity', 'reading', (x) => calc.correctGravity(b(x), 20)],
  ['correctGravity', 'sampleC', (x) => calc.correctGravity(1.05, b(x))],
  ['correctGravity', 'calibrationC', (x) => calc.correctGravity(1.05, 20, b(x))],
  ['fermentableForGravity', 'volumeL', (x) => calc.fermentableForGravity({ volumeL: b(x), targetOg: 1.1, source: 'honey' })],
  ['fermentableForGravity', 'targetOg', (x) => calc.fermentableForGravity({ volumeL: 5, targetOg: b(x), source: 'honey' })],
  ['fermentableForGravity', 'startOg', (x) => calc.fermentableForGravity({ volumeL: 5, targetOg: 1.1, startOg: b(x), source: 'honey' }), 'optional'],
  ['predictFinish', 'og', (x) => calc.predictFinish({ og: b(x), toleranceAbv: 14 })],
  ['predictFinish', 'toleranceAbv', (x) => calc.predictFinish({ og: 1.1, toleranceAbv: b(x) })],
  ['sweetnessOf', 'fg', (x) => calc.sweetnessOf(b(x))],
  ['strengthOf', 'abv', (x) => calc.strengthOf(b(x))],
  ['fermentationState', 'og', (x) => calc.fermentationState({ og: b(x), toleranceAbv: 14, readings: [], now: new Date() })],
  [
    'fermentationState',
    'readings[0].sg',
    (x) => calc.fermentationState({ og: 1.1, toleranceAbv: 14, readings: [{ at: new Date(0), sg: b(x) }], now: new Date() }),
  ],
  ['metabisulfiteGrams', 'volumeL', (x) => calc.metabisulfiteGrams({ volumeL: b(x), pH: 3.4 })],
  ['metabisulfiteGrams', 'pH', (x) => calc.metabisulfiteGrams({ volumeL: 10, pH: b(x) })],
  ['metabisulfiteGrams', 'molecularSo2', (x) => calc.metabisulfiteGrams({ volumeL: 10, pH: 3.4, molecularSo2: b(x) }), 'optional'],
  ['metabisulfiteGrams', 'freeSo2Now', (x) => calc.metabisulfiteGrams({ volumeL: 10, pH: 3.4, freeSo2Now: b(x) }), 'optional'],
  ['sorbateGrams', 'volumeL', (x) => calc.sorbateGrams({ volumeL: b(x), abv: 12 })],
  ['sorbateGrams', 'abv', (x) => calc.sorbateGrams({ volumeL: 10, abv: b(x) })],
  ['headspace', 'capacityL', (x) => calc.headspace({ capacityL: b(x), volumeL: 1 })],
  ['headspace', 'volumeL', (x) => calc.headspace({ capacityL: 23, volumeL: b(x) })],
  ['rackingLoss', 'volumeL', (x) => calc.rackingLoss({ volumeL: b(x) })],
  ['rackingLoss', 'lossFraction', (x) => calc.rackingLoss({ volumeL: 10, lossFraction: b(x) }), 'optional'],
  ['bestVesselForRacking', 'volumeL', (x) => calc.bestVesselForRacking({ volumeL: b(x), candidates: [] })],
  ['bestVesselForRacking', 'lossL', (x) => calc.bestVesselForRacking({ volumeL: 10, candidates: [], lossL: b(x) }), 'optional'],
  ['bottlesFrom', 'volumeL', (x) => calc.bottlesFrom({ volumeL: b(x), bottleMl: 750 })],
  ['bottlesFrom', 'bottleMl', (x) => calc.bottlesFrom({ volumeL: 10, bottleMl: b(x) })],
  ['bottlesFrom', 'lossL', (x) => calc.bottlesFrom({ volumeL: 10, bottleMl: 750, lossL: b(x) }), 'optional'],
  ['casesFrom', 'bottles', (x) => calc.casesFrom(b(x))],
  ['casesFrom', 'perCase', (x) => calc.casesFrom(10, b(x))],
  ['litresFrom', 'value', (x) => calc.litresFrom(b(x), 'L')],
  ['litresTo', 'litres', (x) => calc.litresTo(b(x), 'L')],
  ['kilogramsFrom', 'value', (x) => calc.kilogramsFrom(b(x), 'kg')],
  ['kilogramsTo', 'kilograms', (x) => calc.kilogramsTo(b(x), 'kg')],
  ['celsiusFrom', 'value', (x) => calc.celsiusFrom(b(x))],
  ['fahrenheitFrom', 'celsius', (x) => calc.fahrenheitFrom(b(x))],
  ['annualVolumeUsage', 'limitL', (x) => calc.annualVolumeUsage({ volumesL: [], limitL: b(x) })],
  ['annualVolumeUsage', 'volumesL[0]', (x) => calc.annualVolumeUsage({ volumesL: [b(x)], limitL: 100 })],
  ['formatVolume', 'litres', (x) => calc.formatVolume(b(x), 'metric')],
  ['formatTemperature', 'celsius', (x) => calc.formatTemperature(b(x), 'metric')],
  ['formatMass', 'kilograms', (x) => calc.formatMass(b(x), 'us')],
];

const BAD: [string, unknown][] = [
  ['NaN', Number.NaN],
  ['Infinity', Number.POSITIVE_INFINITY],
  ['-Infinity', Number.NEGATIVE_INFINITY],
  ['a string', '1.05'],
  ['nothing', null],
];

describe('never a silent NaN or Infinity', () => {
  const rows = CALLS.flatMap(([name, field, run, optional]) =>
    BAD.filter(([label]) => !(optional && label === 'nothing')).map(([label, value]) => [name, field, label, run, value] as const),
  );
  it.each(rows)('%s rejects %s = %s', (_name, field, _label, run, value) => {
    let caught: unknown;
    try {
      run(value);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(CalcInputError);
    expect((caught as CalcInputError).field).toBe(field);
  });
});

describe('optional fields', () => {
  it('treat null as not given, using the documented default', () => {
    const n = null as unknown as undefined;
    // Honey for 10 L at 1.100 from water, by the 35-point rule (common practice): 100/35 lb per
    // US gal = 0.34237 kg/L, so 3.42 kg; the sucrose table bends it by under 2 %.
    const honey = calc.fermentableForGravity({ volumeL: 10, targetOg: 1.1, startOg: n, source: 'honey' });
    expect(Math.abs(honey - 3.4237) / 3.4237).toBeLessThan(0.02);
    // 0.8 × (1 + 10^(3.4 − 1.81)) = 31.924 mg/L over 10 L, ÷ 0.5763 SO₂ in KMS: 0.5539 g.
    expect(calc.metabisulfiteGrams({ volumeL: 10, pH: 3.4, molecularSo2: n, freeSo2Now: n })).toBeCloseTo(0.5539, 3);
    expect(calc.bottlesFrom({ volumeL: 10, bottleMl: 750, lossL: n })).toEqual({ bottles: 13, remainderMl: 250 });
    expect(calc.rackingLoss({ volumeL: 10, lossFraction: n })).toBeCloseTo(0.28, 12); // 0.03 + 10 × 0.025
    // 1 kg of honey made up to 10 L: 35 × 2.2046 lb / 2.6417 US gal = 29.2 points.
    const sg = calc.gravityFromFermentable({ volumeL: 10, kg: 1, source: 'honey', honeyMoisturePercent: n });
    expect(Math.abs(sg - 1.0292)).toBeLessThan(0.0003);
    expect(calc.predictFinish({ og: 1.05, toleranceAbv: 18, dryFg: n }).fg).toBe(0.996);
  });
});

// Finite input can still overflow a double (1e308 gallons in litres); each such call must
// throw CalcInputError naming the argument that made the figure too large, never answer
// Infinity, NaN or "NaN".
const HUGE: [name: string, field: string, run: () => unknown][] = [
  ['litresFrom', 'value', () => calc.litresFrom(1e308, 'US gal')],
  ['litresTo', 'litres', () => calc.litresTo(1e308, 'mL')],
  ['kilogramsTo', 'kilograms', () => calc.kilogramsTo(1e308, 'g')],
  ['fahrenheitFrom', 'celsius', () => calc.fahrenheitFrom(1e308)],
  ['formatTemperature', 'celsius', () => calc.formatTemperature(1e308, 'us')],
  ['formatMass', 'kilograms', () => calc.formatMass(1e308, 'us')],
  ['metabisulfiteGrams', 'volumeL', () => calc.metabisulfiteGrams({ volumeL: 1e308, pH: 3.4 })],
  ['sorbateGrams', 'volumeL', () => calc.sorbateGrams({ volumeL: 1e308, abv: 12 })],
  ['bottlesFrom', 'volumeL', () => calc.bottlesFrom({ volumeL: 1e308, bottleMl: 750 })],
  ['annualVolumeUsage', 'volumesL', () => calc.annualVolumeUsage({ volumesL: [1e308, 1e308], limitL: 100 })],
  ['annualVolumeUsage', 'limitL', () => calc.annualVolumeUsage({ volumesL: [1e10], limitL: 1e-300 })],
  ['addMonths', 'months', () => calc.addMonths('+275759-06-15', 12_000)],
  ['ageMilestones', 'months[1]', () => calc.ageMilestones('+275759-06-15', '2024-01-01', [3, 24])],
  ['tidyNumber', 'value', () => calc.tidyNumber(Number.NaN)],
];

describe('never Infinity from finite but huge input', () => {
  it.each(HUGE)('%s names %s', (_name, field, run) => {
    let caught: unknown;
    try {
      run();
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(CalcInputError);
    expect((caught as CalcInputError).field).toBe(field);
  });

  it('says in plain words what was too large', () => {
    expect(() => calc.litresFrom(1e308, 'US gal')).toThrow('Volume is too large to work with.');
    expect(() => calc.kilogramsTo(1e308, 'g')).toThrow('Mass is too large to work with.');
    expect(() => calc.fahrenheitFrom(1e308)).toThrow('Temperature is too large to work with.');
    expect(() => calc.annualVolumeUsage({ volumesL: [1e308, 1e308], limitL: 100 })).toThrow('Total volume is too large to work with.');
    expect(() => calc.annualVolumeUsage({ volumesL: [1e10], limitL: 1e-300 })).toThrow('Yearly limit (1e-300 L) is too small to measure a share of.');
    expect(() => calc.addMonths('+275759-06-15', 18)).toThrow('18 months after +275759-06-15 is past the last date that can be kept (year 275760).');
  });

  it('still works right up to the edge', () => {
    expect(calc.litresFrom(1e307, 'L')).toBe(1e307);
    expect(calc.addMonths('+275759-06-15', 12).toISOString()).toBe('+275760-06-15T00:00:00.000Z');
    expect(calc.formatMass(1e307, 'us')).toBe('2.2046226218487757e+307 lb');
    expect(calc.annualVolumeUsage({ volumesL: [1e307], limitL: 1e300 }).percentUsed).toBeCloseTo(1e9, -3);
  });
});
