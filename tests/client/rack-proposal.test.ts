import { afterEach, describe, expect, it } from 'vitest';
import RackProposal from '@/components/operations/RackProposal.vue';
import { fillHeadspaceHint } from '@/components/operations/vessel-words';
import { fakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, signIn, vessel } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

afterEach(() => {
  document.body.innerHTML = '';
});

/**
 * 18 L racked into a 19 L keg, about 0.48 L left on the lees: 17.52 L go in, leaving
 * 19 − 17.52 = 1.48 L of air, 1.48 / 19 = 7.79 % of the keg (worked by hand).
 */
describe('the proposed vessels for a racking', () => {
  it('give the headspace to the same tenth of a per cent as the fill below them', async () => {
    signIn(fakeApi());
    const keg = vessel({ name: 'Keg 1', capacityL: 19, material: 'stainless' });
    const set = {
      fills: [{ vessel: keg, fillL: 17.52 }],
      lossL: 0.48,
      volumeAfterLossL: 17.52,
      headspaceL: 1.48,
      headspacePercent: (1.48 / 19) * 100,
    };
    await mountInApp(RackProposal, `/c/${CELLAR_ID}/batches/${BATCH_ID}`, { props: { proposal: null, set, loading: false } });
    const why = pick('[data-test=rack-proposal-why]').textContent!;
    expect(why).toContain('1.48 L (7.8\u00a0%)');
    // The fill's own hint for the same vessel and volume says the same figure.
    expect(fillHeadspaceHint(19, 17.52, (l) => `${l.toFixed(2)} L`)).toBe('Headspace 1.48 L (7.8\u00a0%)');
  });
});
