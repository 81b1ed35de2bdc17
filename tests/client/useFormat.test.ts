import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { useFormat } from '@/composables/useFormat';
import { useUnits } from '@/composables/useUnits';
import { useCellarStore } from '@/stores/cellar';
import { fakeApi, type FakeApi } from './support/fake-api';
import { CELLAR_ID, cellarSettings } from './support/fixtures';

/** The US gallon is 231 cubic inches and the inch 2.54 cm exactly: 231 × 2.54³ cm³ = 3785.411784 cm³. */
const LITRES_PER_US_GALLON = 3.785411784;

describe('useUnits and useFormat', () => {
  let api: FakeApi;

  beforeEach(() => {
    setActivePinia(createPinia());
    api = fakeApi();
  });

  /** Loads the open cellar's settings the way the layout does, from the (faked) API. */
  async function openCellar(unitSystem: 'metric' | 'us'): Promise<void> {
    api.on('GET', `/api/cellars/${CELLAR_ID}/settings`, { body: cellarSettings(unitSystem) });
    await useCellarStore().load(CELLAR_ID);
  }

  it('shows metric figures before any cellar is open', () => {
    const fmt = useFormat();
    expect(fmt.system.value).toBe('metric');
    expect(fmt.volumeUnit.value).toBe('L');
    expect(fmt.volume(19)).toBe('19 L');
    expect(fmt.volume(0.75)).toBe('750 mL');
    expect(fmt.temperature(18.5)).toBe('18.5 °C');
    expect(fmt.volume(null)).toBe('—');
    expect(fmt.gravity(1.0504)).toBe('1.050');
  });

  it('follows the cellar’s US setting: volumes in US gallons, temperatures in °F', async () => {
    await openCellar('us');
    const fmt = useFormat();
    expect(fmt.system.value).toBe('us');
    expect(fmt.volumeUnit.value).toBe('US gal');
    expect(fmt.volume(5 * LITRES_PER_US_GALLON)).toBe('5 US gal');
    // 19 L / 3.785411784 = 5.019 US gal, shown to two decimals below 10.
    expect(fmt.volume(19)).toBe('5.02 US gal');
    // °F = °C × 9/5 + 32: 20 °C is 68 °F, 18 °C is 64.4 °F.
    expect(fmt.temperature(20)).toBe('68 °F');
    expect(fmt.temperature(18)).toBe('64.4 °F');
  });

  it('converts what the user types in their unit to litres and back', async () => {
    await openCellar('us');
    const fmt = useFormat();
    expect(fmt.toLitres(5)).toBeCloseTo(5 * LITRES_PER_US_GALLON, 9);
    expect(fmt.fromLitres(LITRES_PER_US_GALLON)).toBe(1);
    // Inputs are filled to two decimals: 23 L = 6.076 US gal.
    expect(fmt.fromLitres(23)).toBe(6.08);
  });

  it('lets this device’s choice win over the cellar’s, and remembers it on the device', async () => {
    await openCellar('us');
    const units = useUnits();
    units.setSystem('metric');
    expect(useFormat().volume(19)).toBe('19 L');

    // A fresh start on the same device (new Pinia) still shows metric.
    setActivePinia(createPinia());
    await openCellar('us');
    expect(useUnits().system.value).toBe('metric');
  });
});
