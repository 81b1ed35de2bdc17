import { describe, it, expect } from 'vitest';
import { ANTIMICROBIAL_SPICES, CAUTION_SPICE_IN_PRIMARY, isAntimicrobialSpice, spiceCaution } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// Common practice: cinnamon and clove (and allspice, which shares clove's eugenol) are
// strongly antimicrobial; makers add them in secondary, not while the yeast is at work.
describe('spices that hold back yeast', () => {
  it('lists cinnamon, cassia, clove and allspice', () => {
    expect(ANTIMICROBIAL_SPICES).toEqual(['cinnamon', 'cassia', 'clove', 'allspice']);
  });

  it.each(['Cinnamon', 'Ceylon cinnamon sticks', 'Whole cloves', 'clove', 'ALLSPICE berries', 'cassia bark', 'cinnamon/vanilla mix'])(
    '"%s" is one',
    (name) => {
      expect(isAntimicrobialSpice(name)).toBe(true);
    },
  );

  it.each(['Vanilla bean', 'Oak cubes', 'Cloverleaf honey', 'Spice mix', 'Ginger', ''])('"%s" is not', (name) => {
    expect(isAntimicrobialSpice(name)).toBe(false);
  });
});

describe('spiceCaution', () => {
  it('cautions against cinnamon or clove added in primary', () => {
    expect(spiceCaution('Cinnamon sticks', 'primary')).toBe(CAUTION_SPICE_IN_PRIMARY);
    expect(spiceCaution('3 cloves', 'primary')).toBe(CAUTION_SPICE_IN_PRIMARY);
  });

  it('says nothing in secondary or later, or for other additions', () => {
    expect(spiceCaution('Cinnamon sticks', 'secondary')).toBeNull();
    expect(spiceCaution('Cinnamon sticks', 'bulk-ageing')).toBeNull();
    expect(spiceCaution('Vanilla bean', 'primary')).toBeNull();
  });

  it('has a short caution that names the risk and the usual practice', () => {
    expect(CAUTION_SPICE_IN_PRIMARY).toMatch(/slow or stop the yeast/);
    expect(CAUTION_SPICE_IN_PRIMARY).toMatch(/usually added in secondary/);
    expect(CAUTION_SPICE_IN_PRIMARY.length).toBeLessThan(200);
  });

  it('rejects a name or stage that is not text', () => {
    expectInputError(() => spiceCaution(3 as never, 'primary'), 'name', 'Name of the addition must be text.');
    expectInputError(() => spiceCaution('Cinnamon', null as never), 'stage', 'Stage of the batch must be text.');
    expectInputError(() => isAntimicrobialSpice(undefined as never), 'name');
  });
});
