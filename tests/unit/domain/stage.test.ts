import { fc, test as propTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import type { Stage } from '../../../shared/schemas/batches';
import { ADDITION_CATEGORIES } from '../../../shared/schemas/journal';
import {
  advanceStage,
  deriveStage,
  RACKINGS_FOR_BULK_AGEING,
  type BatchContents,
  type StageEvent,
  type StageInheritance,
} from '../../../shared/domain/stage';

// The stage rules are the team's own (common practice, see the doc comment of deriveStage):
// primary until the first racking, secondary after it, bulk ageing after the second racking or
// a stabiliser after the first, bottled / finished once nothing is left in vessels.

const started: StageEvent = { kind: 'started' };
const racked: StageEvent = { kind: 'racked' };
const stabiliser: StageEvent = { kind: 'addition', category: 'stabiliser' };
const fruit: StageEvent = { kind: 'addition', category: 'fruit' };
const note: StageEvent = { kind: 'note' };
const bottled: StageEvent = { kind: 'bottled' };
const split: StageEvent = { kind: 'split' };
const blended: StageEvent = { kind: 'blended' };

const inVessels = (volumeInVesselsL = 20, bottlesLeft = 0): BatchContents => ({ volumeInVesselsL, bottlesLeft });
const emptied = (bottlesLeft = 0): BatchContents => ({ volumeInVesselsL: 0, bottlesLeft });

const derive = (events: StageEvent[], contents: BatchContents = inVessels(), inherited?: StageInheritance) =>
  deriveStage({ events, ...contents, inherited });

describe('RACKINGS_FOR_BULK_AGEING', () => {
  it('is two rackings (common practice: off the gross lees, then off the fine lees)', () => {
    expect(RACKINGS_FOR_BULK_AGEING).toBe(2);
  });
});

describe('deriveStage, liquid still in vessels', () => {
  it('is primary with no racking yet, whatever else the journal holds', () => {
    expect(derive([])).toBe('primary');
    expect(derive([started])).toBe('primary');
    expect(derive([started, note, fruit, { kind: 'reading' }, { kind: 'topped-up' }])).toBe('primary');
  });

  it('is secondary after exactly one racking', () => {
    expect(derive([started, racked])).toBe('secondary');
    expect(derive([started, racked, note, fruit])).toBe('secondary');
  });

  it('is bulk ageing after the second racking, and stays so after more', () => {
    expect(derive([started, racked, racked])).toBe('bulk-ageing');
    expect(derive([started, racked, racked, racked])).toBe('bulk-ageing');
  });

  it('counts a stabiliser added after the first racking as the start of bulk ageing', () => {
    expect(derive([started, racked, stabiliser])).toBe('bulk-ageing');
  });

  it('leaves a must sulfited before pitching in primary, and secondary after one racking (common practice)', () => {
    expect(derive([started, stabiliser])).toBe('primary');
    expect(derive([stabiliser, started, racked])).toBe('secondary');
  });

  it('counts only an addition of the stabiliser category as stabilising', () => {
    expect(derive([started, racked, fruit])).toBe('secondary');
    expect(derive([started, racked, { kind: 'addition', category: 'sweetener' }])).toBe('secondary');
    expect(derive([started, racked, { kind: 'addition' }])).toBe('secondary');
    // Another kind of entry carrying the category is not an addition.
    expect(derive([started, racked, { kind: 'note', category: 'stabiliser' }])).toBe('secondary');
  });

  it('keeps a batch with litres left in vessels in its bulk stage after a partial bottling or a split', () => {
    expect(derive([started, racked, bottled], inVessels(5, 12))).toBe('secondary');
    expect(derive([started, split], inVessels(10))).toBe('primary');
    expect(derive([started, racked, racked, blended], inVessels(0.001))).toBe('bulk-ageing');
  });

  it('ignores bottles left while litres are still in vessels', () => {
    expect(derive([started, racked, bottled], inVessels(4, 0))).toBe('secondary');
  });
});

describe('deriveStage, nothing left in vessels', () => {
  it('is bottled when a bottling emptied the vessels and at least one bottle is left', () => {
    expect(derive([started, racked, racked, bottled], emptied(24))).toBe('bottled');
    expect(derive([started, bottled], emptied(1))).toBe('bottled');
  });

  it('is finished when the last bottle is gone', () => {
    expect(derive([started, racked, racked, bottled], emptied(0))).toBe('finished');
  });

  it('is finished when a split or a blend took the rest away', () => {
    expect(derive([started, racked, split], emptied())).toBe('finished');
    expect(derive([started, blended], emptied())).toBe('finished');
  });

  it('is bottled when a blend took the rest of a partly bottled batch and bottles are left', () => {
    expect(derive([started, racked, bottled, blended], emptied(6))).toBe('bottled');
  });

  it('falls back to the racking count when the vessels are empty without a bottling, split or blend', () => {
    expect(derive([started], emptied())).toBe('primary');
    // Bottles alone (none made by a bottling of this batch) do not make it bottled.
    expect(derive([started, racked], emptied(3))).toBe('secondary');
  });
});

describe('deriveStage for a batch made by a split or a blend', () => {
  it('carries on from the rackings the liquid had before', () => {
    expect(derive([started], inVessels(), { rackings: 0, stabilised: false })).toBe('primary');
    expect(derive([started], inVessels(), { rackings: 1, stabilised: false })).toBe('secondary');
    expect(derive([started], inVessels(), { rackings: 2, stabilised: false })).toBe('bulk-ageing');
    expect(derive([started, racked], inVessels(), { rackings: 1, stabilised: false })).toBe('bulk-ageing');
  });

  it('carries a parent stabilised after its first racking into bulk ageing', () => {
    expect(derive([started], inVessels(), { rackings: 1, stabilised: true })).toBe('bulk-ageing');
  });

  it('does not call unracked liquid bulk ageing, even when marked stabilised', () => {
    expect(derive([started], inVessels(), { rackings: 0, stabilised: true })).toBe('primary');
  });

  it('counts a stabiliser added after an inherited racking', () => {
    expect(derive([started, stabiliser], inVessels(), { rackings: 1, stabilised: false })).toBe('bulk-ageing');
  });
});

describe('advanceStage', () => {
  it('moves through the bulk stages one racking at a time', () => {
    expect(advanceStage('primary', racked, inVessels())).toBe('secondary');
    expect(advanceStage('secondary', racked, inVessels())).toBe('bulk-ageing');
    expect(advanceStage('bulk-ageing', racked, inVessels())).toBe('bulk-ageing');
  });

  it('stays where it is for entries that change no stage', () => {
    expect(advanceStage('primary', note, inVessels())).toBe('primary');
    expect(advanceStage('secondary', note, inVessels())).toBe('secondary');
    expect(advanceStage('secondary', fruit, inVessels())).toBe('secondary');
    expect(advanceStage('bulk-ageing', note, inVessels())).toBe('bulk-ageing');
    expect(advanceStage('secondary', { kind: 'note', category: 'stabiliser' }, inVessels())).toBe('secondary');
  });

  it('stays where it is when only the contents changed (no entry)', () => {
    expect(advanceStage('primary', null, inVessels())).toBe('primary');
    expect(advanceStage('secondary', null, inVessels())).toBe('secondary');
    expect(advanceStage('bulk-ageing', null, inVessels())).toBe('bulk-ageing');
  });

  it('takes a stabiliser after the first racking into bulk ageing, but not one in primary', () => {
    expect(advanceStage('secondary', stabiliser, inVessels())).toBe('bulk-ageing');
    expect(advanceStage('primary', stabiliser, inVessels())).toBe('primary');
  });

  it('turns bottled when a bottling empties the vessels, and finished when the last bottle goes', () => {
    expect(advanceStage('bulk-ageing', bottled, emptied(24))).toBe('bottled');
    expect(advanceStage('bottled', null, emptied(23))).toBe('bottled');
    expect(advanceStage('bottled', null, emptied(0))).toBe('finished');
    expect(advanceStage('bottled', note, emptied(0))).toBe('finished');
  });

  it('keeps a partly bottled batch in its bulk stage', () => {
    expect(advanceStage('secondary', bottled, inVessels(5, 12))).toBe('secondary');
  });

  it('finishes a batch whose rest went into a split or a blend, and not while litres remain', () => {
    expect(advanceStage('secondary', split, emptied())).toBe('finished');
    expect(advanceStage('bulk-ageing', blended, emptied())).toBe('finished');
    expect(advanceStage('primary', blended, emptied())).toBe('finished');
    expect(advanceStage('secondary', split, inVessels(8))).toBe('secondary');
  });

  it('is bottled, not finished, when a blend takes the rest of a partly bottled batch and bottles are left', () => {
    // deriveStage over [started, racked, bottled (part), blended (the rest)] with 6 bottles left says 'bottled'.
    expect(advanceStage('secondary', blended, emptied(6))).toBe('bottled');
  });

  it('stays finished, whatever follows', () => {
    expect(advanceStage('finished', note, emptied())).toBe('finished');
    expect(advanceStage('finished', null, emptied())).toBe('finished');
  });

  it('keeps bottled or finished when the contents say litres are back in vessels (one entry cannot do that)', () => {
    expect(advanceStage('bottled', racked, inVessels(10, 6))).toBe('bottled');
    expect(advanceStage('finished', racked, inVessels(10))).toBe('finished');
  });

  it('falls back to the bulk stage when the vessels are empty without a bottling, split or blend', () => {
    expect(advanceStage('secondary', note, emptied())).toBe('secondary');
    expect(advanceStage('primary', racked, emptied())).toBe('secondary');
  });
});

// ---- advanceStage agrees with deriveStage over any realistic journal -------------------------

/** One thing that can happen to a batch; what is impossible at that moment is skipped. */
type Step =
  | { type: 'entry'; kind: 'reading' | 'note' | 'tasted' | 'degassed' | 'photo' | 'amendment' | 'removed' }
  | { type: 'addition'; category: (typeof ADDITION_CATEGORIES)[number] }
  | { type: 'racked'; lossL: number }
  | { type: 'topped-up'; litres: number }
  | { type: 'bottled'; bottles: number; emptiesVessels: boolean }
  | { type: 'split' }
  | { type: 'blended'; takesEverything: boolean }
  | { type: 'drunk'; bottles: number };

const stepArb: fc.Arbitrary<Step> = fc.oneof(
  fc.record({ type: fc.constant('entry' as const), kind: fc.constantFrom('reading', 'note', 'tasted', 'degassed', 'photo', 'amendment', 'removed') }),
  fc.record({ type: fc.constant('addition' as const), category: fc.constantFrom(...ADDITION_CATEGORIES) }),
  // Weighted up so journals reach two rackings and a stabiliser between them often.
  { arbitrary: fc.record({ type: fc.constant('racked' as const), lossL: fc.double({ min: 0, max: 0.9, noNaN: true }) }), weight: 3 },
  { arbitrary: fc.record({ type: fc.constant('addition' as const), category: fc.constant('stabiliser' as const) }), weight: 2 },
  fc.record({ type: fc.constant('topped-up' as const), litres: fc.double({ min: 0.1, max: 5, noNaN: true }) }),
  fc.record({ type: fc.constant('bottled' as const), bottles: fc.integer({ min: 1, max: 60 }), emptiesVessels: fc.boolean() }),
  fc.record({ type: fc.constant('split' as const) }),
  fc.record({ type: fc.constant('blended' as const), takesEverything: fc.boolean() }),
  fc.record({ type: fc.constant('drunk' as const), bottles: fc.integer({ min: 1, max: 30 }) }),
);

/** What a split or blend child starts with: stabilised only after a racking (see StageInheritance). */
const inheritanceArb: fc.Arbitrary<StageInheritance | undefined> = fc.option(
  fc
    .integer({ min: 0, max: 3 })
    .chain((rackings) => fc.record({ rackings: fc.constant(rackings), stabilised: rackings >= 1 ? fc.boolean() : fc.constant(false) })),
  { nil: undefined },
);

/**
 * Plays the steps against the batch's contents: liquid moves only while some is in vessels
 * (no racking, topping up, bottling, split or blend after nothing is left), a split leaves at
 * least one vessel behind (as the split service insists), bottles only go down once made.
 * @returns the entry (null when only the contents changed) and the contents after each step
 */
function playJournal(startL: number, steps: Step[]): { event: StageEvent | null; contents: BatchContents }[] {
  let volumeL = startL;
  let bottlesLeft = 0;
  const played: { event: StageEvent | null; contents: BatchContents }[] = [{ event: started, contents: inVessels(volumeL, bottlesLeft) }];
  for (const step of steps) {
    const liquid = volumeL > 0;
    let event: StageEvent | null;
    switch (step.type) {
      case 'entry':
        if (!liquid && (step.kind === 'reading' || step.kind === 'degassed' || step.kind === 'removed')) continue;
        event = { kind: step.kind };
        break;
      case 'addition':
        if (!liquid) continue;
        event = { kind: 'addition', category: step.category };
        break;
      case 'racked':
        if (!liquid) continue;
        volumeL *= 1 - step.lossL / 10;
        event = racked;
        break;
      case 'topped-up':
        if (!liquid) continue;
        volumeL += step.litres;
        event = { kind: 'topped-up' };
        break;
      case 'bottled':
        if (!liquid) continue;
        volumeL = step.emptiesVessels ? 0 : volumeL / 2;
        bottlesLeft += step.bottles;
        event = bottled;
        break;
      case 'split':
        if (!liquid) continue;
        volumeL /= 2;
        event = split;
        break;
      case 'blended':
        if (!liquid) continue;
        volumeL = step.takesEverything ? 0 : volumeL / 2;
        event = blended;
        break;
      case 'drunk':
        if (bottlesLeft === 0) continue;
        bottlesLeft = Math.max(0, bottlesLeft - step.bottles);
        event = null;
        break;
    }
    played.push({ event, contents: inVessels(volumeL, bottlesLeft) });
  }
  return played;
}

describe('advanceStage folded over a journal', () => {
  propTest.prop([fc.double({ min: 1, max: 500, noNaN: true }), fc.array(stepArb, { maxLength: 40 }), inheritanceArb], { numRuns: 500 })(
    'gives the stage deriveStage gives over the whole journal, after every entry',
    (startL, steps, inherited) => {
      let stage: Stage = deriveStage({ events: [], ...inVessels(startL), inherited });
      const events: StageEvent[] = [];
      for (const { event, contents } of playJournal(startL, steps)) {
        if (event) events.push(event);
        stage = advanceStage(stage, event, contents);
        expect(stage).toBe(deriveStage({ events, ...contents, inherited }));
      }
    },
  );
});
