import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { memberRoleSchema } from '../../shared/schemas/cellars';
import { uuidSchema } from '../../shared/schemas/common';
import { cellarHandler } from '../http/handle';
import { changeMember, listMembers } from './members.service';

const memberParams = z.object({ memberId: uuidSchema });

/**
 * /api/cellars/:cellarId/members — everyone sees who is in the cellar; Keepers manage it.
 * People join only by accepting an invitation (accounts/invitations.routes.ts).
 */
export function memberRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => listMembers(actor, tx)),
  );
  router.patch(
    '/:memberId',
    cellar({ params: memberParams, body: memberRoleSchema }, async ({ params, body }, actor, tx) => {
      await changeMember(actor, tx, params.memberId, { role: body.role });
      return listMembers(actor, tx);
    }),
  );
  router.delete(
    '/:memberId',
    cellar({ params: memberParams }, ({ params }, actor, tx) => changeMember(actor, tx, params.memberId, { remove: true })),
  );
  return router;
}
