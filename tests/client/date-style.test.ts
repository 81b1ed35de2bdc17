import { beforeEach, describe, expect, it } from 'vitest';
import { DOMWrapper, flushPromises } from '@vue/test-utils';
import { defineComponent, h, ref, type Ref } from 'vue';
import DateField from '@/components/DateField.vue';
import DateStyleChoice from '@/components/DateStyleChoice.vue';
import { datesInStyle, formatDateInStyle, parseDateInStyle } from '@/composables/date-style';
import { useFormat } from '@/composables/useFormat';
import { usePreferencesStore } from '@/stores/preferences';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, signIn } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

/** A DateField bound to a ref, as a form binds it. */
function mountDateField(value: Ref<string>, label: string) {
  const Harness = defineComponent({
    setup: () => () => h(DateField, { modelValue: value.value, label, 'onUpdate:modelValue': (v: string) => (value.value = v) }),
  });
  return mountInApp(Harness, `/c/${CELLAR_ID}/tasks`);
}

// 2 December 2026 written in each style the user can choose.
describe('date styles', () => {
  it.each([
    ['d-mmm-yyyy', '2 Dec 2026'],
    ['dd/mm/yyyy', '02/12/2026'],
    ['mm/dd/yyyy', '12/02/2026'],
    ['yyyy-mm-dd', '2026-12-02'],
  ] as const)('%s writes 2026-12-02 as %s and reads it back', (style, shown) => {
    expect(formatDateInStyle('2026-12-02', style)).toBe(shown);
    expect(parseDateInStyle(shown, style)).toBe('2026-12-02');
  });

  it('refuses dates that do not exist or are written in another style', () => {
    expect(parseDateInStyle('31/02/2026', 'dd/mm/yyyy')).toBeNull();
    expect(parseDateInStyle('13/25/2026', 'mm/dd/yyyy')).toBeNull();
    expect(parseDateInStyle('2026-12-02', 'dd/mm/yyyy')).toBeNull();
    expect(parseDateInStyle('2 Dez 2026', 'd-mmm-yyyy')).toBeNull();
  });

  it('reads month names in any case, short or long', () => {
    expect(parseDateInStyle('2 december 2026', 'd-mmm-yyyy')).toBe('2026-12-02');
    expect(parseDateInStyle('29 Feb 2024', 'd-mmm-yyyy')).toBe('2024-02-29');
  });

  it('rewrites the ISO dates of a server message in the style, timestamps by their date', () => {
    expect(datesInStyle('The batch started on 2026-05-03; nothing can happen before it.', 'dd/mm/yyyy')).toBe(
      'The batch started on 03/05/2026; nothing can happen before it.',
    );
    expect(datesInStyle('Racked 2026-05-03T10:00:00.000Z.', 'd-mmm-yyyy')).toBe('Racked 3 May 2026.');
  });
});

describe('dates follow the chosen style', () => {
  beforeEach(() => {
    localStorage.clear();
    signIn(fakeApi());
  });

  it('useFormat shows dates in the style the user chose', async () => {
    await mountInApp(DateStyleChoice, `/c/${CELLAR_ID}/tasks`);
    const fmt = useFormat();
    expect(fmt.date('2026-12-02')).toBe('2 Dec 2026');
    usePreferencesStore().setDateStyle('mm/dd/yyyy');
    expect(fmt.date('2026-12-02')).toBe('12/02/2026');
    expect(localStorage.getItem('cellarwright.dateStyle')).toBe('mm/dd/yyyy');
  });

  it('DateField shows and takes the date in the style and hands on YYYY-MM-DD', async () => {
    localStorage.setItem('cellarwright.dateStyle', 'dd/mm/yyyy');
    const value = ref('2026-05-03');
    await mountDateField(value, 'When');
    const input = pick<HTMLInputElement>('input');
    expect(input.value).toBe('03/05/2026');

    await new DOMWrapper(input).setValue('24/12/2026');
    expect(value.value).toBe('2026-12-24');

    // A date the style cannot read stays in the field with a hint, and is not taken as a date.
    await new DOMWrapper(input).setValue('12/24/2026');
    await flushPromises();
    expect(value.value).toBe('12/24/2026');
    expect(document.body.textContent).toContain('Write the date as dd/mm/yyyy (e.g. 02/12/2026), or pick it on the calendar.');
  });

  it('DateField shows the pattern when empty, never a date, and an example once a date cannot be read', async () => {
    // The default style. A dated placeholder read like a day gone by in a field for a day to come.
    const value = ref('');
    await mountDateField(value, 'Take out on');
    const input = pick<HTMLInputElement>('input');
    expect(input.placeholder).toBe('d mmm yyyy');

    await new DOMWrapper(input).setValue('30 Feb 2027');
    await flushPromises();
    expect(value.value).toBe('30 Feb 2027');
    expect(document.body.textContent).toContain('Write the date as d mmm yyyy (e.g. 2 Dec 2026), or pick it on the calendar.');
  });
});
