import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { beforeAll, expect, it } from 'vitest';
import { makeBatchInVessels } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { addReadings } from '../helpers/journal';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

describeInBrowser('CSV export and import of readings, in Chromium', (env) => {
  let crew: CellarCrew;
  let sourceId: string;
  let targetId: string;

  beforeAll(async () => {
    const { ds } = env();
    crew = await makeCellarWithCrew(ds, 'Exchange cellar');
    const source = await makeBatchInVessels(ds, crew, { name: 'Exported melomel', volumesL: [10], startedDaysAgo: 40 });
    await addReadings(ds, crew, source.batch.id, [
      { daysAgo: 30, sg: 1.085 },
      { daysAgo: 20, sg: 1.04 },
      { daysAgo: 10, sg: 1.012 },
    ]);
    const target = await makeBatchInVessels(ds, crew, { name: 'Imported melomel', volumesL: [10], startedDaysAgo: 45 });
    sourceId = source.batch.id;
    targetId = target.batch.id;
  });

  it("exports a batch's readings, imports them into another batch through the mapping screen, and charts them", async () => {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInThroughForm(page, baseUrl, crew.keeper.email, TEST_PASSWORD);

    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches/${sourceId}`);
    await page.waitForSelector('[data-test=batch-records]');
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('[data-test=export-batch-readings]')]);
    // Saved under the name the server gave it (the file picker accepts .csv files).
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'cw-e2e-')), download.suggestedFilename());
    await download.saveAs(file);
    expect(path.basename(file)).toMatch(/^cellarwright-readings-\d{4}-\d{2}-\d{2}\.csv$/);
    const csv = fs.readFileSync(file, 'utf8');
    expect(csv.split('\n')[0]).toContain('gravity (SG)');
    expect(csv).toContain('1.085');

    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches/${targetId}`);
    await page.waitForSelector('[data-test=gravity-chart-empty]');
    await page.click('[data-test=import-readings]');
    await page.setInputFiles('[data-test=import-dialog] input[type=file]', file);
    await page.waitForSelector('[data-test=import-preview]');
    // The exported headers are matched by name; the first rows are shown before anything is written.
    expect(await page.locator('[data-test=import-preview] tbody tr').count()).toBe(3);
    expect(await page.inputValue('[data-test=map-sg]')).toBe('gravity (SG)');
    expect(await page.inputValue('[data-test=map-at]')).toBe('taken at');
    await page.click('[data-test=import-run]');
    await expect.poll(() => page.textContent('[data-test=import-result]'), { timeout: 10_000 }).toContain('3 added');
    await page.click('[data-test=import-dialog] button:has-text("Done")');

    await page.waitForSelector('[data-test=gravity-chart] canvas');
    expect(await page.locator('[data-test=gravity-chart-empty]').count()).toBe(0);
    await page.close();
  });
});
