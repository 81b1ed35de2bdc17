import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { memberAddSchema, memberRoleSchema } from '../../shared/schemas/cellars';
import { uuidSchema } from '../../shared/schemas/common';
import { handle } from '../middleware/handle';
import { addMember, changeMember, listMembers } from '../services/cellar.service';
import { cellarContext } from './cellar-context';

const memberParams = z.object({ memberId: uuidSchema });

/** /api/cellars/:cellarId/members — everyone sees who is in the cellar; Keepers manage it. */
export function memberRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.get('/', handle({}, (_input, req) => listMembers(ds, cellarContext(req))));
  router.post(
    '/',
    handle({ body: memberAddSchema }, async ({ body }, req, res) => {
      const member = await addMember(ds, cellarContext(req), body.email, body.role);
      res.status(201);
      return member;
    }),
  );
  router.patch(
    '/:memberId',
    handle({ params: memberParams, body: memberRoleSchema }, async ({ params, body }, req) => {
      await changeMember(ds, cellarContext(req), params.memberId, { role: body.role });
      return listMembers(ds, cellarContext(req));
    }),
  );
  router.delete(
    '/:memberId',
    handle({ params: memberParams }, async ({ params }, req, res) => {
      await changeMember(ds, cellarContext(req), params.memberId, { remove: true });
      res.status(204).end();
    }),
  );
  return router;
}
