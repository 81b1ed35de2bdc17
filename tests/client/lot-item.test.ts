import { afterEach, describe, expect, it } from 'vitest';
import { bottleLotSchema } from '@shared/schemas/bottles';
import LotItem from '@/components/bottles/LotItem.vue';
import { fakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

const lot = bottleLotSchema.parse({
  id: '3b9c1f0e-7a2d-4e8b-9c1d-2f3e4a5b6c7d',
  code: 'LOTCODE1',
  batchId: BATCH_ID,
  batchName: 'Test cider',
  batchKind: 'cider',
  bottledOn: '2026-05-08',
  bottleMl: 500,
  bottleCount: 12,
  bottlesLeft: 12,
  closure: 'crown-cap',
  carbonation: 'still',
  sulfiteAdded: false,
  abvEstimate: 6.1,
  note: '',
  cases: [],
});

afterEach(() => {
  document.body.innerHTML = '';
  localStorage.clear();
});

// A bottle keeps its size in mL on the Bottles page as in the bottling dialog; US units add fluid ounces:
// 500 mL ÷ 29.5735295625 mL/US fl oz = 16.9 (NIST Handbook 44, Appendix C).
describe('a bottle lot on the Bottles page', () => {
  it.each([
    ['metric', '500 mL bottles'],
    ['us', '16.9 US fl oz (500 mL) bottles'],
  ])('in %s units names its bottle size as "%s"', async (units, words) => {
    localStorage.setItem('cellarwright.units', units);
    signIn(fakeApi());
    await mountInApp(LotItem, `/c/${CELLAR_ID}/bottles`, { props: { lot, expanded: false, canHand: true } });
    expect(document.querySelector(`[data-test=lot-${lot.code}]`)?.textContent).toContain(words);
  });
});
