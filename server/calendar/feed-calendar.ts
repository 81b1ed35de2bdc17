import ical from 'ical-generator';
import type { EntityManager } from 'typeorm';
import { addDays } from '../../shared/domain/plans/local-dates';
import type { Role } from '../../shared/roles';
import { systemActor } from '../core/actor';
import { localDate } from '../core/local-date';
import { tasksDue } from '../tasks/tasks.service';

/** The feed holds tasks due up to this many days ahead. */
const FEED_DAYS_AHEAD = 90;

/** A date (YYYY-MM-DD) as the all-day start ical-generator writes as that same date. */
const allDay = (date: string) => new Date(`${date}T00:00:00Z`);

/**
 * A person's calendar (RFC 5545): one all-day event per open task of every cellar they belong
 * to, on its local due date in that cellar's time zone, with a UID that stays the same for
 * the same task. It reads each cellar as a Guest would, through the tasks service.
 */
export async function personalCalendar(tx: EntityManager, userId: string, publicUrl: string): Promise<string> {
  const cellars: { id: string; name: string; time_zone: string; role: Role }[] = await tx.query(
    `SELECT c.id, c.name, c.time_zone, m.role FROM memberships m JOIN cellars c ON c.id = m.cellar_id WHERE m.user_id = $1 ORDER BY c.name`,
    [userId],
  );
  const calendar = ical({ name: 'Cellarwright tasks', timezone: cellars[0]?.time_zone ?? 'UTC' });
  for (const cellar of cellars) {
    const reader = systemActor(cellar.id, 'schedule', 'guest');
    const until = addDays(localDate(new Date(), cellar.time_zone), FEED_DAYS_AHEAD);
    for (const task of await tasksDue(reader, tx, { until })) {
      const link = `${publicUrl}/c/${cellar.id}/batches/${task.batch.id}`;
      const vessels = task.vesselNames.length ? ` in ${task.vesselNames.join(', ')}` : '';
      calendar.createEvent({
        id: `${task.key.replaceAll('/', '.')}@cellarwright`,
        start: allDay(task.snoozedUntil ?? task.dueOn),
        allDay: true,
        summary: `${task.title}: ${task.batch.name}`,
        description: `${task.batch.name}${vessels} (${cellar.name}). Due ${task.dueOn}: ${task.reason}.\n${link}`,
        url: link,
      });
    }
  }
  return calendar.toString();
}
