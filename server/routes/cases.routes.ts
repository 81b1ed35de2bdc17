import { Router } from 'express';
import type { DataSource } from 'typeorm';

/** Filled in by its issue's work; mounted in server/app.ts. */
export function caseRoutes(_ds: DataSource): Router {
  return Router({ mergeParams: true });
}
