import { afterEach, describe, expect, it } from 'vitest';
import type { Vessel } from '@shared/schemas/vessels';
import VesselCard from '@/components/vessels/VesselCard.vue';
import { fakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, signIn, vessel } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

/** A 30 L bucket holding 20 L: (30 − 20) / 30 = 33.3 % headspace. */
const bucket = (stage: string): Vessel => vessel({ batch: { id: BATCH_ID, name: 'Test melomel', kind: 'melomel', stage } });

afterEach(() => {
  document.body.innerHTML = '';
});

// Primary needs room for its foam and its own gas protects it; headspace matters from the first racking (common practice).
describe('a vessel in the phone’s list', () => {
  it.each([
    ['primary', false],
    ['secondary', true],
    ['bulk-ageing', true],
  ])('with its batch in %s, warns of its 33.3 per cent headspace: %s', async (stage, warned) => {
    signIn(fakeApi());
    await mountInApp(VesselCard, `/c/${CELLAR_ID}/vessels`, { props: { vessel: bucket(stage), warnPercent: 5 } });
    const figure = pick('[data-test=vessel-card-headspace]');
    // No-break spaces keep the figure, its sign and its word on one line on a narrow card.
    expect(figure.textContent).toContain('33.3\u00a0%\u00a0headspace');
    expect(figure.classList.contains('text-negative')).toBe(warned);
    // A no-break space before every dot on the card: a line may end with a dot, never start with one.
    expect(pick('.vessel-card__link').textContent).not.toMatch(/[ \t\n]\u00a0?·/);
  });
});
