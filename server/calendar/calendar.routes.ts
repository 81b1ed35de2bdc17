import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { cellarHandler } from '../http/handle';
import { NotFoundError } from '../http/errors';
import { getCalendarFeed, turnOffCalendarFeed, turnOnCalendarFeed } from './calendar-feed.service';
import { personalCalendar } from './feed-calendar';
import { feedOwner } from './feed-tokens';

/**
 * /api/cellars/:cellarId/calendar-feed — the signed-in member's own feed: status, turn on (or
 * regenerate), turn off. Any member may, so it is mounted with write: 'guest'.
 */
export function calendarFeedRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => getCalendarFeed(actor, tx)),
  );
  router.post(
    '/',
    cellar({}, (_input, actor, tx) => turnOnCalendarFeed(actor, tx)),
  );
  router.post(
    '/off',
    cellar({}, (_input, actor, tx) => turnOffCalendarFeed(actor, tx)),
  );
  return router;
}

/**
 * GET /calendar/<token>.ics — the feed itself, for calendar apps (no session: the token is
 * the key). An unknown, regenerated or revoked token answers 404.
 */
export function calendarFileRoutes(ds: DataSource, options: { publicUrl: string }): Router {
  const router = Router();
  router.get('/calendar/:file', async (req, res) => {
    const token = /^(.+)\.ics$/.exec(req.params.file)?.[1] ?? '';
    const body = await ds.transaction('REPEATABLE READ', async (tx) => {
      const userId = await feedOwner(tx, token);
      if (!userId) throw new NotFoundError('No such calendar.');
      return personalCalendar(tx, userId, options.publicUrl);
    });
    res.set('Cache-Control', 'private, max-age=300').type('text/calendar; charset=utf-8').send(body);
  });
  return router;
}
