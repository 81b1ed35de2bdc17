import ICAL from 'ical.js';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { calendarFeedSchema, taskListSchema } from '../../shared/schemas/tasks';
import { batchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { daysAgo } from '../helpers/dates';
import { testApp } from '../helpers/test-app';

/** The personal calendar feed (RFC 5545), parsed with ical.js, a general-purpose iCalendar parser. */

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  await ds.query(`UPDATE cellars SET time_zone = 'Pacific/Auckland' WHERE id = $1`, [crew.cellar.id]);
});

const feedUrl = () => `/api/cellars/${crew.cellar.id}/calendar-feed`;

describe('calendar feed', () => {
  it('gives a member a secret URL once; the feed holds the open tasks with stable UIDs on their local dates', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(40) });
    expect(calendarFeedSchema.parse((await crew.as.guest.get(feedUrl()).expect(200)).body)).toEqual({ on: false, url: null, createdAt: null });

    const on = calendarFeedSchema.parse((await crew.as.guest.post(feedUrl()).expect(200)).body);
    expect(on.url).toMatch(/^\/calendar\/[A-Za-z0-9_-]{43}\.ics$/);
    // Shown once: reading the status again never shows it.
    expect((await crew.as.guest.get(feedUrl()).expect(200)).body).toMatchObject({ on: true, url: null });

    const res = await request(app).get(on.url!).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    const calendar = new ICAL.Component(ICAL.parse(res.text));
    expect(calendar.getFirstPropertyValue('x-wr-timezone')).toBe('Pacific/Auckland');
    const events = calendar.getAllSubcomponents('vevent').map((e) => new ICAL.Event(e));

    const tasks = taskListSchema.parse(
      (await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/tasks`).query({ batchId: result.batch.id, withinDays: 90 }).expect(200)).body,
    ).tasks;
    const racking = tasks.find((t) => t.key === `${result.batch.id}/rack-off-primary/start`)!;
    const event = events.find((e) => e.uid === `${result.batch.id}.rack-off-primary.start@cellarwright`)!;
    expect(event).toBeDefined();
    // An all-day event on the task's local due date (30 days after the start, common practice).
    expect(event.startDate.isDate).toBe(true);
    expect(event.startDate.toString()).toBe(racking.dueOn);
    expect(event.summary).toBe(`Rack off the lees: ${result.batch.name}`);
    expect(event.description).toContain(`/c/${crew.cellar.id}/batches/${result.batch.id}`);

    // The same task keeps its UID in a later copy of the feed.
    const again = new ICAL.Component(ICAL.parse((await request(app).get(on.url!).expect(200)).text));
    expect(again.getAllSubcomponents('vevent').map((e) => e.getFirstPropertyValue('uid'))).toContain(event.uid);
  });

  it('answers 404 once the URL is regenerated or the feed turned off', async () => {
    const first = calendarFeedSchema.parse((await crew.as.hand.post(feedUrl()).expect(200)).body);
    const second = calendarFeedSchema.parse((await crew.as.hand.post(feedUrl()).expect(200)).body);
    await request(app).get(first.url!).expect(404);
    await request(app).get(second.url!).expect(200);
    await crew.as.hand.post(`${feedUrl()}/off`).expect(200);
    await request(app).get(second.url!).expect(404);
    await request(app).get('/calendar/not-a-token.ics').expect(404);
  });
});
