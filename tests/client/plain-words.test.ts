import { describe, expect, it } from 'vitest';
import type { JournalEntry } from '@shared/schemas/journal';
import { batchFigures } from '@/components/batches/batch-figures';
import { whereaboutsWords } from '@/components/batches/whereabouts-words';
import { packingSummary } from '@/components/bottles/packing-words';
import { batchDetail } from './support/fixtures';

describe('packingSummary', () => {
  it.each([
    [14, 12, '14 bottles: one full case of 12 and a part case of 2'],
    [24, 12, '24 bottles: two full cases of 12'],
    [12, 12, '12 bottles: one full case of 12'],
    [5, 12, '5 bottles: a part case of 5'],
    [1, 6, '1 bottle: a part case of 1'],
    [150, 12, '150 bottles: 12 full cases of 12 and a part case of 6'],
  ])('%s bottles, %s a case: "%s"', (bottles, perCase, words) => {
    expect(packingSummary(bottles, perCase)).toBe(words);
  });
});

describe('whereaboutsWords', () => {
  it('says each vessel and its rack slot as every page words a place, or that it has none', () => {
    const place = {
      rackId: '5d1c7a52-3f0e-4b6a-9a51-1f2e3d4c5b6a',
      rackName: 'Rack A',
      shelfId: '5d1c7a52-3f0e-4b6a-9a51-1f2e3d4c5b6b',
      shelfNumber: 2,
      slot: 4,
    };
    expect(
      whereaboutsWords([
        { vesselName: 'Carboy 3', place },
        { vesselName: 'Jug 1', place: null },
      ]),
    ).toBe('Carboy 3\u00a0· Rack A\u00a0· shelf\u00a02\u00a0· slot\u00a04; Jug 1 (no place set)');
    expect(whereaboutsWords(undefined)).toBe('');
  });
});

describe('batch figures after a top-up', () => {
  it('follow the mixing rule: 19 L read at 1.010 with 1 L of water → 1.0095 now, OG 1.095', () => {
    // Volume-weighted gravity points (the Pearson-square relation): 19 × 10 / 20 = 9.5; 19 × 100 / 20 = 95.
    const topUp: JournalEntry = {
      id: 'e1f2a3b4-c5d6-4e7f-8a9b-0c1d2e3f4a5c',
      batchId: batchDetail().id,
      occurredAt: '2026-02-21T10:00:00.000Z',
      recordedAt: '2026-02-21T10:00:00.000Z',
      author: { id: '0f1e2d3c-4b5a-4968-8776-655443322110', name: 'Wren' },
      amendsEntryId: null,
      amendedBy: [],
      payload: {
        kind: 'topped-up',
        vesselId: batchDetail().vessels[0]!.id,
        vesselName: 'Carboy 3',
        volumeL: 1,
        with: 'Water',
        liquid: { kind: 'water', sg: null, abv: null },
        batchVolumeBeforeL: 19,
      },
    };
    const batch = batchDetail({
      og: 1.1,
      readings: [
        {
          entryId: 'e1f2a3b4-c5d6-4e7f-8a9b-0c1d2e3f4a5d',
          at: '2026-02-20T10:00:00.000Z',
          sg: 1.01,
          correctedSg: 1.01,
          temperatureC: null,
          ph: null,
        },
      ],
      journal: [topUp],
    });
    const f = batchFigures(batch, new Date('2026-02-22T10:00:00Z'));
    expect(f.ogAtStart).toBe(1.1);
    expect(f.og).toBeCloseTo(1.095, 9);
    expect(f.currentSg).toBeCloseTo(1.0095, 9);
    expect(f.sgEstimated).toBe(true);
  });
});
