import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { planAssignSchema, planWriteSchema } from '../../shared/schemas/plans';
import { cellarHandler } from '../http/handle';
import { assignPlan, createPlan, deletePlan, getBatchPlan, listPlans, updatePlan } from './plans.service';

const planParams = z.object({ planId: uuidSchema });
const batchParams = z.object({ batchId: uuidSchema });

/** /api/cellars/:cellarId/plans — list, create, edit, delete (writes: Keeper, at the gate). */
export function planRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => listPlans(actor, tx)),
  );
  router.post(
    '/',
    cellar({ body: planWriteSchema }, async ({ body }, actor, tx, _req, res) => {
      const plan = await createPlan(actor, tx, body);
      res.status(201);
      return plan;
    }),
  );
  router.put(
    '/:planId',
    cellar({ params: planParams, body: planWriteSchema }, ({ params, body }, actor, tx) => updatePlan(actor, tx, params.planId, body)),
  );
  router.delete(
    '/:planId',
    cellar({ params: planParams }, ({ params }, actor, tx) => deletePlan(actor, tx, params.planId)),
  );
  return router;
}

/** /api/cellars/:cellarId/batches/:batchId/plan — which plan a batch follows (changing it: Keeper, at the gate). */
export function batchPlanRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({ params: batchParams }, ({ params }, actor, tx) => getBatchPlan(actor, tx, params.batchId)),
  );
  router.put(
    '/',
    cellar({ params: batchParams, body: planAssignSchema }, ({ params, body }, actor, tx) => assignPlan(actor, tx, params.batchId, body.planId)),
  );
  return router;
}
