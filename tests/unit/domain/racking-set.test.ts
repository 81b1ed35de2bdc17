import { describe, expect, it } from 'vitest';
import { MAX_VESSELS_IN_SET, proposeRackingSet } from '../../../shared/domain/racking-set';

// The expected loss is the cellar's racking rule (common practice, shared/calc vessels.ts):
// 0.03 L fixed plus 4 % of the volume at a primary racking, 2.5 % at a secondary one. Each case
// works the loss and the headspace out by hand below.
const keg = { id: 'keg', name: 'Keg 19', capacityL: 19 };
const jugA = { id: 'jug-a', name: 'Jug A', capacityL: 4.5 };
const jugB = { id: 'jug-b', name: 'Jug B', capacityL: 4.5 };
const jug5 = { id: 'jug-5', name: 'Jug 5', capacityL: 5 };
const free = [keg, jugA, jugB, jug5];

describe('proposeRackingSet', () => {
  it('4.1 L from primary goes into one 4.5 L jug, not the 19 L keg', () => {
    // Loss 0.03 + 0.04 × 4.1 = 0.194 L; 3.906 L into 4.5 L leaves 0.594 L = 13.2 % headspace.
    const p = proposeRackingSet(4.1, free, 'primary')!;
    expect(p.fills.map((f) => [f.vessel.id, f.fillL])).toEqual([['jug-a', expect.closeTo(3.906, 6)]]);
    expect(p.lossL).toBeCloseTo(0.194, 6);
    expect(p.headspaceL).toBeCloseTo(0.594, 6);
    expect(p.headspacePercent).toBeCloseTo(13.2, 6);
  });

  it('8.6 L goes into the two 4.5 L jugs rather than the keg', () => {
    // Loss 0.03 + 0.025 × 8.6 = 0.245 L; 8.355 L into 9 L leaves 0.645 L, all in the jug filled last.
    const p = proposeRackingSet(8.6, free, 'secondary')!;
    expect(p.fills.map((f) => f.vessel.id).sort()).toEqual(['jug-a', 'jug-b']);
    expect(p.fills[0]!.fillL).toBeCloseTo(3.855, 6);
    expect(p.fills[1]!.fillL).toBe(4.5);
    expect(p.headspaceL).toBeCloseTo(0.645, 6);
    expect(p.headspacePercent).toBeCloseTo((0.645 / 4.5) * 100, 6);
  });

  it('9.3 L goes into the 5 L and a 4.5 L jug; the larger takes the part fill', () => {
    // Loss 0.03 + 0.025 × 9.3 = 0.2625 L; 9.0375 L needs more than two 4.5 L jugs (9 L).
    // 4.5 + 5 = 9.5 L leaves 0.4625 L, 9.25 % of the 5 L jug.
    const p = proposeRackingSet(9.3, free, 'secondary')!;
    expect(p.fills.map((f) => f.vessel.id)).toEqual(['jug-5', 'jug-a']);
    expect(p.fills[0]!.fillL).toBeCloseTo(4.5375, 6);
    expect(p.headspaceL).toBeCloseTo(0.4625, 6);
    expect(p.headspacePercent).toBeCloseTo(9.25, 6);
  });

  it('20 L goes into the keg and a jug when no single vessel holds it', () => {
    // Loss 0.03 + 0.025 × 20 = 0.53 L; 19.47 L: keg + 4.5 L jug = 23.5 L leaves 4.03 L.
    const p = proposeRackingSet(20, free, 'secondary')!;
    expect(p.fills.map((f) => f.vessel.id)).toEqual(['keg', 'jug-a']);
    expect(p.headspaceL).toBeCloseTo(4.03, 6);
  });

  it('prefers one vessel to two of the same total room', () => {
    const nine = { id: 'nine', name: 'Demijohn 9', capacityL: 9 };
    // Loss 0.03 + 0.025 × 8.8 = 0.25 L; 8.55 L fits 9 L either way.
    const p = proposeRackingSet(8.8, [jugA, jugB, nine], 'secondary')!;
    expect(p.fills.map((f) => f.vessel.id)).toEqual(['nine']);
  });

  it('between sets of the same room and count, takes the one with the smaller sizes, whatever the list order', () => {
    const sizes = [5, 4, 7, 2].map((capacityL) => ({ id: `v${capacityL}`, name: `Vessel ${capacityL}`, capacityL }));
    // Loss 0.03 + 0.025 × 9.056 = 0.2564 L; 8.7996 L: 2 + 7 and 4 + 5 both make 9 L in two vessels.
    const p = proposeRackingSet(9.056, sizes, 'secondary')!;
    expect(p.fills.map((f) => f.vessel.id)).toEqual(['v7', 'v2']);
  });

  it('counts to the millilitre: a vessel that holds the volume after loss to within half a millilitre is taken', () => {
    // 0.975 × V − 0.03 = 4.5000004 L for V = 4.6461542…: rounds to 4500 mL, which the 4.5 L jug holds.
    const p = proposeRackingSet(4.6461542, [jugA, jug5], 'secondary')!;
    expect(p.fills.map((f) => [f.vessel.id, f.fillL])).toEqual([['jug-a', 4.5]]);
    expect(p.headspaceL).toBe(0);
    // 4.5012 L after loss does not fit it.
    expect(proposeRackingSet(4.6474, [jugA, jug5], 'secondary')!.fills[0]!.vessel.id).toBe('jug-5');
  });

  it('proposes nothing for a volume the loss takes whole', () => {
    // 0.02 L: the fixed 0.03 L loss is more than all of it.
    expect(proposeRackingSet(0.02, free, 'secondary')).toBeNull();
  });

  it('proposes nothing when no set of at most the allowed number of vessels holds it', () => {
    expect(MAX_VESSELS_IN_SET).toBe(4);
    // 19 + 4.5 + 4.5 + 5 = 33 L for 40 L less a 1.03 L loss.
    expect(proposeRackingSet(40, free, 'secondary')).toBeNull();
    const bottles = [1, 2, 3, 4, 5].map((n) => ({ id: `b${n}`, name: `Bottle ${n}`, capacityL: 1 }));
    // Loss 0.03 + 0.025 × 5 = 0.155 L; 4.845 L would take five 1 L vessels.
    expect(proposeRackingSet(5, bottles, 'secondary')).toBeNull();
    expect(proposeRackingSet(4, [], 'secondary')).toBeNull();
  });
});
