import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { invitationCreateSchema } from '../../shared/schemas/accounts';
import { uuidSchema } from '../../shared/schemas/common';
import { cellarHandler } from '../http/handle';
import { inviteMember, listInvitations, resendInvitation, revokeInvitation } from './invitations.service';
import { mailRequestLimit, type MailRateLimits } from './mail-rate-limits';

const invitationParams = z.object({ invitationId: uuidSchema });

/** /api/cellars/:cellarId/invitations — Keepers invite people, resend and withdraw invitations. */
export function invitationRoutes(ds: DataSource, options: { publicUrl: string; limits: MailRateLimits }): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  const limited = mailRequestLimit(ds, 'invite', options.limits, (req) =>
    String(req.body?.email ?? req.params.invitationId ?? '')
      .trim()
      .toLowerCase(),
  );
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => listInvitations(actor, tx)),
  );
  router.post(
    '/',
    limited,
    cellar({ body: invitationCreateSchema }, async ({ body }, actor, tx, _req, res) => {
      const invitation = await inviteMember(actor, tx, body.email, body.role, options.publicUrl);
      res.status(201);
      return invitation;
    }),
  );
  router.post(
    '/:invitationId/resend',
    limited,
    cellar({ params: invitationParams }, ({ params }, actor, tx) => resendInvitation(actor, tx, params.invitationId, options.publicUrl)),
  );
  router.delete(
    '/:invitationId',
    cellar({ params: invitationParams }, ({ params }, actor, tx) => revokeInvitation(actor, tx, params.invitationId)),
  );
  return router;
}
