/**
 * Label rendering benchmark: 240 vessel labels (ten A4 sheets of 24) rendered a few times;
 * prints the median. Target: under 3 s on the development machine. A script, not a test:
 * `npm run bench:labels`.
 */
import { performance } from 'node:perf_hooks';
import { vesselLabel } from '../../server/labels/content';
import { renderLabelsPdf } from '../../server/labels/render';
import { labelTemplates } from '../../server/labels/templates';
import { randomLabelCode } from '../../server/labels/label-codes';

const TEMPLATE = 'a4-3x8-70x37';
const LABELS = 240;
const RUNS = 5;
const TARGET_MS = 3000;

const template = labelTemplates().get(TEMPLATE);
if (!template) throw new Error(`No template ${TEMPLATE}`);

/** Invented vessels with names of varied length (text fitting does real work), new codes each call. */
const makeItems = () =>
  Array.from({ length: LABELS }, (_, i) =>
    vesselLabel({
      id: String(i),
      code: randomLabelCode(),
      name: i % 7 === 0 ? `Tall green demijohn number ${i} from the north cellar wall` : `Carboy ${i + 1}`,
      vesselKind: 'carboy',
      capacityL: 23,
      batchName: i % 5 === 0 ? null : `Batch ${i % 12}: blackcurrant and linden honey melomel`,
      batchKind: 'melomel',
      startedOn: '2026-03-14',
      og: 1.105 + (i % 10) / 1000,
      lastSg: 1.004,
      unitSystem: 'metric',
    }),
  );

const times: number[] = [];
let bytes = 0;
for (let run = 0; run < RUNS; run++) {
  const items = makeItems();
  const start = performance.now();
  const pdf = await renderLabelsPdf(template, items, { publicUrl: 'https://cellar.example.test' });
  times.push(performance.now() - start);
  bytes = pdf.length;
}
console.log(`${LABELS} vessel labels on ${TEMPLATE} (${LABELS / 24} sheets, ${(bytes / 1024).toFixed(0)} KiB), ${RUNS} runs`);
// The first run also loads the fonts and fills the text-width cache.
console.log(`runs: ${times.map((t) => `${t.toFixed(0)} ms`).join(', ')} (first run cold)`);
times.sort((a, b) => a - b);
const median = times[Math.floor(times.length / 2)]!;
console.log(`median: ${median.toFixed(0)} ms (target < ${TARGET_MS} ms) ${median < TARGET_MS ? 'OK' : 'SLOW'}`);
