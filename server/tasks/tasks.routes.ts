import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { dismissRequestSchema, oneOffTaskRequestSchema, snoozeRequestSchema, taskKeySchema, taskListQuerySchema } from '../../shared/schemas/tasks';
import { inTransaction } from '../core/unit-of-work';
import { actorFrom, cellarHandler, handle } from '../http/handle';
import { refreshTaskSnapshots } from './task-snapshots';
import { addOneOffTask, dismissTask, listTasks, markTaskDone, reopenTask, snoozeTask } from './tasks.service';

const keyBody = z.object({ key: taskKeySchema });

/**
 * /api/cellars/:cellarId/tasks — the cellar's tasks; done, snooze, dismiss and undo (reopen)
 * name the task by its key in the body (keys hold slashes); one-off tasks are added here too.
 */
export function taskRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  // The snapshots are brought up to date in a short write transaction of their own, then the
  // list is read in one snapshot as every GET is (it is right even if that refresh was skipped).
  router.get(
    '/',
    handle({ query: taskListQuerySchema }, async ({ query }, req) => {
      const actor = actorFrom(req);
      await inTransaction(ds, 'write', (tx) => refreshTaskSnapshots(actor, tx));
      return inTransaction(ds, 'read', (tx) => listTasks(actor, tx, query));
    }),
  );
  router.post(
    '/done',
    cellar({ body: keyBody }, ({ body }, actor, tx) => markTaskDone(actor, tx, body.key)),
  );
  router.post(
    '/snooze',
    cellar({ body: keyBody.extend(snoozeRequestSchema.shape) }, ({ body }, actor, tx) => snoozeTask(actor, tx, body.key, body.until)),
  );
  router.post(
    '/dismiss',
    cellar({ body: keyBody.extend(dismissRequestSchema.shape) }, ({ body }, actor, tx) => dismissTask(actor, tx, body.key, body.reason)),
  );
  router.post(
    '/reopen',
    cellar({ body: keyBody }, ({ body }, actor, tx) => reopenTask(actor, tx, body.key)),
  );
  router.post(
    '/one-off',
    cellar({ body: oneOffTaskRequestSchema }, async ({ body }, actor, tx, _req, res) => {
      const task = await addOneOffTask(actor, tx, body);
      res.status(201);
      return task;
    }),
  );
  return router;
}
