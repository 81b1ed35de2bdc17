import { describe, it, expect } from 'vitest';
import * as calc from '../../shared/calc';
import { CalcInputError, FORMULA_SOURCES, CAUTIONS } from '../../shared/calc';

// The names later work depends on (from the task brief); each must be exported as a function.
const REQUIRED_FUNCTIONS = [
  'abvSimple',
  'abvHighGravity',
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
const NO_FOOTNOTE = new Set(['formatVolume', 'formatTemperature', 'formatMass', 'tidyNumber']);

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
    expect(['published formula', 'published table', 'standard', 'regulation', 'definition', 'common practice']).toContain(
      entry.basis,
    );
    for (const key of entry.cautions) expect(Object.keys(CAUTIONS)).toContain(key);
  });

  it('has footnotes only for functions that exist', () => {
    for (const key of Object.keys(FORMULA_SOURCES)) {
      expect(typeof (calc as Record<string, unknown>)[key], key).toBe('function');
    }
  });

  it('attaches the sulfite, bottle-pressure and estimate cautions where they apply', () => {
    expect(FORMULA_SOURCES.metabisulfiteGrams.cautions).toContain('sulfites');
    expect(FORMULA_SOURCES.sorbateGrams.cautions).toContain('bottlePressure');
    expect(FORMULA_SOURCES.bottlesFrom.cautions).toContain('bottlePressure');
    expect(FORMULA_SOURCES.abvHighGravity.cautions).toContain('estimate');
    expect(FORMULA_SOURCES.annualVolumeUsage.cautions).toContain('legalLimits');
  });

  it('has caution texts that defer to local rules where the law is involved', () => {
    for (const text of Object.values(CAUTIONS)) expect(text.length).toBeGreaterThan(40);
    expect(calc.CAUTION_SULFITES).toMatch(/sulfites/i);
    expect(calc.CAUTION_BOTTLE_PRESSURE).toMatch(/burst/i);
    expect(calc.CAUTION_ESTIMATE).toMatch(/estimate/i);
    expect(calc.CAUTION_LEGAL_LIMITS).toMatch(/where you live/i);
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
  ['fermentationState', 'readings[0].sg', (x) => calc.fermentationState({ og: 1.1, toleranceAbv: 14, readings: [{ at: new Date(0), sg: b(x) }], now: new Date() })],
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
    expect(calc.fermentableForGravity({ volumeL: 10, targetOg: 1.1, startOg: n, source: 'honey' })).toBe(
      calc.fermentableForGravity({ volumeL: 10, targetOg: 1.1, source: 'honey' }),
    );
    expect(calc.metabisulfiteGrams({ volumeL: 10, pH: 3.4, molecularSo2: n, freeSo2Now: n })).toBe(
      calc.metabisulfiteGrams({ volumeL: 10, pH: 3.4, molecularSo2: 0.8, freeSo2Now: 0 }),
    );
    expect(calc.bottlesFrom({ volumeL: 10, bottleMl: 750, lossL: n })).toEqual({ bottles: 13, remainderMl: 250 });
    expect(calc.rackingLoss({ volumeL: 10, lossFraction: n })).toBe(calc.rackingLoss({ volumeL: 10 }));
  });
});
