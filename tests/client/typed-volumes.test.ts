import { describe, expect, it } from 'vitest';
import { defineComponent, h } from 'vue';
import { useFormat } from '@/composables/useFormat';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

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
});
