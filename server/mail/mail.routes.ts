import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { cellarHandler } from '../http/handle';
import { getMailStatus, listOutgoingMail, retryMail, type MailboxAccess } from './mail.service';

const mailParams = z.object({ mailId: uuidSchema });

/** /api/cellars/:cellarId/mail — Keepers: mail status, the local mailbox, retrying failed mail. */
export function mailRoutes(ds: DataSource, access: MailboxAccess): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => getMailStatus(actor, tx, access)),
  );
  router.get(
    '/outgoing',
    cellar({}, (_input, actor, tx) => listOutgoingMail(actor, tx, access)),
  );
  router.post(
    '/:mailId/retry',
    cellar({ params: mailParams }, ({ params }, actor, tx) => retryMail(actor, tx, params.mailId)),
  );
  return router;
}
