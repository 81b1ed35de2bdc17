import { beforeAll, expect, it } from 'vitest';
import request from 'supertest';
import { Vessel } from '../../server/entities/vessel.entity';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { chooseFromMenu, describeInBrowser, signInThroughForm } from '../helpers/browser-app';

describeInBrowser('Batches page: pitching a new batch, in Chromium', (env) => {
  let crew: CellarCrew;
  let carboyId: string;

  beforeAll(async () => {
    const { ds, baseUrl } = env();
    crew = await makeCellarWithCrew(ds, 'Pitching cellar');
    const api = request.agent(baseUrl);
    expect((await api.post('/api/auth/sign-in').send({ email: crew.hand.email, password: TEST_PASSWORD })).status).toBe(200);
    const res = await api
      .post(`/api/cellars/${crew.cellar.id}/vessels`)
      .send({ name: 'Carboy 19', kind: 'carboy', material: 'glass', capacityL: 19, state: 'sanitised' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    carboyId = res.body.id;
  });

  it('starts a batch into a free sanitised vessel from the form and opens its page', async () => {
    const { baseUrl, context, ds } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches`);
    await page.click('[data-test=start-batch]');
    await page.waitForSelector('[data-test=start-batch-dialog]');

    await page.fill('[data-test=start-name]', 'Sloe and honey melomel');
    await chooseFromMenu(page, '[data-test=start-kind]', 'Melomel (fruit mead)');
    await page.fill('[data-test=start-yeast]', 'Red wine yeast');
    await page.fill('[data-test=start-tolerance]', '14');
    await page.fill('[data-test=start-volume]', '18');
    await page.fill('[data-test=start-og]', '1.105');
    await chooseFromMenu(page, '[data-test=start-vessels-vessel-0]', 'Carboy 19');
    await page.fill('[data-test=start-vessels-volume-0]', '18');
    await page.click('[data-test=start-batch-submit]');

    await page.waitForURL(new RegExp(`/c/${crew.cellar.id}/batches/[0-9a-f-]{36}$`));
    await expect.poll(() => page.textContent('[data-test=batch-name]')).toBe('Sloe and honey melomel');
    const vessel = await ds.getRepository(Vessel).findOneByOrFail({ id: carboyId });
    expect(vessel.batchId).toBe(page.url().split('/').at(-1));
    expect(vessel.volumeL).toBe(18);
    await page.close();
  });
});
