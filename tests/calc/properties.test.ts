import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import * as calc from '../../shared/calc';
import { CalcInputError, type AbvFormula, type MassUnit, type VolumeUnit } from '../../shared/calc';

// Invariants checked over many generated inputs (fast-check). The expected values in the
// other files come from published sources; these say what must hold everywhere between them.
// "Never less" allows for rounding: the fitted cubics wobble by ~10⁻¹⁵ between neighbouring doubles.
const ROUNDING = 1e-12;

const gravity = fc.double({ min: 0.98, max: 1.2, noNaN: true });
const volumeUnit = fc.constantFrom<VolumeUnit>(...calc.VOLUME_UNITS);
const massUnit = fc.constantFrom<MassUnit>(...calc.MASS_UNITS);
const formula = fc.constantFrom<AbvFormula>(...calc.ABV_FORMULAS);
/** Two gravities, the larger first (OG, FG). */
const gravityPair = fc.tuple(gravity, gravity).map(([a, b]): [number, number] => (a >= b ? [a, b] : [b, a]));
/** Any finite number, the huge ones included. */
const anyFinite = fc.double({ noNaN: true, noDefaultInfinity: true });
const anyAmount = fc.double({ min: 0, max: Number.MAX_VALUE, noNaN: true });

/** Calls `run`; the answer must be a finite number (or hold only finite numbers), or the call a CalcInputError. */
function finiteOrInputError(run: () => unknown): void {
  let result: unknown;
  try {
    result = run();
  } catch (e) {
    expect(e).toBeInstanceOf(CalcInputError);
    return;
  }
  const numbers = typeof result === 'number' ? [result] : Object.values(result as object).filter((v) => typeof v === 'number');
  for (const n of numbers) expect(Number.isFinite(n)).toBe(true);
}

describe('monotonic conversions', () => {
  it('more of a unit is never less in litres or kilograms, and back', () => {
    fc.assert(
      fc.property(anyAmount, anyAmount, volumeUnit, massUnit, (a, b, v, m) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        const safe = (f: () => number) => {
          try {
            return f();
          } catch {
            return Number.POSITIVE_INFINITY; // overflow: "more than any number"
          }
        };
        expect(safe(() => calc.litresFrom(lo, v))).toBeLessThanOrEqual(safe(() => calc.litresFrom(hi, v)));
        expect(safe(() => calc.litresTo(lo, v))).toBeLessThanOrEqual(safe(() => calc.litresTo(hi, v)));
        expect(calc.kilogramsFrom(lo, m)).toBeLessThanOrEqual(calc.kilogramsFrom(hi, m));
        expect(safe(() => calc.kilogramsTo(lo, m))).toBeLessThanOrEqual(safe(() => calc.kilogramsTo(hi, m)));
      }),
    );
  });

  it('a higher gravity is never less °Brix or °Plato, and a higher reading never corrects lower', () => {
    fc.assert(
      fc.property(gravityPair, fc.double({ min: 0, max: 40, noNaN: true }), ([hi, lo], t) => {
        expect(calc.sgToBrix(lo)).toBeLessThanOrEqual(calc.sgToBrix(hi) + ROUNDING);
        expect(calc.sgToPlato(lo)).toBeLessThanOrEqual(calc.sgToPlato(hi) + ROUNDING);
        expect(calc.correctGravity(lo, t)).toBeLessThanOrEqual(calc.correctGravity(hi, t));
        expect(calc.sugarPerLitre(lo)).toBeLessThanOrEqual(calc.sugarPerLitre(hi) + ROUNDING);
      }),
      // Found by a run: one step above 1.000 the °Brix fit is below zero, and the sugar was too.
      { examples: [[[1.0000000000000002, 0.98], 0]] },
    );
  });

  it('a warmer temperature is warmer on both scales', () => {
    fc.assert(
      fc.property(fc.double({ min: -273.15, max: 1e6, noNaN: true }), fc.double({ min: -273.15, max: 1e6, noNaN: true }), (a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        expect(calc.fahrenheitFrom(lo)).toBeLessThanOrEqual(calc.fahrenheitFrom(hi));
        expect(calc.celsiusFrom(calc.fahrenheitFrom(lo))).toBeLessThanOrEqual(calc.celsiusFrom(calc.fahrenheitFrom(hi)));
      }),
    );
  });

  it('a lower final gravity never means less alcohol, by any formula', () => {
    fc.assert(
      fc.property(gravity, gravity, gravity, formula, (a, b, c, f) => {
        const [og, mid, low] = [a, b, c].sort((x, y) => y - x);
        expect(calc.abvBy(og, mid, f)).toBeLessThanOrEqual(calc.abvBy(og, low, f) + ROUNDING);
        expect(calc.abvBy(og, og, f)).toBeCloseTo(0, 9);
      }),
    );
  });

  it('more honey never gives a lower gravity, and a higher target never needs less', () => {
    const pounds = fc.double({ min: 0, max: 60, noNaN: true });
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1000, noNaN: true }), pounds, pounds, gravityPair, (volumeL, a, b, [hiOg, loOg]) => {
        const reached = (kg: number) => calc.gravityFromFermentable({ volumeL: 200, kg, source: 'honey' });
        expect(reached(Math.min(a, b))).toBeLessThanOrEqual(reached(Math.max(a, b)) + ROUNDING);
        const needed = (og: number) => calc.fermentableForGravity({ volumeL, targetOg: Math.max(og, 1), source: 'honey' });
        expect(needed(loOg)).toBeLessThanOrEqual(needed(hiOg) * (1 + ROUNDING) + ROUNDING);
      }),
    );
  });
});

describe('round trips, within a stated tolerance', () => {
  it('volume and mass units come back to within one part in 10¹² (or 10⁻³⁰⁰ for vanishing amounts)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e300, noNaN: true }), volumeUnit, massUnit, (x, v, m) => {
        const tolerance = Math.max(x * 1e-12, 1e-300);
        expect(Math.abs(calc.litresTo(calc.litresFrom(x, v), v) - x)).toBeLessThanOrEqual(tolerance);
        expect(Math.abs(calc.kilogramsTo(calc.kilogramsFrom(x, m), m) - x)).toBeLessThanOrEqual(tolerance);
      }),
    );
  });

  it('°C → °F → °C comes back to within 10⁻⁹ °C', () => {
    fc.assert(
      fc.property(fc.double({ min: -273.15, max: 1e4, noNaN: true }), (c) => {
        expect(Math.abs(calc.celsiusFrom(calc.fahrenheitFrom(c)) - c)).toBeLessThan(1e-9);
      }),
    );
  });

  it('gravity → °Brix or °Plato → gravity comes back to within 10⁻⁹', () => {
    fc.assert(
      fc.property(gravity, (sg) => {
        expect(Math.abs(calc.brixToSg(calc.sgToBrix(sg)) - sg)).toBeLessThan(1e-9);
        expect(Math.abs(calc.platoToSg(calc.sgToPlato(sg)) - sg)).toBeLessThan(1e-9);
      }),
    );
  });

  it('gravity → ABV → gravity comes back to within 10⁻⁶ by every formula', () => {
    fc.assert(
      fc.property(gravityPair, formula, ([og, fg], f) => {
        expect(Math.abs(calc.fgAtAbv(og, calc.abvBy(og, fg, f), f) - fg)).toBeLessThan(1e-6);
      }),
    );
  });

  it('target gravity → honey or sugar → gravity comes back to within 10⁻⁶', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 1000, noNaN: true }),
        fc.double({ min: 1.001, max: 1.2, noNaN: true }),
        fc.constantFrom(...calc.FERMENTABLE_SOURCES),
        fc.option(fc.double({ min: 12, max: 25, noNaN: true }), { nil: undefined }),
        (volumeL, targetOg, source, honeyMoisturePercent) => {
          const kg = calc.fermentableForGravity({ volumeL, targetOg, source, honeyMoisturePercent });
          expect(Math.abs(calc.gravityFromFermentable({ volumeL, kg, source, honeyMoisturePercent }) - targetOg)).toBeLessThan(1e-6);
        },
      ),
    );
  });
});

describe('adding up', () => {
  it('honey added in two steps is the honey added at once, to within 10⁻⁹ kg', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 1000, noNaN: true }), gravity, gravity, gravity, (volumeL, a, b, c) => {
        const [start, mid, end] = [a, b, c].sort((x, y) => x - y);
        const step = (from: number, to: number) => calc.fermentableForGravity({ volumeL, startOg: from, targetOg: to, source: 'honey' });
        expect(Math.abs(step(start, mid) + step(mid, end) - step(start, end))).toBeLessThan(1e-9 * Math.max(1, volumeL));
      }),
    );
  });
});

describe('no non-finite output for any accepted input', () => {
  it('unit conversions and display', () => {
    fc.assert(
      fc.property(anyFinite, volumeUnit, massUnit, fc.constantFrom(...calc.UNIT_SYSTEMS), (x, v, m, system) => {
        finiteOrInputError(() => calc.litresFrom(x, v));
        finiteOrInputError(() => calc.litresTo(x, v));
        finiteOrInputError(() => calc.kilogramsFrom(x, m));
        finiteOrInputError(() => calc.kilogramsTo(x, m));
        finiteOrInputError(() => calc.celsiusFrom(x));
        finiteOrInputError(() => calc.fahrenheitFrom(x));
        for (const text of [calc.formatVolume, calc.formatMass, calc.formatTemperature].map((format) => {
          try {
            return format(x, system);
          } catch (e) {
            expect(e).toBeInstanceOf(CalcInputError);
            return '';
          }
        })) {
          expect(text).not.toMatch(/NaN|Infinity/);
        }
        expect(calc.tidyNumber(x)).not.toMatch(/NaN|Infinity/);
      }),
    );
  });

  it('gravity, alcohol and finish', () => {
    fc.assert(
      fc.property(anyFinite, anyFinite, fc.double({ min: -5, max: 30, noNaN: true }), formula, (a, b, tol, f) => {
        finiteOrInputError(() => calc.abvBy(a, b, f));
        finiteOrInputError(() => calc.potentialAbv(a, f));
        finiteOrInputError(() => calc.apparentAttenuation(a, b));
        finiteOrInputError(() => calc.fgAtAbv(a, tol, f));
        finiteOrInputError(() => calc.predictFinish({ og: a, toleranceAbv: tol, formula: f }));
        finiteOrInputError(() => calc.correctGravity(a, b));
        finiteOrInputError(() => calc.brixToSg(a));
        finiteOrInputError(() => calc.platoToSg(b));
      }),
    );
  });

  it('amounts, doses, vessels and bottles', () => {
    fc.assert(
      fc.property(anyFinite, anyFinite, fc.double({ min: 2.5, max: 4.5, noNaN: true }), (x, y, pH) => {
        finiteOrInputError(() => calc.fermentableForGravity({ volumeL: x, targetOg: 1.1, source: 'honey' }));
        finiteOrInputError(() => calc.gravityFromFermentable({ volumeL: x, kg: y, source: 'sucrose' }));
        finiteOrInputError(() => calc.metabisulfiteGrams({ volumeL: x, pH }));
        finiteOrInputError(() => calc.sorbateGrams({ volumeL: x, abv: 12 }));
        finiteOrInputError(() => calc.headspace({ capacityL: x, volumeL: y }));
        finiteOrInputError(() => calc.rackingLoss({ volumeL: x, stage: 'primary' }));
        finiteOrInputError(() => calc.bottlesFrom({ volumeL: x, bottleMl: y }));
        finiteOrInputError(() => calc.casesFrom(x, y));
        finiteOrInputError(() => calc.annualVolumeUsage({ volumesL: [x, x, y], limitL: y }));
      }),
    );
  });

  it('dates, to the last day a Date can hold', () => {
    const date = fc.date({ min: new Date(-8.64e15), max: new Date(8.64e15), noInvalidDate: true });
    fc.assert(
      fc.property(date, date, fc.integer({ min: 0, max: 12_000 }), (a, b, months) => {
        finiteOrInputError(() => calc.daysBetween(a, b));
        let later: Date | null = null;
        try {
          later = calc.addMonths(a, months);
        } catch (e) {
          expect(e).toBeInstanceOf(CalcInputError);
        }
        if (later) expect(Number.isNaN(later.getTime())).toBe(false);
      }),
    );
  });
});
