import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { taskListSchema, type Task } from '@shared/schemas/tasks';
import NextTaskCard from '@/components/tasks/NextTaskCard.vue';
import { fakeApi, type FakeAnswer } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, plannedTask, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

const TODAY = '2026-03-14';

const task = (ruleId: string, title: string, dueOn: string): Task => plannedTask(ruleId, title, dueOn, TODAY);
const listOf = (...tasks: Task[]): FakeAnswer => ({ body: taskListSchema.parse({ today: TODAY, tasks, more: 0 }) });
const shownTitle = () => document.querySelector('[data-test=next-task] .q-item__label')?.textContent?.trim() ?? null;

const TASKS_PATH = `/api/cellars/${CELLAR_ID}/tasks`;

afterEach(() => {
  document.body.innerHTML = '';
});

/** The card mounted as the Vessel page shows it, once it shows the batch's overdue reading. */
async function cardShowingAReading() {
  const api = fakeApi();
  signIn(api);
  api.on('GET', TASKS_PATH, listOf(task('weekly-reading', 'Take a reading', '2026-03-13')));
  const { wrapper } = await mountInApp(NextTaskCard, `/c/${CELLAR_ID}/vessels`, { props: { batchId: BATCH_ID, cellarId: CELLAR_ID, renew: 0 } });
  await vi.waitFor(() => expect(shownTitle()).toBe('Take a reading'));
  return { api, wrapper };
}

describe('Next task card (Vessel page)', () => {
  it('keeps the task shown while it asks again after a reading, then shows the next one', async () => {
    const { api, wrapper } = await cardShowingAReading();

    // The server answers only when told: until then the card must not empty itself.
    let answer!: (a: FakeAnswer) => void;
    api.on('GET', TASKS_PATH, () => new Promise<FakeAnswer>((resolve) => (answer = resolve)));
    await wrapper.setProps({ renew: 1 });
    await flushPromises();
    expect(api.callsTo('GET', TASKS_PATH)).toHaveLength(2);
    expect(shownTitle()).toBe('Take a reading');

    answer(listOf(task('rack-off-primary', 'Rack off the lees', '2026-03-31')));
    await vi.waitFor(() => expect(shownTitle()).toBe('Rack off the lees'));
  });

  it('keeps the task shown when asking again finds no signal', async () => {
    const { api, wrapper } = await cardShowingAReading();

    api.on('GET', TASKS_PATH, () => Promise.reject(new TypeError('Failed to fetch')));
    await wrapper.setProps({ renew: 1 });
    await vi.waitFor(() => expect(api.callsTo('GET', TASKS_PATH)).toHaveLength(2));
    await flushPromises();
    expect(shownTitle()).toBe('Take a reading');
  });
});
