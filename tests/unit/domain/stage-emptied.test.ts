import { describe, expect, it } from 'vitest';
import { correctionSchema } from '../../../shared/domain/journal';
import { advanceStage, deriveStage, type StageEvent } from '../../../shared/domain/stage';

// The team's own rule (no outside source): a vessel poured out is liquid leaving the batch, like
// a blend taking it away. A batch left in no vessel reads as finished, or bottled while bottles
// are left in its cases.

const started: StageEvent = { kind: 'started' };
const racked: StageEvent = { kind: 'racked' };
const bottled: StageEvent = { kind: 'bottled' };
const emptiedEntry: StageEvent = { kind: 'emptied' };

describe('the stage after a vessel is emptied', () => {
  it('stays where it was while other vessels still hold the batch', () => {
    expect(deriveStage({ events: [started, racked, emptiedEntry], volumeInVesselsL: 10, bottlesLeft: 0 })).toBe('secondary');
    expect(advanceStage('secondary', emptiedEntry, { volumeInVesselsL: 10, bottlesLeft: 0 })).toBe('secondary');
  });

  it('is finished when the last vessel is poured out and no bottles are left', () => {
    expect(deriveStage({ events: [started, emptiedEntry], volumeInVesselsL: 0, bottlesLeft: 0 })).toBe('finished');
    expect(advanceStage('primary', emptiedEntry, { volumeInVesselsL: 0, bottlesLeft: 0 })).toBe('finished');
  });

  it('is bottled when bottles are left in cases', () => {
    expect(deriveStage({ events: [started, racked, bottled, emptiedEntry], volumeInVesselsL: 0, bottlesLeft: 12 })).toBe('bottled');
    expect(advanceStage('bulk-ageing', emptiedEntry, { volumeInVesselsL: 0, bottlesLeft: 12 })).toBe('bottled');
  });
});

describe('correcting an emptying', () => {
  const schema = correctionSchema('emptied');

  it('takes a known reason and a note', () => {
    expect(schema.safeParse({ reason: 'spoiled', note: 'vinegar' }).success).toBe(true);
    expect(schema.safeParse({ reason: 'evaporated' }).success).toBe(false);
  });

  it('never the litres or the vessel, which are what happened', () => {
    const litres = schema.safeParse({ volumeL: 2 });
    expect(litres.success).toBe(false);
    expect(litres.error?.issues[0]?.message).toBe('an emptying has no field volumeL that can be corrected (only reason, note)');
    expect(schema.safeParse({ vesselId: '00000000-0000-4000-8000-000000000000' }).success).toBe(false);
  });
});
