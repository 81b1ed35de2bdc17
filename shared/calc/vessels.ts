/**
 * Vessel arithmetic: headspace, expected racking loss, and the best free
 * vessel to rack into.
 */
import { CalcInputError, requireNonNegative, requireOneOf, requirePositive, requireRange, showNumber } from './guards';

/** What is left behind at a racking. */
export type RackingStage = 'primary' | 'secondary' | 'ageing';
/** All racking stages, for pickers. */
export const RACKING_STAGES: readonly RackingStage[] = ['primary', 'secondary', 'ageing'];

/**
 * What stays behind at a racking: a fixed part (the siphon, its tube and the last of the
 * liquid the cane cannot reach) plus a small share of the volume by stage, for the lees.
 * Chosen so that a secondary racking reproduces what makers report (common practice): about
 * half a cup from a one-gallon batch and a couple of cups from a five-gallon batch. The
 * heavy primary lees hold more, the light lees of later rackings less. Fruit in the primary
 * can take far more; pass `lossFraction` to use your own share instead.
 */
export const RACKING_LOSS_FIXED_L = 0.03;
/** Share of the volume left with the lees at each stage, on top of RACKING_LOSS_FIXED_L. */
export const RACKING_LOSS_FRACTION: Readonly<Record<RackingStage, number>> = {
  primary: 0.04,
  secondary: 0.025,
  ageing: 0.01,
};

/** Options for headspace. */
export interface HeadspaceInput {
  /** Vessel capacity, litres. */
  capacityL: number;
  /** Liquid in it, litres. */
  volumeL: number;
}

/**
 * Empty space above the liquid, in litres and as % of the vessel's capacity.
 * @param input.capacityL - vessel capacity in litres (more than zero)
 * @param input.volumeL - litres in the vessel (not more than the capacity)
 */
export function headspace(input: HeadspaceInput): { litres: number; percent: number } {
  const capacity = requirePositive(input.capacityL, 'capacityL', 'Vessel capacity', ' L');
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Volume', ' L');
  if (volume > capacity) {
    throw new CalcInputError('volumeL', `Volume (${showNumber(volume)} L) is more than the vessel holds (${showNumber(capacity)} L).`);
  }
  const litres = capacity - volume;
  return { litres, percent: (litres / capacity) * 100 };
}

/** Options for rackingLoss. */
export interface RackingLossInput {
  /** Litres being racked. */
  volumeL: number;
  /** Which racking this is (default 'secondary'). */
  stage?: RackingStage;
  /** Your own loss share, 0–0.5, instead of the fixed part and the stage's share. */
  lossFraction?: number;
}

/**
 * Litres expected to stay behind at a racking: RACKING_LOSS_FIXED_L plus the stage's share of
 * the volume (common practice), never more than the volume itself. With `lossFraction` the
 * loss is simply that share of the volume.
 * @param input.volumeL - litres being racked
 * @param input.stage - 'primary', 'secondary' (default) or 'ageing'
 * @param input.lossFraction - your own loss share, 0–0.5, instead of the rule
 */
export function rackingLoss(input: RackingLossInput): number {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Volume', ' L');
  const stage = requireOneOf(input.stage ?? 'secondary', RACKING_STAGES, 'stage', 'Racking stage');
  if (input.lossFraction != null) {
    return volume * requireRange(input.lossFraction, 'lossFraction', 'Loss share', 0, 0.5, 2);
  }
  return Math.min(volume, RACKING_LOSS_FIXED_L + volume * RACKING_LOSS_FRACTION[stage]);
}

/** A vessel that could receive the racking. */
export interface VesselCandidate {
  /** The vessel's identifier. */
  id: string | number;
  /** Its capacity, litres. */
  capacityL: number;
}

/** Options for bestVesselForRacking. */
export interface BestVesselInput<T extends VesselCandidate> {
  /** Litres being racked (before the loss). */
  volumeL: number;
  /** Free, clean vessels to choose from. */
  candidates: readonly T[];
  /** Which racking this is (default 'secondary'). */
  stage?: RackingStage;
  /** Expected loss in litres, instead of the stage's rule of thumb. */
  lossL?: number;
}

/**
 * Smallest candidate that holds the volume left after the expected loss (least
 * headspace); ties go to the earlier candidate. Null when none is big enough.
 * @param input.volumeL - litres being racked, before the loss
 * @param input.candidates - free vessels `{ id, capacityL }` (extra fields are kept)
 * @param input.stage - racking stage for the loss rule of thumb (default 'secondary')
 * @param input.lossL - expected loss in litres, overriding the rule of thumb
 */
export function bestVesselForRacking<T extends VesselCandidate>(input: BestVesselInput<T>): T | null {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Volume', ' L');
  if (!Array.isArray(input.candidates)) {
    throw new CalcInputError('candidates', 'Candidates must be a list of vessels with a capacity.');
  }
  let loss: number;
  if (input.lossL == null) {
    loss = rackingLoss({ volumeL: volume, stage: input.stage });
  } else {
    loss = requireNonNegative(input.lossL, 'lossL', 'Expected loss', ' L');
    if (loss > volume) {
      throw new CalcInputError('lossL', `Expected loss (${showNumber(loss)} L) cannot be more than the volume racked (${showNumber(volume)} L).`);
    }
  }
  const needed = volume - loss;
  let best: T | null = null;
  for (let i = 0; i < input.candidates.length; i++) {
    const c = input.candidates[i];
    if (c === null || typeof c !== 'object') {
      throw new CalcInputError(`candidates[${i}]`, `Candidate ${i + 1} must be a vessel with a capacity.`);
    }
    const cap = requirePositive(c.capacityL, `candidates[${i}].capacityL`, `Capacity of candidate ${i + 1}`, ' L');
    // A microlitre of slack so a 23 L vessel still takes a volume that float arithmetic left at 23.0000000001 L.
    if (cap + 1e-6 >= needed && (best === null || cap < best.capacityL)) best = c;
  }
  return best;
}
