import { beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import {
  abvBy,
  abvHighGravity,
  abvSimple,
  brixToSg,
  CalcInputError,
  CAUTION_ESTIMATE,
  CAUTION_SULFITES,
  FORMULA_SOURCES,
  fermentableForGravity,
  formatMass,
  headspace,
  litresFrom,
  litresTo,
  tidyNumber,
} from '../../shared/calc';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

/** The message the shared library gives for input it rejects. */
function libraryMessage(compute: () => unknown): string {
  try {
    compute();
  } catch (err) {
    if (err instanceof CalcInputError) return err.message;
    throw err;
  }
  throw new Error('expected the library to reject this input');
}

/**
 * Everything a calculator field shows: label, unit suffix and the message under it. The data-test
 * attribute lands on the native input (where Quasar puts attributes), so read its q-field box.
 */
function fieldText(page: Page, test: string): Promise<string | null> {
  return page.locator('.q-field', { has: page.locator(`input[data-test=${test}]`) }).textContent();
}

describeInBrowser('Calculators page, in Chromium', (env) => {
  let crew: CellarCrew;
  beforeAll(async () => {
    crew = await makeCellarWithCrew(env().ds, 'Calculator test cellar');
  });

  /** Signs in as the hand on a phone-sized screen and opens the Calculators page in metric units. */
  async function openCalculators(): Promise<Page> {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/calculators`);
    await page.waitForSelector('[data-test=abv-og]');
    await page.click('[data-test=units-metric]');
    return page;
  }

  async function close(page: Page): Promise<void> {
    await page.evaluate(() => localStorage.clear());
    await page.close();
    await env().context.clearCookies();
  }

  it('works out ABV as the figures are typed, exactly as the shared library does', async () => {
    const page = await openCalculators();
    // Numbers get the phone's decimal keyboard.
    expect(await page.getAttribute('[data-test=abv-og]', 'inputmode')).toBe('decimal');
    await page.fill('[data-test=abv-og]', '1.085');
    await page.fill('[data-test=abv-fg]', '0.998');

    const balling = abvBy(1.085, 0.998);
    const simple = abvSimple(1.085, 0.998);
    await expect.poll(() => page.getAttribute('[data-test=abv-result]', 'data-value')).toBe(String(balling));
    expect(await page.textContent('[data-test=abv-result]')).toBe(`${balling.toFixed(1)} % ABV`);
    expect(await page.getAttribute('[data-test=abv-simple]', 'data-value')).toBe(String(simple));
    expect(await page.textContent('[data-test=abv-simple]')).toBe(`${simple.toFixed(1)} % ABV`);
    // The definition of the simple formula, worked by hand: (1.085 − 0.998) × 131.25 = 11.41875.
    expect(Number(await page.getAttribute('[data-test=abv-simple]', 'data-value'))).toBeCloseTo(11.41875, 9);

    // Footnote names the formula and its source; the estimate caution sits beside the result.
    const card = (await page.textContent('[data-test=calc-abv]')) ?? '';
    expect(card).toContain(FORMULA_SOURCES.abvBalling.name);
    expect(card).toContain(FORMULA_SOURCES.abvBalling.source);
    expect(await page.textContent('[data-test=calc-abv] [data-test=caution-estimate]')).toContain(CAUTION_ESTIMATE);
    // The sulfite caution stands beside the stabiliser doses.
    expect(await page.textContent('[data-test=calc-stabiliser] [data-test=caution-sulfites]')).toContain(CAUTION_SULFITES);

    const text = (await page.textContent('body')) ?? '';
    expect(text).not.toMatch(/NaN|Infinity/);
    await close(page);
  });

  it('converts °Brix to specific gravity, matching a published table value', async () => {
    const page = await openCalculators();
    await page.click('[data-test=gravity-scale-brix]');
    await page.fill('[data-test=gravity-value]', '40');

    await expect.poll(() => page.getAttribute('[data-test=gravity-sg]', 'data-value')).toBe(String(brixToSg(40)));
    // 40 °Bx is SG 1.17874 (20/20 °C): NBS Circular C440 sucrose table, as quoted in the Wikipedia
    // article "Brix" ("Tables": the polynomial "should not be used above S = 1.17874 (40 °Bx)").
    const sg = Number(await page.getAttribute('[data-test=gravity-sg]', 'data-value'));
    expect(Math.abs(sg - 1.17874)).toBeLessThan(0.0001);
    expect(await page.textContent('[data-test=gravity-sg]')).toBe('1.179');
    await close(page);
  });

  it("shows the library's own message under the field for impossible input, and a neutral hint for an empty one", async () => {
    const page = await openCalculators();
    await page.fill('[data-test=abv-og]', '1.100');
    await page.fill('[data-test=abv-fg]', '1.150');

    const aboveOg = libraryMessage(() => abvHighGravity(1.1, 1.15));
    await expect.poll(() => fieldText(page, 'abv-fg')).toContain(aboveOg);
    expect(await fieldText(page, 'abv-og')).not.toContain(aboveOg);
    expect(await page.locator('[data-test=abv-result]').count()).toBe(0);

    // Text that is not a number is handed to the library, which names it.
    await page.fill('[data-test=abv-fg]', '1.010');
    await page.fill('[data-test=abv-og]', '1.1x');
    const notANumber = libraryMessage(() => abvHighGravity('1.1x' as unknown as number, 1.01));
    await expect.poll(() => fieldText(page, 'abv-og')).toContain(notANumber);

    // An empty field is not an error: a hint, no message, no NaN.
    await page.fill('[data-test=abv-og]', '');
    await expect.poll(() => page.textContent('[data-test=abv-outcome]')).toContain('Enter the original and final gravity.');
    // Quasar fades the old message out (its text, then its alert element), so wait for both to go.
    await expect.poll(() => fieldText(page, 'abv-og')).not.toContain(notANumber);
    await expect.poll(() => page.locator('[data-test=calc-abv] [role=alert]').count()).toBe(0);

    // A volume larger than the vessel: the message comes from the headspace computation.
    await page.fill('[data-test=head-capacity]', '23');
    await page.fill('[data-test=head-volume]', '25');
    const overfull = libraryMessage(() => headspace({ capacityL: 23, volumeL: 25 }));
    await expect.poll(() => fieldText(page, 'head-volume')).toContain(overfull);

    expect((await page.textContent('body')) ?? '').not.toMatch(/NaN|Infinity/);
    await close(page);
  });

  it('switches to US units: volumes are typed in gallons, results follow, and the choice is remembered', async () => {
    const page = await openCalculators();
    expect(await page.inputValue('[data-test=honey-volume]')).toBe('20');
    expect(await fieldText(page, 'honey-volume')).toContain('L');
    // A volume the user typed is converted with the library when the units change.
    await page.fill('[data-test=stab-volume]', '23');

    await page.click('[data-test=units-us]');
    await expect.poll(() => page.inputValue('[data-test=honey-volume]')).toBe('5');
    expect(await fieldText(page, 'honey-volume')).toContain('US gal');
    expect(await page.inputValue('[data-test=stab-volume]')).toBe(tidyNumber(litresTo(23, 'US gal')));

    // Honey for 5 US gal at 1.100, converted to litres before the library is called and shown in pounds.
    const kg = fermentableForGravity({ volumeL: litresFrom(5, 'US gal'), targetOg: 1.1, source: 'honey' });
    await expect.poll(() => page.textContent('[data-test=honey-result]')).toBe(formatMass(kg, 'us'));
    expect(Number(await page.getAttribute('[data-test=honey-result]', 'data-value'))).toBeCloseTo(kg, 12);

    await page.reload();
    await page.waitForSelector('[data-test=honey-volume]');
    await expect.poll(() => fieldText(page, 'honey-volume')).toContain('US gal');
    expect(await page.inputValue('[data-test=honey-volume]')).toBe('5');
    await close(page);
  });
});
