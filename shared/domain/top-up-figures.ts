import { ABV_SIMPLE_FACTOR, mixedGravity } from '../calc';
import type { TopUpLiquid } from '../schemas/journal';

/** A top-up as the figures need it. */
export interface TopUpEvent {
  at: string;
  /** Litres added. */
  addedL: number;
  /** Litres of the batch before it. */
  batchVolumeBeforeL: number;
  liquid: TopUpLiquid;
}

/** A gravity reading (temperature-corrected). */
export interface GravityPoint {
  at: string;
  sg: number;
}

export interface FiguresAfterTopUps {
  /**
   * The original gravity the batch would have had to reach its present state: the start's OG mixed
   * with what each top-up brought (its own OG: water 1.000, a sugar or honey solution its gravity,
   * another wine its gravity plus its alcohol as gravity points). ABV from it and the current
   * gravity follows the top-ups.
   */
  og: number;
  /** The latest reading, or — when top-ups came after it — that reading mixed with them. */
  currentSg: number | null;
  /** The current gravity is worked out from top-ups since the last reading, not read. */
  sgEstimated: boolean;
  /** A top-up's gravity or strength is unknown, so its effect is left out. */
  unknownTopUps: number;
}

/** The liquid's gravity now and its equivalent original gravity, or null when unknown. */
function liquidGravities(liquid: TopUpLiquid, batchOg: number, batchSg: number): { sg: number; og: number } | null {
  switch (liquid.kind) {
    case 'water':
      return { sg: liquid.sg ?? 1, og: liquid.sg ?? 1 };
    case 'same-batch':
      return { sg: batchSg, og: batchOg };
    case 'sugar-water':
    case 'honey-water':
      // Unfermented: what it reads now is its original gravity.
      return liquid.sg === null ? null : { sg: liquid.sg, og: liquid.sg };
    case 'other-wine':
      // Its alcohol counted back as gravity points by the linear ABV relation (shared/calc abv.ts).
      return liquid.sg === null || liquid.abv === null ? null : { sg: liquid.sg, og: liquid.sg + liquid.abv / ABV_SIMPLE_FACTOR };
  }
}

/**
 * A batch's original gravity and current gravity after its top-ups, by the mixing rule (gravity
 * points add up by volume: shared/calc mixedGravity). Readings and top-ups are taken in time
 * order; a reading after a top-up replaces the estimate. Before any reading the batch's gravity
 * is its original gravity.
 * @param og - the batch's original gravity at its start
 * @param readings - its readings, any order
 * @param topUps - its top-ups with the liquid recorded, any order
 */
export function figuresAfterTopUps(og: number, readings: readonly GravityPoint[], topUps: readonly TopUpEvent[]): FiguresAfterTopUps {
  type Step = { at: string; reading?: GravityPoint; topUp?: TopUpEvent };
  const steps: Step[] = [...readings.map((reading) => ({ at: reading.at, reading })), ...topUps.map((topUp) => ({ at: topUp.at, topUp }))];
  // A reading and a top-up at the same moment: the reading was taken before the top-up. Readings
  // are listed first and the sort is stable (ECMAScript 2019), so a tie keeps that order.
  steps.sort((a, b) => Date.parse(a.at) - Date.parse(b.at));
  let equivalentOg = og;
  let current: number | null = null;
  let estimated = false;
  let unknown = 0;
  for (const step of steps) {
    if (step.reading) {
      current = step.reading.sg;
      estimated = false;
      continue;
    }
    const topUp = step.topUp!;
    const before = current ?? equivalentOg;
    const liquid = liquidGravities(topUp.liquid, equivalentOg, before);
    if (!liquid || topUp.batchVolumeBeforeL <= 0 || topUp.addedL <= 0) {
      unknown += 1;
      continue;
    }
    const batch = topUp.batchVolumeBeforeL;
    equivalentOg = mixedGravity([
      { volumeL: batch, sg: equivalentOg },
      { volumeL: topUp.addedL, sg: liquid.og },
    ]);
    current = mixedGravity([
      { volumeL: batch, sg: before },
      { volumeL: topUp.addedL, sg: liquid.sg },
    ]);
    estimated = true;
  }
  return { og: equivalentOg, currentSg: current, sgEstimated: estimated, unknownTopUps: unknown };
}
