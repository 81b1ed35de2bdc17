import { afterEach, describe, expect, it } from 'vitest';
import type { LabelChoices } from '@shared/schemas/labels';
import LabelLotList from '@/components/labels/LabelLotList.vue';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, signIn } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

afterEach(() => {
  document.body.innerHTML = '';
});

const CASE_1 = '6f1e2d3c-4b5a-4968-8776-655443322110';
const CASE_2 = '7a2f3e4d-5c6b-4a79-8887-766554433221';
const lot: LabelChoices['lots'][number] = {
  id: '9b3a4f5e-6d7c-4b8a-9998-877665544332',
  code: 'LOTCODE1',
  batchName: 'Quince Cyser',
  bottledOn: '2026-05-09',
  bottleMl: 750,
  cases: [
    { id: CASE_1, code: 'CASECOD1', number: 1, bottlesLeft: 12 },
    { id: CASE_2, code: 'CASECOD2', number: 2, bottlesLeft: 1 },
  ],
};

async function mountList(lotCases: string | null) {
  signIn(fakeApi());
  const props = { lots: [lot], selectedCases: [], selectedLots: [], lotCases, empty: 'No lots yet.' };
  return (await mountInApp(LabelLotList, `/c/${CELLAR_ID}/labels`, { props })).wrapper;
}

const button = (label: string) => [...document.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.trim() === label)!;

describe('picking a lot’s cases for labels', () => {
  it('"All cases" picks every case of the lot', async () => {
    const wrapper = await mountList(null);
    pick('[data-test=pick-lot-cases-LOTCODE1]').click();
    expect(wrapper.emitted('toggle-cases')).toEqual([[[CASE_1, CASE_2], true]]);
    expect(wrapper.emitted('unfold')).toBeUndefined();
  });

  it('"None" on a lot picked whole first turns it into its cases, then leaves them all out', async () => {
    const wrapper = await mountList(lot.id);
    button('None').click();
    expect(wrapper.emitted('unfold')).toEqual([[[CASE_1, CASE_2]]]);
    expect(wrapper.emitted('toggle-cases')).toEqual([[[CASE_1, CASE_2], false]]);
  });

  it('words each case with its code after a no-break space and a dot', async () => {
    await mountList(null);
    expect(pick('[data-test=pick-case-CASECOD2]').textContent).toContain('Case 2\u00a0· CASECOD2');
    expect(pick('[data-test=pick-case-CASECOD2]').textContent).toContain('1 bottle left');
  });
});
