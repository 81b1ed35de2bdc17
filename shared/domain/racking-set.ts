import { headspace, rackingLoss, type RackingStage } from '../calc';

/** A free sanitised vessel that could take part of a racking. */
export interface RackingCandidate {
  id: string;
  name: string;
  capacityL: number;
}

/** One vessel of the proposal and what goes into it. */
export interface RackingFill<T extends RackingCandidate> {
  vessel: T;
  fillL: number;
}

export interface RackingSetProposal<T extends RackingCandidate> {
  /** Vessels to fill, largest first; all but the last are filled to the brim. */
  fills: RackingFill<T>[];
  /** Litres expected to stay behind with the lees (shared/calc rackingLoss). */
  lossL: number;
  /** Litres that reach the new vessels. */
  volumeAfterLossL: number;
  /** Empty space left across the set, litres. */
  headspaceL: number;
  /** That space as a share of the vessel that is not filled to the brim, %. */
  headspacePercent: number;
}

/** Sets of more vessels than this are not proposed: each one is another siphoning. */
export const MAX_VESSELS_IN_SET = 4;

interface SizeGroup<T> {
  /** Capacity in whole millilitres, so sums and comparisons are exact. */
  capacityMl: number;
  vessels: T[];
}

const toMl = (litres: number) => Math.round(litres * 1000);

/**
 * The set of free sanitised vessels (one or several, at most MAX_VESSELS_IN_SET) that holds what
 * is left after the expected racking loss with the least headspace: air over the liquid is what
 * racking tries to avoid. Volumes are compared to the millilitre. Ties go to fewer vessels, then
 * to smaller sizes, then to the vessel listed first. Vessels are filled to the brim but the
 * largest of the set, which takes what is left — the same litres of air make the smallest share
 * there. Null when no set of that many vessels holds it.
 * @param volumeL - litres being racked, before the loss
 * @param candidates - free sanitised vessels to choose among
 * @param stage - which racking this is, for the loss (shared/calc rackingLoss)
 */
export function proposeRackingSet<T extends RackingCandidate>(
  volumeL: number,
  candidates: readonly T[],
  stage: RackingStage,
): RackingSetProposal<T> | null {
  const lossL = rackingLoss({ volumeL, stage });
  const neededL = volumeL - lossL;
  const neededMl = toMl(neededL);
  if (neededMl <= 0) return null;
  const groups = sizeGroups(candidates);

  let best: { counts: number[]; capacityMl: number; vessels: number } | null = null;
  const counts = groups.map(() => 0);
  const search = (from: number, capacityMl: number, vessels: number) => {
    if (capacityMl >= neededMl) {
      if (!best || capacityMl < best.capacityMl || (capacityMl === best.capacityMl && vessels < best.vessels)) {
        best = { counts: [...counts], capacityMl, vessels };
      }
      return;
    }
    if (vessels === MAX_VESSELS_IN_SET) return;
    for (let g = from; g < groups.length; g++) {
      if (counts[g] === groups[g].vessels.length) continue;
      counts[g] += 1;
      search(g, capacityMl + groups[g].capacityMl, vessels + 1);
      counts[g] -= 1;
    }
  };
  search(0, 0, 0);
  if (!best) return null;

  const chosen = (best as { counts: number[] }).counts.flatMap((n, g) => groups[g].vessels.slice(0, n));
  const largestFirst = [...chosen].sort((a, b) => b.capacityL - a.capacityL);
  const [partial, ...full] = largestFirst;
  const fullL = full.reduce((sum, v) => sum + v.capacityL, 0);
  const partialFillL = Math.min(partial.capacityL, neededL - fullL);
  const space = headspace({ capacityL: partial.capacityL, volumeL: partialFillL });
  return {
    fills: [{ vessel: partial, fillL: partialFillL }, ...full.map((v) => ({ vessel: v, fillL: v.capacityL }))],
    lossL,
    volumeAfterLossL: neededL,
    headspaceL: space.litres,
    headspacePercent: space.percent,
  };
}

/** Candidates grouped by capacity, smallest first, each group in the order given. */
function sizeGroups<T extends RackingCandidate>(candidates: readonly T[]): SizeGroup<T>[] {
  const byCapacity = new Map<number, T[]>();
  for (const c of candidates) byCapacity.set(toMl(c.capacityL), [...(byCapacity.get(toMl(c.capacityL)) ?? []), c]);
  return [...byCapacity.entries()].sort(([a], [b]) => a - b).map(([capacityMl, vessels]) => ({ capacityMl, vessels }));
}
