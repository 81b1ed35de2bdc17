import { DOMWrapper, flushPromises } from '@vue/test-utils';
import { describe, expect, it, vi } from 'vitest';
import { defineComponent, h } from 'vue';
import VesselForm from '@/components/vessels/VesselForm.vue';
import { useFormat } from '@/composables/useFormat';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, signIn } from './support/fixtures';
import { fieldMessage, mountInApp, pick } from './support/mount-in-app';

describe('typed volumes', () => {
  it('converts a negative volume instead of failing while the form is drawn', async () => {
    let fmt!: ReturnType<typeof useFormat>;
    const Probe = defineComponent({
      setup() {
        fmt = useFormat();
        return () => h('div');
      },
    });
    const api = fakeApi();
    signIn(api);
    await mountInApp(Probe, `/c/${CELLAR_ID}/tasks`);
    expect(() => fmt.toLitres(-2)).not.toThrow();
    expect(fmt.toLitres(-2)).toBeLessThan(0);
    expect(Number.isNaN(fmt.toLitres(Number.NaN))).toBe(true);
  });

  it('gives a vessel’s capacity limit in the gallons it was typed in, and sends nothing', async () => {
    localStorage.setItem('cellarwright.units', 'us');
    try {
      const api = fakeApi();
      signIn(api, 'keeper');
      await mountInApp(VesselForm, `/c/${CELLAR_ID}/vessels`, { props: { modelValue: true } });
      await vi.waitFor(() => pick('[data-test=vessel-capacity]'));
      await new DOMWrapper(pick<HTMLInputElement>('[data-test=vessel-name]')).setValue('Tote 1');
      // 6000 US gal is 22 712 L, past the schema's 20 000 L; 20 000 L ÷ 3.785411784 L/gal = 5283.4 US gal (NIST Handbook 44, Appendix C).
      await new DOMWrapper(pick<HTMLInputElement>('[data-test=vessel-capacity]')).setValue('6000');
      pick('[data-test=save-vessel]').click();
      await flushPromises();
      expect(fieldMessage('[data-test=vessel-capacity]')).toBe('at most 5283 US gal');
      expect(api.calls.filter((c) => c.method === 'POST')).toEqual([]);
    } finally {
      localStorage.removeItem('cellarwright.units');
    }
  });
});
