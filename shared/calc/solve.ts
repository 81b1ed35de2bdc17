/**
 * One numeric solver for the inverse directions (°Brix or °Plato to gravity, gravity from an
 * amount of sugar, final gravity at a given alcohol): bisection, which always converges for a
 * function that rises steadily over the bracket.
 */

/** Halvings of the bracket: 2⁻⁸⁰ of a 0.22 SG bracket is far below a double's resolution. */
const HALVINGS = 80;

/**
 * The x in [lo, hi] where the rising function `f` reaches `target` (lo or hi when out of reach).
 * @param f - a function that rises steadily over [lo, hi]
 * @param target - the value wanted
 * @param lo - lower end of the bracket
 * @param hi - upper end of the bracket
 */
export function solveRising(f: (x: number) => number, target: number, lo: number, hi: number): number {
  let a = lo;
  let b = hi;
  for (let i = 0; i < HALVINGS; i++) {
    const mid = (a + b) / 2;
    if (f(mid) < target) a = mid;
    else b = mid;
  }
  return (a + b) / 2;
}
