import { describe, expect, it } from 'vitest';
import { conditionSpans, stageStarts, vesselsEnd, type BatchFacts, type FactEvent } from '../../../shared/domain/plans/batch-facts';

// Stage rules (common practice, see shared/domain/stage): primary until the first racking,
// secondary after it, bulk ageing after the second racking (RACKINGS_FOR_BULK_AGEING = 2) or a
// stabiliser after the first racking. A split or blend carries its parents' rackings: the fewest
// that bring its own journal to the stage it is in now, so it may start further along.

const B = '00000000-0000-4000-8000-000000000002';
const facts = (stage: BatchFacts['stage'], events: FactEvent[], startedOn = '2026-03-01'): BatchFacts => ({ batchId: B, startedOn, stage, events });

const racking = (id: string, on: string): FactEvent => ({ kind: 'racking', id, on });
const tasted = (id: string, on: string): FactEvent => ({ kind: 'tasted', id, on });
const bottled = (id: string, on: string): FactEvent => ({ kind: 'bottled', id, on });
const removed = (id: string, on: string, additionId: string): FactEvent => ({ kind: 'removed', id, on, additionId });
const addition = (id: string, on: string, category: string, name: string, removeOn: string | null = null): FactEvent => ({
  kind: 'addition',
  id,
  on,
  category,
  name,
  removeOn,
});

describe('stageStarts', () => {
  it('gives a batch never racked only its primary start', () => {
    const journal = [{ kind: 'reading', id: 'g1', on: '2026-03-08', sg: 1.05 } as const, tasted('t1', '2026-03-20')];
    expect(stageStarts(facts('primary', journal))).toEqual({ primary: '2026-03-01' });
  });

  it('puts a batch racked once into secondary on the racking day', () => {
    const journal = [tasted('t1', '2026-03-20'), racking('r1', '2026-04-01'), tasted('t2', '2026-04-15')];
    expect(stageStarts(facts('secondary', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01' });
  });

  it('starts bulk ageing at the second racking and keeps the first dates after a third', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), racking('r3', '2026-10-01')];
    expect(stageStarts(facts('bulk-ageing', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01', 'bulk-ageing': '2026-07-01' });
  });

  it('has a split taken from a racked batch in secondary from its start', () => {
    expect(stageStarts(facts('secondary', []))).toEqual({ primary: '2026-03-01', secondary: '2026-03-01' });
    expect(stageStarts(facts('secondary', [tasted('t1', '2026-03-10')]))).toEqual({ primary: '2026-03-01', secondary: '2026-03-01' });
  });

  it('has a split in secondary that is racked once more age in bulk from that racking', () => {
    const journal = [tasted('t1', '2026-04-01'), racking('r1', '2026-05-01')];
    expect(stageStarts(facts('bulk-ageing', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-03-01', 'bulk-ageing': '2026-05-01' });
  });

  it('has a blend that carries two rackings age in bulk from its start', () => {
    // Two rackings: the common-practice count for bulk ageing.
    const journal = [tasted('t1', '2026-04-01')];
    expect(stageStarts(facts('bulk-ageing', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-03-01', 'bulk-ageing': '2026-03-01' });
  });

  it('starts bulk ageing at a stabiliser added after the first racking', () => {
    const journal = [racking('r1', '2026-04-01'), addition('a1', '2026-05-01', 'stabiliser', 'Sulfite tablets'), racking('r2', '2026-07-01')];
    expect(stageStarts(facts('bulk-ageing', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01', 'bulk-ageing': '2026-05-01' });
  });

  it('ages a batch racked once and then stabilised in bulk from the stabiliser, carrying nothing from before', () => {
    const journal = [racking('r1', '2026-04-01'), addition('a1', '2026-05-01', 'stabiliser', 'Sulfite tablets')];
    expect(stageStarts(facts('bulk-ageing', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01', 'bulk-ageing': '2026-05-01' });
  });

  it('keeps a bottled batch racked once in primary until that racking, and never in bulk ageing', () => {
    const journal = [racking('r1', '2026-04-01'), bottled('b1', '2026-06-01')];
    expect(stageStarts(facts('bottled', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01', bottled: '2026-06-01' });
  });

  it('does not count a stabiliser added to the must before any racking', () => {
    // Sulfiting a must before pitching is common practice and leaves the batch in primary.
    const stabiliser = addition('a1', '2026-03-01', 'stabiliser', 'Sulfite');
    expect(stageStarts(facts('secondary', [stabiliser, racking('r1', '2026-04-01')]))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01' });
    expect(stageStarts(facts('bulk-ageing', [stabiliser, racking('r1', '2026-04-01'), racking('r2', '2026-07-01')]))).toEqual({
      primary: '2026-03-01',
      secondary: '2026-04-01',
      'bulk-ageing': '2026-07-01',
    });
  });

  it('does not start bulk ageing at fruit added after a racking', () => {
    const journal = [racking('r1', '2026-04-01'), addition('a1', '2026-05-01', 'fruit', 'Blackcurrants'), racking('r2', '2026-07-01')];
    expect(stageStarts(facts('bulk-ageing', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01', 'bulk-ageing': '2026-07-01' });
  });

  it('dates the bottling of a bottled or finished batch, not the entries after it', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), bottled('b1', '2026-10-01'), tasted('t1', '2026-11-01')];
    const expected = { primary: '2026-03-01', secondary: '2026-04-01', 'bulk-ageing': '2026-07-01', bottled: '2026-10-01' };
    expect(stageStarts(facts('bottled', journal))).toEqual(expected);
    expect(stageStarts(facts('finished', journal))).toEqual(expected);
  });

  it('takes the last bottling when a batch was bottled in parts', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), bottled('b1', '2026-09-01'), bottled('b2', '2026-10-01')];
    expect(stageStarts(facts('bottled', journal))).toEqual({
      primary: '2026-03-01',
      secondary: '2026-04-01',
      'bulk-ageing': '2026-07-01',
      bottled: '2026-10-01',
    });
  });

  it('does not count a partial bottling while liquid is still in vessels', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), bottled('b1', '2026-10-01')];
    expect(stageStarts(facts('bulk-ageing', journal))).toEqual({ primary: '2026-03-01', secondary: '2026-04-01', 'bulk-ageing': '2026-07-01' });
  });
});

describe('vesselsEnd', () => {
  it('is null while the batch is still in vessels, even after a partial bottling', () => {
    expect(vesselsEnd(facts('primary', [tasted('t1', '2026-03-20')]))).toBeNull();
    expect(vesselsEnd(facts('secondary', [racking('r1', '2026-04-01'), bottled('b1', '2026-05-01')]))).toBeNull();
    expect(vesselsEnd(facts('bulk-ageing', [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), bottled('b1', '2026-10-01')]))).toBeNull();
  });

  it('is the bottling day of a bottled batch, whatever was logged after it', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), bottled('b1', '2026-10-01'), tasted('t1', '2026-11-01')];
    expect(vesselsEnd(facts('bottled', journal))).toBe('2026-10-01');
  });

  it('is the last entry of a batch finished without a bottling (blended away or poured out)', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), tasted('t1', '2026-08-15')];
    expect(vesselsEnd(facts('finished', journal))).toBe('2026-08-15');
  });

  it('is the start of a finished batch with no entries', () => {
    expect(vesselsEnd(facts('finished', []))).toBe('2026-03-01');
  });

  it('goes by the stage starts it is given', () => {
    expect(vesselsEnd(facts('bottled', [bottled('b1', '2026-10-01')]), { primary: '2026-03-01', bottled: '2026-12-01' })).toBe('2026-12-01');
  });
});

describe('conditionSpans: the stages', () => {
  const twiceRacked = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01')];
  const twiceRackedThenBottled = [...twiceRacked, bottled('b1', '2026-10-01'), tasted('t1', '2026-11-01')];

  it('runs primary from the start until the first racking', () => {
    expect(conditionSpans(facts('secondary', [racking('r1', '2026-04-01')]), 'primary')).toEqual([
      { ref: 'primary', from: '2026-03-01', to: '2026-04-01' },
    ]);
  });

  it('keeps primary open while the batch is unracked', () => {
    expect(conditionSpans(facts('primary', [tasted('t1', '2026-03-20')]), 'primary')).toEqual([{ ref: 'primary', from: '2026-03-01', to: null }]);
  });

  it('gives a split that begins in secondary no primary span', () => {
    expect(conditionSpans(facts('secondary', []), 'primary')).toEqual([]);
  });

  it('gives a batch never racked no secondary span', () => {
    expect(conditionSpans(facts('primary', [tasted('t1', '2026-03-20')]), 'secondary')).toEqual([]);
  });

  it('keeps secondary open after one racking', () => {
    expect(conditionSpans(facts('secondary', [racking('r1', '2026-04-01')]), 'secondary')).toEqual([
      { ref: 'secondary', from: '2026-04-01', to: null },
    ]);
  });

  it('runs secondary from the first racking to the second', () => {
    expect(conditionSpans(facts('bulk-ageing', twiceRacked), 'secondary')).toEqual([{ ref: 'secondary', from: '2026-04-01', to: '2026-07-01' }]);
  });

  it('gives a blend that begins in bulk ageing no secondary span', () => {
    expect(conditionSpans(facts('bulk-ageing', [tasted('t1', '2026-04-01')]), 'secondary')).toEqual([]);
  });

  it('gives a batch in secondary no bulk-ageing span', () => {
    expect(conditionSpans(facts('secondary', [racking('r1', '2026-04-01')]), 'bulk-ageing')).toEqual([]);
  });

  it('keeps bulk ageing open while the batch is in vessels', () => {
    expect(conditionSpans(facts('bulk-ageing', twiceRacked), 'bulk-ageing')).toEqual([{ ref: 'bulk-ageing', from: '2026-07-01', to: null }]);
  });

  it('ends bulk ageing on the bottling day', () => {
    expect(conditionSpans(facts('bottled', twiceRackedThenBottled), 'bulk-ageing')).toEqual([
      { ref: 'bulk-ageing', from: '2026-07-01', to: '2026-10-01' },
    ]);
  });

  it('gives a blend bottled the day it began no bulk-ageing span', () => {
    expect(conditionSpans(facts('bottled', [bottled('b1', '2026-03-01')]), 'bulk-ageing')).toEqual([]);
  });
});

describe('conditionSpans: racked and in vessels', () => {
  it('gives a batch never racked no racked span', () => {
    expect(conditionSpans(facts('primary', [tasted('t1', '2026-03-20')]), 'racked')).toEqual([]);
  });

  it('counts a batch as racked from its first racking while it is in vessels', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01')];
    expect(conditionSpans(facts('bulk-ageing', journal), 'racked')).toEqual([{ ref: 'racked', from: '2026-04-01', to: null }]);
  });

  it('counts a split from a racked batch as racked from its start', () => {
    expect(conditionSpans(facts('secondary', []), 'racked')).toEqual([{ ref: 'racked', from: '2026-03-01', to: null }]);
  });

  it('ends racked when the batch is bottled', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), bottled('b1', '2026-10-01')];
    expect(conditionSpans(facts('bottled', journal), 'racked')).toEqual([{ ref: 'racked', from: '2026-04-01', to: '2026-10-01' }]);
  });

  it('gives a blend bottled the day it began no racked span', () => {
    expect(conditionSpans(facts('bottled', [bottled('b1', '2026-03-01')]), 'racked')).toEqual([]);
  });

  it('keeps a batch in vessels from its start while nothing has left', () => {
    expect(conditionSpans(facts('secondary', [racking('r1', '2026-04-01')]), 'in-vessels')).toEqual([
      { ref: 'in-vessels', from: '2026-03-01', to: null },
    ]);
  });

  it('gives a batch finished the day it began, with nothing logged, no in-vessels span', () => {
    expect(conditionSpans(facts('finished', []), 'in-vessels')).toEqual([]);
  });

  it('ends in-vessels on the bottling day, or on the last entry of a batch blended away', () => {
    const journal = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), bottled('b1', '2026-10-01')];
    expect(conditionSpans(facts('bottled', journal), 'in-vessels')).toEqual([{ ref: 'in-vessels', from: '2026-03-01', to: '2026-10-01' }]);
    expect(conditionSpans(facts('finished', [racking('r1', '2026-04-01'), tasted('t1', '2026-08-15')]), 'in-vessels')).toEqual([
      { ref: 'in-vessels', from: '2026-03-01', to: '2026-08-15' },
    ]);
  });
});

describe('conditionSpans: oak in', () => {
  it('keeps oak in until it is taken out, however long, and a planned take-out date alone does not end it', () => {
    const journal = [racking('r1', '2026-04-01'), addition('k1', '2026-04-10', 'oak', 'Oak spiral', '2026-05-10')];
    expect(conditionSpans(facts('secondary', journal), 'oak-in')).toEqual([
      {
        ref: 'k1',
        from: '2026-04-10',
        to: null,
        addition: { kind: 'addition', id: 'k1', on: '2026-04-10', category: 'oak', name: 'Oak spiral', removeOn: '2026-05-10' },
      },
    ]);
  });

  it('ends each oak addition on its own removal, not on another addition’s', () => {
    const journal = [
      racking('r1', '2026-04-01'),
      addition('k1', '2026-04-10', 'oak', 'Oak spiral'),
      addition('k2', '2026-05-01', 'oak', 'Toasted oak cubes'),
      removed('x2', '2026-05-20', 'k2'),
      removed('x1', '2026-06-15', 'k1'),
    ];
    expect(conditionSpans(facts('secondary', journal), 'oak-in')).toEqual([
      {
        ref: 'k1',
        from: '2026-04-10',
        to: '2026-06-15',
        addition: { kind: 'addition', id: 'k1', on: '2026-04-10', category: 'oak', name: 'Oak spiral', removeOn: null },
      },
      {
        ref: 'k2',
        from: '2026-05-01',
        to: '2026-05-20',
        addition: { kind: 'addition', id: 'k2', on: '2026-05-01', category: 'oak', name: 'Toasted oak cubes', removeOn: null },
      },
    ]);
  });

  it('gives fruit and stabiliser additions no oak span', () => {
    const journal = [
      racking('r1', '2026-04-01'),
      addition('f1', '2026-04-10', 'fruit', 'Blackcurrants', '2026-04-20'),
      addition('s1', '2026-05-01', 'stabiliser', 'Sorbate'),
      removed('x1', '2026-04-20', 'f1'),
    ];
    expect(conditionSpans(facts('bulk-ageing', journal), 'oak-in')).toEqual([]);
  });

  it('ends oak on the bottling day, or on its removal when that came first', () => {
    const spiral = addition('k1', '2026-08-01', 'oak', 'Oak spiral');
    const spiralIn = (to: string) => [{ ref: 'k1', from: '2026-08-01', to, addition: spiral }];
    const rackedThenOak = [racking('r1', '2026-04-01'), racking('r2', '2026-07-01'), spiral];
    const bottling = bottled('b1', '2026-10-01');
    expect(conditionSpans(facts('bottled', [...rackedThenOak, bottling]), 'oak-in')).toEqual(spiralIn('2026-10-01'));
    // A removal logged after the bottling does not reach past it.
    expect(conditionSpans(facts('bottled', [...rackedThenOak, bottling, removed('x1', '2026-10-05', 'k1')]), 'oak-in')).toEqual(
      spiralIn('2026-10-01'),
    );
    expect(conditionSpans(facts('bottled', [...rackedThenOak, removed('x1', '2026-09-01', 'k1'), bottling]), 'oak-in')).toEqual(
      spiralIn('2026-09-01'),
    );
  });

  it('gives oak taken out the same day it went in no span', () => {
    const journal = [racking('r1', '2026-04-01'), addition('k1', '2026-04-10', 'oak', 'Oak spiral'), removed('x1', '2026-04-10', 'k1')];
    expect(conditionSpans(facts('secondary', journal), 'oak-in')).toEqual([]);
  });
});
