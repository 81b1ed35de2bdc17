import { beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import request from 'supertest';
import { bestVesselForRacking } from '../../shared/calc';
import { vesselPageSchema } from '../../shared/schemas/vessels';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

/** What a Quasar field shows (its data-test sits on the inner control). */
const fieldText = (page: Page, selector: string) => page.$eval(selector, (el) => el.closest('.q-field')?.textContent ?? '');

describeInBrowser('Batch page: racking into the proposed vessel, in Chromium', (env) => {
  let crew: CellarCrew;
  let batchId: string;
  const batchVolumeL = 23;

  beforeAll(async () => {
    const { ds, baseUrl } = env();
    crew = await makeCellarWithCrew(ds, 'Racking cellar');
    const api = request.agent(baseUrl);
    const signIn = await api.post('/api/auth/sign-in').send({ email: crew.hand.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(200);
    const base = `/api/cellars/${crew.cellar.id}`;
    const addVessel = async (name: string, capacityL: number, state: 'sanitised' | 'dirty', material = 'glass') => {
      const res = await api.post(`${base}/vessels`).send({ name, kind: 'carboy', material, capacityL, state });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body.id as string;
    };
    const bucket = await addVessel('Primary bucket 30', 30, 'sanitised', 'plastic');
    // Free and sanitised, of several sizes; the dirty 22 L one would fit but must never be proposed.
    await addVessel('Demijohn 4.5', 4.5, 'sanitised');
    await addVessel('Carboy 19', 19, 'sanitised');
    await addVessel('Carboy 23', 23, 'sanitised');
    await addVessel('Keg 25', 25, 'sanitised', 'stainless');
    await addVessel('Dirty carboy 22', 22, 'dirty');

    const started = await api.post(`${base}/batches`).send({
      name: 'Heather honey traditional',
      kind: 'traditional-mead',
      yeast: { name: 'Dry wine yeast', toleranceAbv: 16 },
      plannedVolumeL: batchVolumeL,
      startedOn: '2026-01-05',
      og: 1.11,
      vessels: [{ vesselId: bucket, volumeL: batchVolumeL }],
    });
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    batchId = started.body.batch.id;
  });

  it('proposes the smallest free sanitised vessel that holds the volume after loss, racks into it and shows it', async () => {
    const { baseUrl, context, ds } = env();
    // The same candidates the server chooses among, judged by shared/calc.
    const api = request.agent(baseUrl);
    await api.post('/api/auth/sign-in').send({ email: crew.hand.email, password: TEST_PASSWORD });
    const free = vesselPageSchema.parse((await api.get(`/api/cellars/${crew.cellar.id}/vessels?freeAndSanitised=true`)).body).items;
    expect(free.map((v) => v.name)).not.toContain('Dirty carboy 22');
    const best = bestVesselForRacking({ volumeL: batchVolumeL, stage: 'primary', candidates: free });
    expect(best?.name).toBe('Carboy 23');

    const page = await context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches/${batchId}`);
    await expect.poll(() => page.textContent('[data-test=batch-name]')).toBe('Heather honey traditional');

    await page.click('[data-test=op-rack]');
    await page.waitForSelector('[data-test=rack-dialog]');
    const proposal = page.locator('[data-test=rack-proposal]');
    await proposal.waitFor();
    expect(await proposal.getAttribute('data-vessel-id')).toBe(best!.id);
    expect(await page.textContent('[data-test=rack-proposal-name]')).toBe('Carboy 23');
    // Preselected as the target, with the glass caution beside the racking.
    expect(await fieldText(page, '[data-test=rack-to-vessel-0]')).toContain('Carboy 23');
    expect(await page.isVisible('[data-test=caution-glass]')).toBe(true);

    await page.click('[data-test=rack-submit]');
    await page.waitForSelector('[data-test=rack-dialog]', { state: 'detached' });

    const racked = page.locator('[data-test=journal-entry-racked]');
    await racked.waitFor();
    expect(await racked.textContent()).toContain('Into Carboy 23');
    expect(await racked.textContent()).toContain('From Primary bucket 30');
    const vessels = await page.textContent('[data-test=batch-vessels]');
    expect(vessels).toContain('Carboy 23');
    expect(vessels).not.toContain('Primary bucket 30');

    // And the record agrees: the batch now sits in the proposed vessel.
    const [row] = await ds.query('SELECT batch_id FROM vessels WHERE id = $1', [best!.id]);
    expect(row.batch_id).toBe(batchId);
    await page.close();
    await context.clearCookies();
  });
});
