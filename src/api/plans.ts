import { batchPlanSchema, planListSchema, planSchema, type BatchPlan, type Plan, type PlanWrite } from '@shared/schemas/plans';
import { request, cellarPath } from './http';

export const fetchPlans = (cellarId: string): Promise<Plan[]> => request('GET', cellarPath(cellarId, 'plans'), planListSchema);

export const createPlan = (cellarId: string, body: PlanWrite): Promise<Plan> => request('POST', cellarPath(cellarId, 'plans'), planSchema, body);

export const updatePlan = (cellarId: string, planId: string, body: PlanWrite): Promise<Plan> =>
  request('PUT', cellarPath(cellarId, 'plans', planId), planSchema, body);

export const deletePlan = (cellarId: string, planId: string): Promise<void> => request('DELETE', cellarPath(cellarId, 'plans', planId));

export const fetchBatchPlan = (cellarId: string, batchId: string): Promise<BatchPlan> =>
  request('GET', cellarPath(cellarId, 'batches', batchId, 'plan'), batchPlanSchema);

/** Puts the batch on a plan, or back on the default for its kind (null). */
export const assignPlan = (cellarId: string, batchId: string, planId: string | null): Promise<BatchPlan> =>
  request('PUT', cellarPath(cellarId, 'batches', batchId, 'plan'), batchPlanSchema, { planId });
